// The one zod helper for route handlers and server actions: parse or throw a 400 with every
// field error (not only the first).
import type { z } from "zod";
import { AppError } from "./errors";

export function parseInput<S extends z.ZodType>(schema: S, data: unknown): z.infer<S> {
  const result = schema.safeParse(data);
  if (!result.success) throw AppError.fromZod(result.error);
  return result.data;
}

/** Reads a JSON body (at most maxBytes) and parses it with the schema. */
export async function parseJsonBody<S extends z.ZodType>(
  request: Request,
  schema: S,
  maxBytes = 64 * 1024,
): Promise<z.infer<S>> {
  const type = request.headers.get("content-type") ?? "";
  if (!type.toLowerCase().startsWith("application/json")) {
    throw new AppError("unsupported_media_type", "Send the request body as application/json.");
  }
  const text = await request.text();
  if (Buffer.byteLength(text) > maxBytes) throw new AppError("payload_too_large");
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch {
    throw new AppError("bad_request", "The request body is not valid JSON.");
  }
  return parseInput(schema, data);
}

export function searchParamsObject(url: string | URL): Record<string, string> {
  const params = new URL(url).searchParams;
  const out: Record<string, string> = {};
  for (const [k, v] of params) out[k] = v;
  return out;
}
