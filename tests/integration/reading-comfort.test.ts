// Easier reading, kept for the person: their own text size step and contrast, read back on any
// device; bad values are refused and change nothing; staff have none here.
import { describe, expect, it } from "vitest";
import { GET as getReading, PUT as putReading } from "@/app/api/account/reading/route";
import { call, sessionFor } from "../support/http";

describe("reading comfort", () => {
  it("a patient keeps a text size and contrast; a carer's are their own", async () => {
    const patient = await sessionFor("patient");
    const carer = await sessionFor("carer");
    expect(await (await call(getReading, "/api/account/reading", { cookie: patient })).json()).toEqual({ reading: { textSize: 0, contrast: "standard" } });
    const put = await call(putReading, "/api/account/reading", { method: "PUT", cookie: patient, body: { textSize: 2, contrast: "high" } });
    expect(put.status).toBe(200);
    expect((await (await call(getReading, "/api/account/reading", { cookie: patient })).json()).reading).toEqual({ textSize: 2, contrast: "high" });
    expect((await (await call(getReading, "/api/account/reading", { cookie: carer })).json()).reading).toEqual({ textSize: 0, contrast: "standard" });
    await call(putReading, "/api/account/reading", { method: "PUT", cookie: patient, body: { textSize: 0, contrast: "standard" } });
  });

  it("refuses a step out of range, an unknown contrast or extra keys, and keeps what was there", async () => {
    const patient = await sessionFor("patient");
    for (const body of [{ textSize: 4, contrast: "high" }, { textSize: 1.5, contrast: "standard" }, { textSize: 1, contrast: "neon" }, { textSize: 1, contrast: "high", theme: "dark" }, {}]) {
      expect((await call(putReading, "/api/account/reading", { method: "PUT", cookie: patient, body })).status, JSON.stringify(body)).toBe(400);
    }
    expect((await (await call(getReading, "/api/account/reading", { cookie: patient })).json()).reading).toEqual({ textSize: 0, contrast: "standard" });
    expect((await call(putReading, "/api/account/reading", { method: "PUT", cookie: await sessionFor("communityNurse"), body: { textSize: 1, contrast: "high" } })).status).toBe(403);
  });
});
