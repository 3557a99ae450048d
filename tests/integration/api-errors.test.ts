import { describe, expect, it } from "vitest";
import { z } from "zod";
import { AppError, toAppError } from "@/lib/http/errors";
import { handle, json } from "@/lib/http/handle";
import { parseJsonBody } from "@/lib/http/validate";
import { request } from "../support/http";

const schema = z.object({ name: z.string().min(1), volumeMl: z.number().int().positive() });
const echo = handle(async (req) => json(await parseJsonBody(req, schema), { status: 201 }));

describe("one shape for API errors", () => {
  it("returns 400 with every field error", async () => {
    const res = await echo(request("/x", { body: { name: "", volumeMl: -1 } }), {});
    expect(res.status).toBe(400);
    const body = await res.json();
    expect(body.error.code).toBe("validation_failed");
    expect(Object.keys(body.error.fields).sort()).toEqual(["name", "volumeMl"]);
  });

  it("returns 400 for a body that is not JSON, and 415 for another content type", async () => {
    const bad = await echo(request("/x", { rawBody: "{nope", headers: { "content-type": "application/json" } }), {});
    expect(bad.status).toBe(400);
    const wrongType = await echo(request("/x", { rawBody: "a=b", headers: { "content-type": "text/plain" } }), {});
    expect(wrongType.status).toBe(415);
  });

  it("refuses a state-changing request from another site (ASVS 3.5.1)", async () => {
    const res = await echo(request("/x", { body: { name: "a", volumeMl: 1 }, headers: { origin: "https://evil.example" } }), {});
    expect(res.status).toBe(403);
    const site = await echo(
      new Request("http://localhost:3000/x", {
        method: "POST",
        headers: { "content-type": "application/json", "sec-fetch-site": "cross-site" },
        body: JSON.stringify({ name: "a", volumeMl: 1 }),
      }),
      {},
    );
    expect(site.status).toBe(403);
  });

  it("answers an unexpected error with a generic 500 that leaks nothing", async () => {
    const boom = handle(async () => {
      throw new Error("secret internals: select * from user");
    });
    const res = await boom(request("/x"), {});
    expect(res.status).toBe(500);
    const text = await res.text();
    expect(text).not.toContain("secret internals");
    expect(JSON.parse(text).error.code).toBe("internal");
  });

  it("maps every error code to its status and no-store", async () => {
    const res = new AppError("rate_limited").toResponse();
    expect(res.status).toBe(429);
    expect(res.headers.get("cache-control")).toBe("no-store");
  });

  // Seen in tests/e2e/postgres-restart.test.ts while PostgreSQL restarted: each must be a 503 the
  // phone can retry, not a 500.
  it("answers a database that is away with 503 unavailable and Retry-After", () => {
    const pgError = (code: string, message: string) => Object.assign(new Error(message), { code, severity: "FATAL" });
    const wrapped = (cause: unknown, message = "Failed query: begin") => Object.assign(new Error(message), { cause });
    const cases: unknown[] = [
      pgError("57P01", "terminating connection due to administrator command"),
      wrapped(pgError("57P03", "the database system is shutting down")),
      wrapped(new Error("Client has encountered a connection error and is not queryable")),
      wrapped(new Error("Connection terminated unexpectedly"), "Failed query: rollback"),
      wrapped(new Error("timeout exceeded when trying to connect")),
      wrapped(wrapped(wrapped(Object.assign(new Error("connect ECONNREFUSED 127.0.0.1:5433"), { code: "ECONNREFUSED" })))),
      Object.assign(new AggregateError([Object.assign(new Error("connect ECONNREFUSED ::1:5433"), { code: "ECONNREFUSED" })]), { message: "" }),
      // better-auth wraps the failed session query in its own 500.
      Object.assign(new Error("Failed to get session"), { statusCode: 500, cause: wrapped(pgError("57P01", "terminating connection due to administrator command")) }),
    ];
    for (const c of cases) {
      const e = toAppError(c);
      expect(e.code, String((c as Error).message)).toBe("unavailable");
      expect(e.toResponse().status).toBe(503);
      expect(e.toResponse().headers.get("retry-after")).toBe("2");
    }
    expect(toAppError(new Error("disk on fire")).code).toBe("internal");
    expect(toAppError(pgError("23505", "duplicate key")).code).toBe("conflict");
  });
});
