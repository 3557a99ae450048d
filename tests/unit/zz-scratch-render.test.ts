import fs from "node:fs";
import { it } from "vitest";
import { renderPassportPdf } from "@/lib/pdf";
import { qrPngDataUrl } from "@/lib/qr";
it("renders", async () => {
  for (const locales of [["pl", "en"], ["ar", "en"], ["en"], ["ur", "en"]]) {
    const url = "http://localhost:3000/p/abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQ";
    const buf = await renderPassportPdf({
      locales, url, shortCode: "ABCD-EFGH-JKMN", qrPngDataUrl: await qrPngDataUrl(url), issuedAt: new Date(), issuedByName: "Grace Mensah",
      patient: { givenName: "Halina", familyName: "Nowak", dateOfBirth: "1950-09-02", healthRecordNumber: "EM-100-002", allergies: { latex: true, chlorhexidine: false, lidocaine: false, other: "plasters" } },
      device: { route: "urethral", catheterType: "two-way", material: "hydrogel-coated-latex", lengthCategory: "female", sizeCh: 14, sizeMm: 4.7, balloonMl: 10, maker: "Northfen Medical (demo)", productName: null, lot: "HN2404", expiry: "2027-06-01", insertedAt: new Date("2026-04-01T10:00:00Z"), insertedByName: "Grace Mensah", organisationName: "Harbourside Community Nursing Team", indication: "Chronic urinary retention", plannedChangeOn: "2026-06-24", reviewDueOn: "2026-04-29" },
      history: Array.from({ length: 30 }, (_, i) => ({ at: new Date(Date.UTC(2026, 3, 1) - i * 21 * 86400000), kind: i % 3 === 0 ? "unplanned_change" : "planned_change", reason: i % 3 === 0 ? "blockage" : null, twocOutcome: null, byName: "Grace Mensah", organisationName: "Harbourside Community Nursing Team", sizeCh: 14, material: "hydrogel-coated-latex", lot: `HN${2400 + i}` } as const)),
      contacts: { emergencyNumber: "999", outOfHoursServiceName: "Eastmere out-of-hours nursing line", careTeams: [{ name: "Harbourside Community Nursing Team", phone: "01632 960 210", outOfHoursPhone: "01632 960 299" }], gp: { name: "Quayside Practice", phone: "01632 960 320", outOfHoursPhone: null } },
    });
    fs.writeFileSync(`.scratch/b-${locales[0]}.pdf`, buf);
  }
}, 60000);
