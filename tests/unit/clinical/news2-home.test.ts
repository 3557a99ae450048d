// NEWS2 at home: whom to call at each RCP response level. The levels are RCP NEWS2 (2017)
// chart 4's; whom to call at home is common practice, no source (hazard log H-QR-008).
import { describe, expect, it } from "vitest";
import { NEWS2_RESPONSE_KEYS, news2HomeResponse, scoreNews2, SOURCES } from "@/lib/clinical";

describe("news2HomeResponse", () => {
  it("names whom to call at every RCP response level, the emergency number at the emergency level", () => {
    for (const key of NEWS2_RESPONSE_KEYS) expect(news2HomeResponse(key).key).toBe(key);
    // common practice, no source: routine → carry on; high → the emergency number only.
    expect(news2HomeResponse("routine").call).toEqual([]);
    expect(news2HomeResponse("emergency").call).toEqual(["emergency"]);
    // common practice, no source: medium → the GP now, out of hours the out-of-hours service, else the emergency number.
    expect(news2HomeResponse("urgent").call).toEqual(["gp", "out-of-hours", "emergency"]);
    // Source: RCP NEWS2 (2017) chart 1: RR 21 → 2, SpO2 93 → 2, pulse 95 → 1: total 5, medium → chart 4 urgent.
    const medium = scoreNews2({ respirationRate: 21, spo2: 93, spo2Scale: 1, onOxygen: false, systolicBp: 120, pulse: 95, consciousness: "A", temperatureC: 37.5 });
    expect(news2HomeResponse(medium.response.key).call).toContain("gp");
  });

  it("is marked common practice, no source", () => {
    for (const key of NEWS2_RESPONSE_KEYS) expect(SOURCES[news2HomeResponse(key).source].evidence).toBe("common-practice");
  });
});
