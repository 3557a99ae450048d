import "server-only";
// Route handler wrapper: one error shape, no-store by default, and a same-origin check on every
// state-changing request (route handlers get no CSRF check of their own; ASVS 3.5.1).
import { AppError, toAppError } from "@/lib/http/errors";
import { env } from "@/lib/config/env";

type Handler<C> = (request: Request, context: C) => Promise<Response>;

const unsafeMethods = new Set(["POST", "PUT", "PATCH", "DELETE"]);

export function allowedOrigins(): string[] {
  const extra = (process.env.EXTRA_ORIGINS ?? "").split(",").map((s) => s.trim()).filter(Boolean);
  return [new URL(env.APP_URL).origin, ...extra];
}

export function assertSameOrigin(request: Request) {
  if (!unsafeMethods.has(request.method)) return;
  const origin = request.headers.get("origin");
  if (origin) {
    if (!allowedOrigins().includes(origin)) throw new AppError("forbidden", "Cross-site request refused.");
    return;
  }
  // No Origin: accept only what a browser marks as same-origin (or a non-browser client).
  const site = request.headers.get("sec-fetch-site");
  if (site && site !== "same-origin" && site !== "none") throw new AppError("forbidden", "Cross-site request refused.");
}

export function handle<C = unknown>(handler: Handler<C>): Handler<C> {
  return async (request, context) => {
    try {
      assertSameOrigin(request);
      const response = await handler(request, context);
      if (!response.headers.has("Cache-Control")) response.headers.set("Cache-Control", "no-store");
      return response;
    } catch (error) {
      const appError = toAppError(error);
      if (appError.status >= 500) console.error(`[api] ${request.method} ${new URL(request.url).pathname}:`, error);
      return appError.toResponse();
    }
  };
}

export function json(data: unknown, init: ResponseInit = {}) {
  return Response.json(data, init);
}
