"use client";
// The one way the browser calls Caddis's route handlers: JSON in, JSON out, same origin, and the
// one error shape { error: { code, message, fields } } thrown back as an ApiError.
import type { FieldValues, Path, UseFormSetError } from "react-hook-form";

export type ApiFailure = { code: string; message: string; fields?: Record<string, string[]> };

export class ApiError extends Error {
  readonly code: string;
  /** 0 when the request never got an answer (offline, connection refused). */
  readonly status: number;
  readonly fields: Record<string, string[]>;
  constructor(status: number, failure: ApiFailure) {
    super(failure.message);
    this.status = status;
    this.code = failure.code;
    this.fields = failure.fields ?? {};
  }
}

export function isApiError(error: unknown): error is ApiError {
  return error instanceof ApiError;
}

export type ApiRequest = { method?: "GET" | "POST" | "PATCH" | "PUT" | "DELETE"; body?: unknown; signal?: AbortSignal };

/** Throws ApiError with the server's code and field errors, or code "network" (status 0) when offline. */
export async function apiFetch<T = unknown>(path: string, { method = "GET", body, signal }: ApiRequest = {}): Promise<T> {
  let res: Response;
  try {
    res = await fetch(path, {
      method,
      headers: body !== undefined ? { "content-type": "application/json", accept: "application/json" } : { accept: "application/json" },
      body: body !== undefined ? JSON.stringify(body) : undefined,
      credentials: "same-origin",
      signal,
    });
  } catch (cause) {
    if (signal?.aborted) throw cause;
    throw new ApiError(0, { code: "network", message: cause instanceof Error ? cause.message : "network" });
  }
  const data = await res.json().catch(() => null);
  if (!res.ok) {
    throw new ApiError(res.status, data?.error ?? { code: res.status >= 500 ? "internal" : "bad_request", message: res.statusText });
  }
  return data as T;
}

/**
 * The one way server field errors reach a react-hook-form form: each field's first code becomes
 * that field's error message (the form words it like its own zod codes), and the first one placed
 * takes the focus. `only` keeps the fields the form shows. Returns the fields placed.
 */
export function setServerFieldErrors<T extends FieldValues>(error: unknown, setError: UseFormSetError<T>, only?: readonly string[]): string[] {
  if (!isApiError(error)) return [];
  const placed: string[] = [];
  for (const [field, codes] of Object.entries(error.fields)) {
    if (!codes.length || (only && !only.includes(field))) continue;
    setError(field as Path<T>, { type: "server", message: codes[0] }, { shouldFocus: placed.length === 0 });
    placed.push(field);
  }
  return placed;
}
