import { describe, expect, it } from "vitest";
import { z } from "zod";
import { AppError } from "@/lib/errors";
import { handle, json } from "@/lib/http";
import { parseJsonBody } from "@/lib/validate";
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
});
