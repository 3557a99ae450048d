import { describe, expect, it } from "vitest";
import {
  checkDevice,
  ClinicalInputError,
  worstSeverity,
  type Device,
  type Finding,
  type Patient,
} from "@/lib/clinical";

const TODAY = "2025-06-15";
const device: Device = {
  route: "urethral", catheterType: "two-way", material: "all-silicone", lengthCategory: "standard",
  sizeCh: 12, balloonMl: 10, makerBalloonMl: 10, lot: "L123", expiry: "2027-01-31",
  gtin: "09506000134352", gel: { kind: "plain", volumeMl: 11 },
};
const patient: Patient = {
  sex: "male", dateOfBirth: "1950-03-02",
  allergies: { latex: false, chlorhexidine: false, lidocaine: false },
};
const codes = (f: Finding[]) => f.map((x) => `${x.severity}:${x.code}`);
const run = (d: Partial<Device> = {}, p: Partial<Patient> = {}, today = TODAY) =>
  codes(checkDevice({ ...device, ...d }, { ...patient, ...p }, today));

describe("checkDevice", () => {
  it("a well-specified adult device gives no findings", () => {
    expect(run()).toEqual([]);
  });

  it.each<[string, Partial<Device>, Partial<Patient>, string]>([
    // Source: GS1 General Specifications (AI 17 expiry: not to be used after that date)
    ["expired yesterday", { expiry: "2025-06-14" }, {}, "stop:device-expired"],
    // common practice, no source: 30-day stock warning
    ["expires within 30 days", { expiry: "2025-07-15" }, {}, "warn:device-expiring-soon"],
    // Source: EAUN (2012) chapter 12; lot and expiry recorded: common practice
    ["no expiry", { expiry: undefined }, {}, "warn:expiry-missing"],
    ["no lot", { lot: " " }, {}, "info:lot-missing"],
    // Source: GS1 General Specifications 7.9.1 (09506000134353 invalid)
    ["wrong GTIN check digit", { gtin: "09506000134353" }, {}, "warn:gtin-invalid"],
    // Source: lib/clinical/sources.ts latex-ask-before (ask about latex allergy before catheterising)
    ["latex catheter, latex allergy", { material: "ptfe-coated-latex" }, { allergies: { latex: true } }, "stop:latex-allergy"],
    ["hydrogel-coated latex, latex allergy", { material: "hydrogel-coated-latex" }, { allergies: { latex: true } }, "stop:latex-allergy"],
    ["silicone-coated latex, latex allergy", { material: "silicone-coated-latex" }, { allergies: { latex: true } }, "stop:latex-allergy"],
    ["latex catheter, allergy not known", { material: "latex" }, { allergies: {} }, "warn:latex-allergy-unknown"],
    // Source: MHRA MDA/2012/075 (chlorhexidine in gels can cause anaphylaxis)
    ["chlorhexidine gel, allergy", { gel: { kind: "chlorhexidine" } }, { allergies: { chlorhexidine: true } }, "stop:chlorhexidine-allergy"],
    ["lidocaine-chlorhexidine gel, chlorhexidine allergy", { gel: { kind: "lidocaine-chlorhexidine" } }, { allergies: { chlorhexidine: true, lidocaine: false } }, "stop:chlorhexidine-allergy"],
    ["chlorhexidine gel, allergy not known", { gel: { kind: "chlorhexidine" } }, { allergies: { latex: false } }, "warn:chlorhexidine-allergy-unknown"],
    // common practice, no source
    ["lidocaine gel, lidocaine allergy", { gel: { kind: "lidocaine", volumeMl: 11 } }, { allergies: { lidocaine: true } }, "stop:lidocaine-allergy"],
    ["lidocaine gel, allergy not known", { gel: { kind: "lidocaine" } }, { allergies: {} }, "warn:lidocaine-allergy-unknown"],
    // common practice, no source: a female-length catheter's balloon would inflate in a man's urethra
    ["female length in a male urethra", { lengthCategory: "female" }, {}, "stop:female-length-male"],
    ["female length, sex unknown", { lengthCategory: "female" }, { sex: "unknown" }, "warn:female-length-sex-unknown"],
    ["female length, sex other", { lengthCategory: "female" }, { sex: "other" }, "warn:female-length-sex-unknown"],
    ["female length suprapubic in a man", { route: "suprapubic", lengthCategory: "female" }, {}, "info:female-length-suprapubic"],
    // Source: clinical handbook (10 ml sterile water for adults)
    ["balloon differs from maker", { balloonMl: 5, makerBalloonMl: 10 }, {}, "warn:balloon-differs-from-maker"],
    ["balloon not 10 ml, maker not stated", { balloonMl: 15, makerBalloonMl: undefined }, {}, "warn:balloon-not-usual-adult"],
    ["30 ml three-way balloon as the maker states", { catheterType: "three-way", sizeCh: 16, balloonMl: 30, makerBalloonMl: 30 }, {}, "info:balloon-not-usual-adult"],
    // Source: secondary source, usually 12-14 Ch for adults (NICE/epic3/EAUN from memory); > 16 Ch warns
    ["18 Ch urethral without a reason", { sizeCh: 18 }, {}, "warn:size-larger-than-routine"],
    // common practice, no source: suprapubic usually 16 Ch
    ["20 Ch suprapubic without a reason", { route: "suprapubic", sizeCh: 20 }, {}, "warn:size-larger-than-routine"],
    // Source: journal citing RCN 2012 (long-term up to 12 weeks)
    ["dwell over 12 weeks", { maxDwellDays: 90 }, {}, "warn:dwell-over-12-weeks"],
    // common practice, no source: adult rules stop at 16 years
    ["a 10-year-old", { lengthCategory: "paediatric", sizeCh: 8, balloonMl: 3, makerBalloonMl: 3 }, { dateOfBirth: "2015-01-01" }, "warn:paediatric-patient"],
    ["paediatric length in an adult", { lengthCategory: "paediatric" }, {}, "warn:paediatric-length-adult"],
    // Source: MHRA MDA/2012/075 (catheters can contain chlorhexidine too)
    ["chlorhexidine-allergic patient, plain gel", {}, { allergies: { chlorhexidine: true } }, "info:chlorhexidine-check-catheter"],
  ])("%s", (_name, d, p, expected) => {
    expect(run(d, p)).toContain(expected);
  });

  it("expiry day itself is usable but warns", () => {
    // Source: GS1 General Specifications (AI 17)
    expect(run({ expiry: TODAY })).toEqual(["warn:device-expiring-soon"]);
  });

  it("16 Ch passes without a reason; 18 Ch with a reason passes", () => {
    // Source: secondary source, usually 12-14 Ch; threshold > 16 Ch is common practice, no source
    expect(run({ sizeCh: 16 })).toEqual([]);
    expect(run({ sizeCh: 18, largerSizeReason: "haematuria with clots" })).toEqual([]);
  });

  it("female length is fine for a female urethra and a suprapubic route", () => {
    // common practice, no source
    expect(run({ lengthCategory: "female" }, { sex: "female" })).toEqual([]);
    expect(run({ route: "suprapubic", lengthCategory: "female", sizeCh: 16 }, { sex: "female" })).toEqual(["info:female-length-suprapubic"]);
  });

  it("a child skips adult size and balloon rules", () => {
    // common practice, no source
    expect(run({ sizeCh: 20, balloonMl: 5 }, { dateOfBirth: "2012-06-16" })).toEqual(["warn:paediatric-patient"]);
    // 16th birthday today: adult rules apply
    expect(run({ sizeCh: 20 }, { dateOfBirth: "2009-06-15" })).toEqual(["warn:size-larger-than-routine"]);
  });

  it("stops come first and the worst severity is stop", () => {
    const f = checkDevice({ ...device, material: "latex", expiry: undefined, lot: undefined }, { ...patient, allergies: { latex: true } }, TODAY);
    expect(f.map((x) => x.severity)).toEqual(["stop", "warn", "info"]);
    expect(worstSeverity(f)).toBe("stop");
    expect(worstSeverity([])).toBeUndefined();
    expect(f.every((x) => x.source && x.message)).toBe(true);
  });

  it("the expiry warning window can be set", () => {
    expect(codes(checkDevice({ ...device, expiry: "2025-08-01" }, patient, TODAY, { expiryWarnDays: 60 }))).toEqual(["warn:device-expiring-soon"]);
  });

  it("accepts a Date for today and no gel", () => {
    expect(codes(checkDevice({ ...device, gel: undefined }, patient, new Date(2025, 5, 15)))).toEqual([]);
  });

  it.each<[string, Partial<Device>, Partial<Patient>]>([
    ["device.route", { route: "nasal" as never }, {}],
    ["device.material", { material: undefined as never }, {}],
    ["device.sizeCh", { sizeCh: 100 }, {}],
    ["device.balloonMl", { balloonMl: 0 }, {}],
    ["device.expiry", { expiry: "2025-02-30" }, {}],
    ["device.gel.kind", { gel: { kind: "honey" as never } }, {}],
    ["patient.sex", {}, { sex: "x" as never }],
    ["patient.allergies", {}, { allergies: undefined as never }],
    ["patient.allergies.latex", {}, { allergies: { latex: "yes" as never } }],
    ["patient.dateOfBirth", {}, { dateOfBirth: "02/03/1950" }],
  ])("bad %s throws", (field, d, p) => {
    try {
      checkDevice({ ...device, ...d }, { ...patient, ...p }, TODAY);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(ClinicalInputError);
      expect((e as ClinicalInputError).field).toBe(field);
    }
  });

  it("missing device or patient throws", () => {
    expect(() => checkDevice(undefined as never, patient, TODAY)).toThrow(ClinicalInputError);
    expect(() => checkDevice(device, null as never, TODAY)).toThrow(ClinicalInputError);
  });
});
