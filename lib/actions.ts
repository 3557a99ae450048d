import "server-only";
// Server actions are public POST endpoints: each goes through this wrapper, which authenticates,
// checks the origin, validates with the shared schema and returns a typed result with field errors.
import { headers } from "next/headers";
import type { z } from "zod";
import { getViewer, type Role, type Viewer } from "./auth/session";
import { AppError, toAppError, type ErrorCode, type FieldErrors } from "./errors";
import { allowedOrigins } from "./http";

export type ActionResult<T> =
  | { ok: true; data: T }
  | { ok: false; error: { code: ErrorCode; message: string; fields?: FieldErrors } };

export function action<S extends z.ZodType, T>(
  options: { schema: S; roles: Role[] },
  run: (input: z.infer<S>, viewer: Viewer) => Promise<T>,
) {
  return async (raw: unknown): Promise<ActionResult<T>> => {
    try {
      const h = await headers();
      // Next lets a request without Origin through; refuse it here (see security notes).
      const origin = h.get("origin");
      if (!origin || !allowedOrigins().includes(origin)) throw new AppError("forbidden", "Cross-site request refused.");
      const viewer = await getViewer();
      if (!viewer) throw new AppError("unauthenticated");
      if (!options.roles.includes(viewer.role)) throw new AppError("forbidden");
      const parsed = options.schema.safeParse(raw);
      if (!parsed.success) throw AppError.fromZod(parsed.error);
      return { ok: true, data: await run(parsed.data, viewer) };
    } catch (error) {
      const e = toAppError(error);
      if (e.status >= 500) console.error("[action]", error);
      return { ok: false, error: { code: e.code, message: e.message, ...(e.fields ? { fields: e.fields } : {}) } };
    }
  };
}
