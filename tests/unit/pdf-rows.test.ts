// The passport booklet's rows as data, without rendering a PDF: what each row says in each
// language, in what order, and how right-to-left columns keep Latin values whole.
import { describe, expect, it } from "vitest";
import { charriereToMm } from "@/lib/clinical";
import { allergyList, checklistRows, contactRows, notRecordedLine, deviceRows, eventDetails, eventWhat, plannedDates } from "@/lib/pdf/booklet/rows";
import type { BookletDevice, BookletEvent } from "@/lib/pdf/booklet/types";
import { pdfStrings } from "@/lib/pdf/kit/strings";
import { pdfText, withoutMarks } from "@/lib/pdf/kit/rtl";
import en from "@/messages/en.json";

const words = en.PassportPdf;
const vocab = en.Vocabulary;
const dev = en.Vocabulary.device;
const LRM = "\u200E";
const enOnly = [pdfStrings("en", "GB")];
const arEn = [pdfStrings("ar", "GB"), pdfStrings("en", "GB")];

const device: BookletDevice = {
  route: "suprapubic",
  catheterType: "two-way",
  material: "all-silicone",
  lengthCategory: "standard",
  sizeCh: 16,
  sizeMm: charriereToMm(16),
  balloonMl: 10,
  maker: "Northfen Medical (demo)",
  productName: "SilkLine",
  lot: "YH5520",
  expiry: "2028-11-30",
  insertedAt: new Date("2026-11-02T10:00:00Z"),
  insertedByName: "Grace Mensah",
  organisationName: "Harbourside Community Nursing Team",
  indication: "Chronic urinary retention",
  plannedChangeOn: "2027-01-25",
  reviewDueOn: "2026-11-30",
};

describe("device rows", () => {
  it("every fact once, in the order a clinician reads them, the size and balloon in big type", () => {
    const rows = deviceRows(enOnly, device);
    expect(rows.map((r) => r.labels[0])).toEqual([
      dev.route, dev.type, dev.material, dev.length, dev.size, dev.balloon,
      `${dev.maker} · ${dev.lot}`, dev.expiry, words.insertedOn, dev.indication,
    ]);
    const value = (label: string) => rows.find((r) => r.labels[0] === label)!.values[0];
    // Source: ISO 20696:2018 clause 5.5.2: 16 Ch → 5.4 mm.
    expect(value(dev.size)).toBe("16 Ch (5.4 mm)");
    expect(value(dev.balloon)).toBe("10 ml sterile water");
    expect(value(dev.material)).toBe(vocab.material["all-silicone"]);
    // Maker and lot together: a recall names both.
    expect(value(`${dev.maker} · ${dev.lot}`)).toBe("Northfen Medical (demo) SilkLine · YH5520");
    expect(rows.filter((r) => r.big).map((r) => r.labels[0])).toEqual([dev.size, dev.balloon]);
    expect(rows.find((r) => r.labels[0] === words.insertedOn)!.note).toBe("Grace Mensah, Harbourside Community Nursing Team");
  });

  it("says what is not recorded instead of leaving a gap", () => {
    const rows = deviceRows(enOnly, { ...device, maker: null, lot: null, expiry: null });
    expect(rows.find((r) => r.labels[0] === `${dev.maker} · ${dev.lot}`)!.values[0]).toBe("— · —");
    expect(rows.find((r) => r.labels[0] === dev.expiry)!.values[0]).toBe("—");
  });

  it("in Arabic beside English: one label and value per language, Latin values held left to right", () => {
    const rows = deviceRows(arEn, device);
    for (const r of rows) {
      expect(r.labels).toHaveLength(2);
      expect(r.values).toHaveLength(2);
    }
    const size = rows[4]!;
    expect(size.values[1]).toBe("16 Ch (5.4 mm)");
    expect(size.values[0]).toContain(`${LRM}16${LRM}`);
    expect(withoutMarks(size.values[0])).toContain("16");
    expect(rows[6]!.values[0]).toContain(`${LRM}YH5520${LRM}`);
  });

  it("the dates the nurse set, next change first", () => {
    expect(plannedDates(device)).toEqual([["nextChange", "2027-01-25"], ["reviewDue", "2026-11-30"]]);
  });
});

describe("contact rows", () => {
  const contacts = {
    emergencyNumber: "999",
    outOfHoursServiceName: "Eastmere Out-of-Hours",
    careTeams: [
      { name: "Harbourside Community Nursing Team", phone: "01632 960 210", outOfHoursPhone: "01632 960 299" },
      { name: "Larch Ward", phone: null, outOfHoursPhone: null },
    ],
    gp: { name: "Quayside Practice", phone: "01632 960 400", outOfHoursPhone: null },
  };

  it("the emergency number first, each team with its out-of-hours line, the GP last", () => {
    const rows = contactRows(enOnly, contacts);
    expect(rows.map((r) => [r.labels[0], r.values[0], r.note])).toEqual([
      [words.emergency, "999", undefined],
      [words.careTeam, "01632 960 210", "Harbourside Community Nursing Team"],
      [words.outOfHours, "01632 960 299", "Eastmere Out-of-Hours"],
      [words.careTeam, words.noPhone, "Larch Ward"],
      [words.gp, "01632 960 400", "Quayside Practice"],
    ]);
    expect(rows[0]!.big).toBe(true);
  });
});

describe("allergies and history", () => {
  it("lists the allergies a patient has in a fixed order, the free-text one last with its label", () => {
    const s = pdfStrings("en", "GB");
    expect(allergyList(s, { latex: "yes", chlorhexidine: "no", lidocaine: "yes", other: " plasters " })).toEqual([
      vocab.allergen.latex, vocab.allergen.lidocaine, `${words.allergy.other}: plasters`,
    ]);
    expect(allergyList(s, { latex: "no", chlorhexidine: "no", lidocaine: "no", other: "  " })).toEqual([]);
    expect(notRecordedLine(s, { latex: "no", chlorhexidine: "no", lidocaine: "no", other: null })).toBeNull();
  });

  it("names the allergens nobody has asked about, to ask first", () => {
    const s = pdfStrings("en", "GB");
    const line = notRecordedLine(s, { latex: "not-asked", chlorhexidine: "no", lidocaine: "not-asked", other: null });
    expect(line).toBe(words.allergyNotRecorded.replace("{allergens}", `${vocab.allergen.latex}, ${vocab.allergen.lidocaine}`));
  });

  it("says what happened, why, and which catheter went in", () => {
    const s = pdfStrings("en", "GB");
    const e: BookletEvent = { at: new Date(), kind: "unplanned_change", reason: "blockage", twocOutcome: null, byName: "Grace Mensah", organisationName: null, sizeCh: 16, material: "all-silicone", lot: "YH5520" };
    expect(eventWhat(s, e)).toBe(`${vocab.eventKind.unplanned_change} (${vocab.unplannedReason.blockage})`);
    expect(eventDetails(s, e)).toBe(`16 Ch, ${vocab.material["all-silicone"]}, ${dev.lot} YH5520`);
    expect(eventDetails(s, { ...e, sizeCh: null, material: null, lot: null })).toBe("—");
    expect(eventDetails(pdfStrings("ar", "GB"), e)).toContain("، ");
  });
});

describe("the one right-to-left fix", () => {
  it("drops Intl's right-to-left marks (they swap a date's parts) and starts each Arabic run with ALM", () => {
    // Intl's Arabic short date carries U+200F between its parts.
    const date = new Intl.DateTimeFormat("ar", { dateStyle: "short", timeZone: "UTC" }).format(new Date("2026-11-02T12:00:00Z"));
    expect(date).toContain("\u200F");
    expect(pdfText(date, true)).not.toContain("\u200F");
    expect(pdfText("يوسف حداد", true)).toBe("\u061Cيوسف \u061Cحداد");
    expect(pdfText(`${LRM}16 Ch${LRM} مم`, true)).toBe(`${LRM}16 Ch${LRM} \u061Cمم`);
    expect(pdfText("Grace Mensah", false)).toBe("Grace Mensah");
  });
});

describe("discharge checklist rows", () => {
  it("says what was not taught and not done, in each language", () => {
    const rows = checklistRows(arEn, {
      taught: ["emptying-bag", "when-to-get-help"],
      suppliesGiven: false,
      suppliesDays: null,
      drainage: "valve",
      plannedTwocOn: "2027-01-14",
      firstVisitOn: null,
      portalActivationGiven: false,
    });
    const en = rows.map((r) => `${r.labels[1]}: ${r.values[1]}`);
    expect(en[0]).toBe("Shown how to: empty the bag, when to get help");
    expect(en[1]).toContain("Not yet shown: change the bags");
    expect(en).toContain("Supplies given: none given");
    expect(en).toContain("Drains through: a catheter valve");
    expect(en).toContain("First home visit: not arranged yet");
    expect(en).toContain("Caddis app code: not given");
    // Arabic first, every row in both languages.
    expect(rows.every((r) => r.labels.length === 2 && r.values.length === 2)).toBe(true);
    expect(rows[1].labels[0]).toBe("لم يُعلَّم بعد");
  });
});
