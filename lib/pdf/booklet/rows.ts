import "server-only";
// The booklet's rows as data: every label and value in each language, built by pure functions
// (tested without rendering, tests/unit/pdf-rows.test.ts); the pages only lay them out.
import { allergySummary, DISCHARGE_TEACHING } from "@/lib/clinical";
import { ltrRun } from "../kit/rtl";
import type { PdfStrings } from "../kit/strings";
import type { BookletChecklist, BookletDevice, BookletEvent, PassportBookletData } from "./types";

export type FactRow = {
  /** One label per language, patient's language first. */
  labels: string[];
  /** One value per language; shown once when every language writes it the same way. */
  values: string[];
  /** A language-neutral line under the value (a team's name). */
  note?: string;
  big?: boolean;
};

/** A Latin or numeric value, kept left to right in a right-to-left column. */
export const iso = (s: PdfStrings, value: string) => ltrRun(value, s.rtl);

export function allergyList(s: PdfStrings, a: PassportBookletData["patient"]["allergies"]): string[] {
  const out = allergySummary(a).present.map((k) => s.v(`allergen.${k}`));
  if (a.other?.trim()) out.push(`${s.t("allergy.other")}: ${a.other.trim()}`);
  return out;
}

/** "Not recorded, ask first: Latex" for the allergens nobody has asked about, or null. */
export function notRecordedLine(s: PdfStrings, a: PassportBookletData["patient"]["allergies"]): string | null {
  const unknown = allergySummary(a).notRecorded.map((k) => s.v(`allergen.${k}`));
  return unknown.length ? s.t("allergyNotRecorded", { allergens: unknown.join(s.rtl ? "، " : ", ") }) : null;
}

export function deviceRows(all: PdfStrings[], d: BookletDevice): FactRow[] {
  const each = (f: (s: PdfStrings) => string) => all.map(f);
  const row = (label: (s: PdfStrings) => string, value: (s: PdfStrings) => string): FactRow => ({
    labels: each(label),
    values: each(value),
  });
  return [
    row((s) => s.v("device.route"), (s) => s.v(`route.${d.route}`)),
    row((s) => s.v("device.type"), (s) => s.v(`catheterType.${d.catheterType}`)),
    row((s) => s.v("device.material"), (s) => s.v(`material.${d.material}`)),
    row((s) => s.v("device.length"), (s) => s.v(`lengthCategory.${d.lengthCategory}`)),
    {
      ...row((s) => s.v("device.size"), (s) => s.v("device.sizeMm", { ch: iso(s, String(d.sizeCh)), mm: iso(s, s.number(d.sizeMm)) })),
      big: true,
    },
    { ...row((s) => s.v("device.balloon"), (s) => s.v("device.balloonWater", { ml: iso(s, String(d.balloonMl)) })), big: true },
    // Maker and lot on one row: they are read together (a recall names both).
    row(
      (s) => `${s.v("device.maker")} · ${s.v("device.lot")}`,
      (s) => `${d.maker ? iso(s, [d.maker, d.productName].filter(Boolean).join(" ")) : "—"} · ${d.lot ? iso(s, d.lot) : "—"}`,
    ),
    row((s) => s.v("device.expiry"), (s) => s.day(d.expiry)),
    {
      ...row((s) => s.t("insertedOn"), (s) => s.moment(d.insertedAt)),
      note: [d.insertedByName, d.organisationName].filter(Boolean).join(", "),
    },
    row((s) => s.v("device.indication"), () => d.indication),
  ];
}

/** The two dates the nurse set, for the box at the top of the device page. */
export function plannedDates(d: BookletDevice) {
  return [
    ["nextChange", d.plannedChangeOn],
    ["reviewDue", d.reviewDueOn],
  ] as const;
}

export function contactRows(all: PdfStrings[], c: PassportBookletData["contacts"]): FactRow[] {
  const each = (f: (s: PdfStrings) => string) => all.map(f);
  const rows: FactRow[] = [{ labels: each((s) => s.t("emergency")), values: each((s) => iso(s, c.emergencyNumber)), big: true }];
  for (const team of c.careTeams) {
    rows.push({ labels: each((s) => s.t("careTeam")), values: each((s) => phoneLine(s, team.phone)), note: team.name, big: true });
    if (team.outOfHoursPhone) {
      rows.push({
        labels: each((s) => s.t("outOfHours")),
        values: each((s) => iso(s, team.outOfHoursPhone!)),
        note: c.outOfHoursServiceName ?? undefined,
        big: true,
      });
    }
  }
  if (c.gp) rows.push({ labels: each((s) => s.t("gp")), values: each((s) => phoneLine(s, c.gp!.phone)), note: c.gp.name });
  return rows;
}

export function phoneLine(s: PdfStrings, phone: string | null) {
  return phone ? iso(s, phone) : s.t("noPhone");
}

export function eventWhat(s: PdfStrings, e: BookletEvent): string {
  let what = s.v(`eventKind.${e.kind}`);
  if (e.reason) what += ` (${s.v(`unplannedReason.${e.reason}`)})`;
  if (e.twocOutcome) what += ` (${s.v(`twocOutcome.${e.twocOutcome}`)})`;
  return what;
}

export function eventDetails(s: PdfStrings, e: BookletEvent): string {
  const parts: string[] = [];
  if (e.sizeCh) parts.push(iso(s, s.v("device.sizeCh", { ch: e.sizeCh })));
  if (e.material) parts.push(s.v(`material.${e.material}`));
  if (e.lot) parts.push(`${s.v("device.lot")} ${iso(s, e.lot)}`);
  return parts.join(s.rtl ? "، " : ", ") || "—";
}

/** The discharge checklist: every item, with what was not taught or not done said plainly. */
export function checklistRows(all: PdfStrings[], c: BookletChecklist): FactRow[] {
  const each = (f: (s: PdfStrings) => string) => all.map(f);
  const items = (s: PdfStrings, taught: boolean) =>
    DISCHARGE_TEACHING.filter((i) => c.taught.includes(i) === taught)
      .map((i) => s.t(`checklist.items.${i}`))
      .join(", ") || s.t("checklist.nothing");
  return [
    { labels: each((s) => s.t("checklist.taught")), values: each((s) => items(s, true)) },
    { labels: each((s) => s.t("checklist.notTaught")), values: each((s) => items(s, false)) },
    { labels: each((s) => s.t("checklist.supplies")), values: each((s) => (c.suppliesGiven ? s.t("checklist.suppliesDays", { days: c.suppliesDays ?? 0 }) : s.t("checklist.noSupplies"))) },
    { labels: each((s) => s.t("checklist.drainage")), values: each((s) => (c.drainage ? s.t(`checklist.drainageKind.${c.drainage}`) : s.t("checklist.notRecorded"))) },
    { labels: each((s) => s.t("checklist.twoc")), values: each((s) => (c.plannedTwocOn ? s.day(c.plannedTwocOn) : s.t("checklist.noTwoc"))) },
    { labels: each((s) => s.t("checklist.firstVisit")), values: each((s) => (c.firstVisitOn ? s.day(c.firstVisitOn) : s.t("checklist.noFirstVisit"))) },
    { labels: each((s) => s.t("checklist.portal")), values: each((s) => (c.portalActivationGiven ? s.t("checklist.given") : s.t("checklist.notGiven"))) },
  ];
}
