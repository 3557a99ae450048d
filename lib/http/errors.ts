import "server-only";
// One error shape for every API answer:
//   { "error": { "code": "validation_failed", "message": "…", "fields": { "name": ["…"] } } }
// Codes double as message keys (Errors.<code>) for translated text on screens.
import type { ZodError } from "zod";

export const errorStatus = {
  validation_failed: 400,
  bad_request: 400,
  unauthenticated: 401,
  forbidden: 403,
  two_factor_required: 403,
  not_found: 404,
  conflict: 409,
  record_closed: 409,
  last_admin: 409,
  payload_too_large: 413,
  unsupported_media_type: 415,
  rate_limited: 429,
  internal: 500,
  unavailable: 503,
} as const;

export type ErrorCode = keyof typeof errorStatus;
export type FieldErrors = Record<string, string[]>;

const defaultMessages: Record<ErrorCode, string> = {
  validation_failed: "Some fields need attention.",
  bad_request: "The request could not be understood.",
  unauthenticated: "Please sign in.",
  forbidden: "You do not have access to this.",
  two_factor_required: "Your organisation requires two-step sign-in. Set it up first.",
  not_found: "Not found.",
  conflict: "This conflicts with a record that already exists.",
  record_closed: "This record is closed and can no longer be changed.",
  last_admin: "This would leave no administrator. Make someone else an administrator first.",
  payload_too_large: "The file or request is too large.",
  unsupported_media_type: "This type of file is not accepted.",
  rate_limited: "Too many attempts. Please wait a moment and try again.",
  internal: "Something went wrong on our side. Nothing was saved.",
  unavailable: "The service is busy. Please try again shortly.",
};

export class AppError extends Error {
  readonly code: ErrorCode;
  readonly status: number;
  readonly fields?: FieldErrors;
  readonly headers?: Record<string, string>;

  constructor(
    code: ErrorCode,
    message?: string,
    options: { fields?: FieldErrors; headers?: Record<string, string>; cause?: unknown } = {},
  ) {
    super(message ?? defaultMessages[code], { cause: options.cause });
    this.name = "AppError";
    this.code = code;
    this.status = errorStatus[code];
    this.fields = options.fields;
    this.headers = options.headers;
  }

  toJSON() {
    return { error: { code: this.code, message: this.message, ...(this.fields ? { fields: this.fields } : {}) } };
  }

  toResponse(): Response {
    return Response.json(this.toJSON(), {
      status: this.status,
      headers: { "Cache-Control": "no-store", ...this.headers },
    });
  }

  static fromZod(error: ZodError, message?: string): AppError {
    const fields: FieldErrors = {};
    for (const issue of error.issues) {
      const key = issue.path.length ? issue.path.map(String).join(".") : "_form";
      (fields[key] ??= []).push(issue.message);
    }
    return new AppError("validation_failed", message, { fields });
  }
}

/** PostgreSQL unique violation → conflict; anything else unknown → generic internal error. */
export function toAppError(error: unknown): AppError {
  if (error instanceof AppError) return error;
  const pgCode = findPgCode(error);
  if (pgCode === "23505") return new AppError("conflict", undefined, { cause: error });
  if (pgCode === "23514" || pgCode === "22P02" || pgCode === "22007" || pgCode === "22008" || pgCode === "22003") {
    return new AppError("validation_failed", undefined, { cause: error });
  }
  if (isConnectionError(error)) {
    return new AppError("unavailable", undefined, { cause: error, headers: { "Retry-After": "2" } });
  }
  return new AppError("internal", undefined, { cause: error });
}

function findPgCode(error: unknown): string | undefined {
  let e: unknown = error;
  for (let i = 0; i < 4 && e && typeof e === "object"; i++) {
    const code = (e as { code?: unknown }).code;
    if (typeof code === "string" && /^[0-9A-Z]{5}$/.test(code)) return code;
    e = (e as { cause?: unknown }).cause;
  }
  return undefined;
}

export function pgConstraint(error: unknown): string | undefined {
  let e: unknown = error;
  for (let i = 0; i < 4 && e && typeof e === "object"; i++) {
    const c = (e as { constraint?: unknown }).constraint;
    if (typeof c === "string") return c;
    e = (e as { cause?: unknown }).cause;
  }
  return undefined;
}

// The database is away (restart, fail-over, network): the request can be tried again, so it is
// answered 503 "unavailable", never a 500. Class 08 is connection exceptions; 57P01–57P03 are
// admin shutdown, crash shutdown and "cannot connect now"; 53300 is too many connections.
const unavailablePgCodes = /^(08...|57P0[123]|53300)$/;
const unavailableErrnos = new Set(["ECONNREFUSED", "ECONNRESET", "EPIPE", "ETIMEDOUT", "EHOSTUNREACH", "ENETUNREACH"]);
const unavailableMessages =
  /Connection terminated|connection timeout|timeout exceeded when trying to connect|terminating connection|not queryable|Connection ended|database system is (shutting down|starting up|not yet accepting)|Client was closed/i;

function isConnectionError(error: unknown, depth = 0): boolean {
  let e: unknown = error;
  for (let i = 0; i < 6 && e && typeof e === "object"; i++) {
    const code = (e as { code?: unknown }).code;
    if (typeof code === "string" && (unavailableErrnos.has(code) || unavailablePgCodes.test(code))) return true;
    const msg = (e as { message?: unknown }).message;
    if (typeof msg === "string" && unavailableMessages.test(msg)) return true;
    // net.connect to a host with several addresses fails with an AggregateError.
    const inner = (e as { errors?: unknown }).errors;
    if (depth < 2 && Array.isArray(inner) && inner.some((x) => isConnectionError(x, depth + 1))) return true;
    e = (e as { cause?: unknown }).cause;
  }
  return false;
}
