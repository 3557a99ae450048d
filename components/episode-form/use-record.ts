"use client";
// Posting a recording form: JSON to the route handler, server field errors back onto the form,
// then on to the patient record (or to the next form).
import { useMutation } from "@tanstack/react-query";

export type ApiError = { status: number; code: string; message: string; fields: Record<string, string[]> };

export async function postJson<T>(url: string, body: unknown): Promise<T> {
  const res = await fetch(url, {
    method: "POST",
    headers: { "content-type": "application/json" },
    body: JSON.stringify(body),
    credentials: "same-origin",
  });
  const data = await res.json().catch(() => null);
  if (!res.ok) {
    const e = (data?.error ?? {}) as Partial<ApiError>;
    throw { status: res.status, code: e.code ?? "internal", message: e.message ?? "", fields: e.fields ?? {} } satisfies ApiError;
  }
  return data as T;
}

export function isApiError(e: unknown): e is ApiError {
  return typeof e === "object" && e !== null && "status" in e && "fields" in e;
}

export function useRecord<T>(url: string) {
  return useMutation<T, unknown, unknown>({ mutationFn: (body) => postJson<T>(url, body) });
}
