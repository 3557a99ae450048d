import "server-only";
// The one zod helper for route handlers and server actions: parse or throw a 400 with every
// field error (not only the first).
import type { z } from "zod";
import { AppError } from "@/lib/http/errors";
import { controlCharacterPaths } from "@/lib/validations/text";

export function parseInput<S extends z.ZodType>(schema: S, data: unknown): z.infer<S> {
  // Control characters (NUL above all: PostgreSQL refuses it) are refused in every field of every
  // input, whatever its schema says, with the field's path, beside the schema's own errors.
  const controls = controlCharacterPaths(data);
  const result = schema.safeParse(data);
  if (result.success && !controls.length) return result.data;
  const fields: Record<string, string[]> = result.success ? {} : { ...AppError.fromZod(result.error).fields };
  for (const path of controls) fields[path] = ["control_character", ...(fields[path] ?? []).filter((c) => c !== "control_character")];
  throw new AppError("validation_failed", undefined, { fields });
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
  const text = await readCapped(request, maxBytes);
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch {
    throw new AppError("bad_request", "The request body is not valid JSON.");
  }
  return parseInput(schema, data);
}

/** The body as text, refused as soon as it passes maxBytes (never read whole into memory first). */
async function readCapped(request: Request, maxBytes: number): Promise<string> {
  const declared = Number(request.headers.get("content-length"));
  if (Number.isFinite(declared) && declared > maxBytes) throw new AppError("payload_too_large");
  if (!request.body) return "";
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let size = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    size += value.byteLength;
    if (size > maxBytes) {
      await reader.cancel().catch(() => {});
      throw new AppError("payload_too_large");
    }
    chunks.push(value);
  }
  return new TextDecoder().decode(Buffer.concat(chunks));
}

export function searchParamsObject(url: string | URL): Record<string, string> {
  const params = new URL(url).searchParams;
  const out: Record<string, string> = {};
  for (const [k, v] of params) out[k] = v;
  return out;
}
