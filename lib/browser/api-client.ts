"use client";
// The browser side of the one API error shape: { error: { code, message, fields } }.
export type ApiFailure = { code: string; message: string; fields?: Record<string, string[]> };

export class ApiError extends Error {
  readonly code: string;
  readonly status: number;
  readonly fields: Record<string, string[]>;
  constructor(status: number, failure: ApiFailure) {
    super(failure.message);
    this.status = status;
    this.code = failure.code;
    this.fields = failure.fields ?? {};
  }
}

/** JSON in, JSON out, same origin; throws ApiError with the server's code and field errors. */
export async function apiFetch<T>(path: string, { method = "GET", body }: { method?: string; body?: unknown } = {}): Promise<T> {
  const res = await fetch(path, {
    method,
    headers: body !== undefined ? { "content-type": "application/json" } : undefined,
    body: body !== undefined ? JSON.stringify(body) : undefined,
    credentials: "same-origin",
  });
  const data = await res.json().catch(() => null);
  if (!res.ok) {
    throw new ApiError(res.status, data?.error ?? { code: res.status >= 500 ? "internal" : "bad_request", message: res.statusText });
  }
  return data as T;
}
