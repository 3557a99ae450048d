import "server-only";
// The passport booklet: A5 pages (two to an A4 sheet, folded), big type, the QR on the cover,
// the patient's language and English side by side. Every word comes from the PassportPdf
// catalogue namespace; right-to-left columns get direction "rtl" and right alignment.
import { Document, Image, Page, Path, Rect, StyleSheet, Svg, Text, View } from "@react-pdf/renderer";
import type { ReactNode } from "react";
import { allergySummary, type AllergyAnswers } from "@/lib/clinical";
import { PDF_FONT_FAMILY } from "./fonts";
import { pdfStrings, type PdfStrings } from "./messages";

export type BookletDevice = {
  route: "urethral" | "suprapubic";
  catheterType: "two-way" | "three-way";
  material:
    | "all-silicone"
    | "hydrogel-coated-silicone"
    | "hydrogel-coated-latex"
    | "silicone-coated-latex"
    | "ptfe-coated-latex"
    | "latex";
  lengthCategory: "standard" | "female" | "paediatric";
  sizeCh: number;
  /** Outer diameter from lib/clinical charriereToMm. */
  sizeMm: number;
  balloonMl: number;
  maker: string | null;
  productName: string | null;
  lot: string | null;
  /** YYYY-MM-DD */
  expiry: string | null;
  insertedAt: Date;
  insertedByName: string;
  organisationName: string | null;
  indication: string;
  /** YYYY-MM-DD, as stored from lib/clinical planDates when the episode was saved. */
  plannedChangeOn: string;
  reviewDueOn: string;
};

export type BookletEvent = {
  at: Date;
  kind: "insertion" | "planned_change" | "unplanned_change" | "problem" | "removal" | "twoc_outcome" | "visit" | "review";
  reason: "blockage" | "bypassing" | "expelled" | "infection" | "other" | null;
  twocOutcome: "passed" | "failed" | null;
  byName: string;
  organisationName: string | null;
  /** The catheter this event put in (insertions and changes). */
  sizeCh: number | null;
  material: BookletDevice["material"] | null;
  lot: string | null;
};

export type BookletContact = { name: string; phone: string | null; outOfHoursPhone: string | null };

export type PassportBookletData = {
  /** [patient's language, "en"], or ["en"] alone. */
  locales: string[];
  url: string;
  shortCode: string;
  qrPngDataUrl: string;
  issuedAt: Date;
  issuedByName: string;
  patient: {
    givenName: string;
    familyName: string;
    /** YYYY-MM-DD */
    dateOfBirth: string;
    healthRecordNumber: string;
    allergies: AllergyAnswers & { other: string | null };
  };
  device: BookletDevice | null;
  history: BookletEvent[];
  contacts: {
    emergencyNumber: string;
    outOfHoursServiceName: string | null;
    careTeams: BookletContact[];
    gp: BookletContact | null;
  };
  /** A one-time portal activation code, printed on its own page; never on the stored copy. */
  portalActivation?: { code: string; expiresAt: Date; activateUrl: string } | null;
};

const colour = {
  brand: "#0b5563",
  brandSoft: "#dcebec",
  ink: "#1c1f21",
  inkSoft: "#4f565b",
  line: "#8c8678",
  faint: "#d9d3c6",
  emergency: "#a4231b",
  emergencySoft: "#fbe6e3",
  urgent: "#8a4b00",
  urgentSoft: "#fdf0d9",
};

const styles = StyleSheet.create({
  page: {
    paddingTop: 26,
    paddingBottom: 52,
    paddingHorizontal: 26,
    fontFamily: PDF_FONT_FAMILY as unknown as string,
    // No lineHeight here: on a Page it stops fixed, absolutely placed footers from rendering
    // (react-pdf 4.9); Text sets its own in T.
    fontSize: 11,
    color: colour.ink,
    backgroundColor: "#ffffff",
  },
  brandRow: { flexDirection: "row", alignItems: "center", marginBottom: 8 },
  brandName: { fontSize: 12, fontWeight: 700, color: colour.brand, marginHorizontal: 6 },
  h1: { fontSize: 24, fontWeight: 700, color: colour.brand, lineHeight: 1.2 },
  h1Second: { fontSize: 15, fontWeight: 700, color: colour.inkSoft, lineHeight: 1.3 },
  h2: { fontSize: 16, fontWeight: 700, color: colour.brand, lineHeight: 1.25 },
  small: { fontSize: 9, color: colour.inkSoft },
  label: { fontSize: 8.5, color: colour.inkSoft },
  value: { fontSize: 11.5, fontWeight: 700 },
  columns: { flexDirection: "row", gap: 14 },
  column: { flex: 1 },
  section: { marginTop: 8 },
  box: { borderWidth: 1, borderColor: colour.faint, borderRadius: 6, padding: 10 },
  footer: { position: "absolute", bottom: 18, left: 26, right: 26, borderTopWidth: 0.5, borderTopColor: colour.faint, paddingTop: 4 },
});

const LRM = "\u200E";
// Latin and Latin Extended glyphs come from two subset files, so "każdej" is two font runs, and
// react-pdf offers a hyphenation break between runs. The line breaker's infinity forbids it.
const NO_BREAK = 10000;

/**
 * react-pdf 4.9 slices a glyph run from the last glyph of its first character, so an Arabic run
 * that begins with a dotted letter (drawn as a base glyph plus a dot mark in Noto Sans Arabic)
 * loses the base glyph and is measured too narrow, and wrapped lines overflow. Every Arabic
 * run begins after a space or Latin text (a different font), so we start each one with U+061C
 * ARABIC LETTER MARK: zero width, right-to-left, and in the Arabic font's own run.
 */
export function arabicRunSafe(text: string): string {
  return text.replace(/(^|[^\u0600-\u06FF])(?=[\u0600-\u06FF])/g, "$1\u061C");
}

/** Latin letters and digits inside a right-to-left line stay one left-to-right run. */
function iso(s: PdfStrings, value: string) {
  return s.rtl ? `${LRM}${value}${LRM}` : value;
}

function dir(s: PdfStrings) {
  // Arabic script one step larger than Latin (visual.md).
  return s.rtl ? ({ direction: "rtl", textAlign: "right" } as const) : ({ direction: "ltr", textAlign: "left" } as const);
}

function T({ s, style, children }: { s: PdfStrings; style?: object | object[]; children: ReactNode }) {
  const extra = Array.isArray(style) ? style : style ? [style] : [];
  return (
    <Text
      hyphenationPenalty={NO_BREAK}
      // Arabic script is taller: more leading, one step larger (visual.md).
      style={[dir(s), { lineHeight: 1.35 }, ...extra, ...(s.rtl ? [{ fontSize: bigger(extra), lineHeight: 1.5 }] : [])]}
    >
      {s.rtl && typeof children === "string" ? arabicRunSafe(children) : children}
    </Text>
  );
}

function bigger(styleList: object[]): number {
  const size = styleList.reduce<number>((acc, st) => ((st as { fontSize?: number }).fontSize ?? acc), 11);
  return Math.round(size * 1.1 * 10) / 10;
}

/** Side by side, one column per language; the patient's language on the start side. */
function Columns({ all, children }: { all: PdfStrings[]; children: (s: PdfStrings) => ReactNode }) {
  const rtlFirst = all[0]?.rtl;
  return (
    <View style={[styles.columns, { flexDirection: rtlFirst ? "row-reverse" : "row" }]}>
      {all.map((s) => (
        <View key={s.locale} style={styles.column}>
          {children(s)}
        </View>
      ))}
    </View>
  );
}

/** A label in every language on one line (patient's language first). */
function DualLabel({ all, k, style }: { all: PdfStrings[]; k: (s: PdfStrings) => string; style?: object }) {
  const rtlFirst = all[0]?.rtl;
  return (
    <View style={{ flexDirection: rtlFirst ? "row-reverse" : "row", flexWrap: "wrap" }}>
      {all.map((s, i) => (
        <T key={s.locale} s={s} style={[styles.label, style ?? {}, i > 0 ? { marginHorizontal: 6 } : {}]}>
          {i > 0 ? `·  ${k(s)}` : k(s)}
        </T>
      ))}
    </View>
  );
}

function Mark() {
  return (
    <Svg viewBox="0 0 32 32" style={{ width: 22, height: 22 }}>
      <Rect x="9" y="3" width="14" height="26" rx="7" fill={colour.brand} />
      <Rect x="12" y="6" width="8" height="20" rx="4" fill="#faf7f0" />
      <Path d="M12 11h8M12 16h8M12 21h8" stroke={colour.brand} strokeWidth={2} />
    </Svg>
  );
}

function Footer({ all }: { all: PdfStrings[] }) {
  const first = all[0];
  return (
    <View style={styles.footer} fixed>
      {all.map((s) => (
        <T key={s.locale} s={s} style={{ fontSize: 7.5, color: colour.inkSoft, lineHeight: 1.3 }}>
          {s.t("translationNote")}
        </T>
      ))}
      <Text
        style={[dir(first), { fontSize: 7.5, color: colour.inkSoft }]}
        render={({ pageNumber, totalPages }) => {
          const text = first.t("page", { page: iso(first, String(pageNumber)), total: iso(first, String(totalPages)) });
          return first.rtl ? arabicRunSafe(text) : text;
        }}
      />
    </View>
  );
}

function allergyList(s: PdfStrings, a: PassportBookletData["patient"]["allergies"]): string[] {
  const out = allergySummary(a).present.map((k) => s.t(`allergy.${k}`));
  if (a.other?.trim()) out.push(`${s.t("allergy.other")}: ${a.other.trim()}`);
  return out;
}

/** "Not recorded, ask first: Latex" for the allergens nobody has asked about, or null. */
function notRecordedLine(s: PdfStrings, a: PassportBookletData["patient"]["allergies"]): string | null {
  const unknown = allergySummary(a).notRecorded.map((k) => s.t(`allergy.${k}`));
  return unknown.length ? s.t("allergyNotRecorded", { allergens: unknown.join(s.rtl ? "، " : ", ") }) : null;
}

function AllergyBox({ all, data }: { all: PdfStrings[]; data: PassportBookletData }) {
  const any = allergyList(all[0], data.patient.allergies).length > 0 || notRecordedLine(all[0], data.patient.allergies) !== null;
  return (
    <View
      wrap={false}
      style={[
        styles.box,
        any ? { borderWidth: 2.5, borderColor: colour.emergency, backgroundColor: colour.emergencySoft } : { borderColor: colour.line },
      ]}
    >
      <Columns all={all}>
        {(s) => {
          const items = allergyList(s, data.patient.allergies);
          const unknown = notRecordedLine(s, data.patient.allergies);
          return (
            <View>
              <T s={s} style={{ fontSize: 11, fontWeight: 700, color: any ? colour.emergency : colour.ink }}>
                {s.t("allergiesTitle")}
              </T>
              {unknown ? (
                <T s={s} style={{ fontSize: 11, fontWeight: 700 }}>
                  {unknown}
                </T>
              ) : null}
              {items.length ? (
                <>
                  <T s={s} style={{ fontSize: 13, fontWeight: 700 }}>
                    {items.join(s.rtl ? "، " : ", ")}
                  </T>
                  <T s={s} style={{ fontSize: 8.5 }}>
                    {s.t("allergyCheck")}
                  </T>
                </>
              ) : unknown ? null : (
                <T s={s}>{s.t("noAllergies")}</T>
              )}
            </View>
          );
        }}
      </Columns>
    </View>
  );
}

function Cover({ all, data }: { all: PdfStrings[]; data: PassportBookletData }) {
  const first = all[0];
  const p = data.patient;
  const row = first.rtl ? "row-reverse" : "row";
  return (
    <Page size="A5" style={styles.page}>
      <View style={[styles.brandRow, { flexDirection: row }]}>
        <Mark />
        <Text style={styles.brandName}>Caddis</Text>
      </View>
      {all.map((s, i) => (
        <T key={s.locale} s={s} style={i === 0 ? styles.h1 : styles.h1Second}>
          {s.t("title")}
        </T>
      ))}
      <View style={{ marginTop: 4 }}>
        <Columns all={all}>{(s) => <T s={s} style={{ fontSize: 9.5 }}>{s.t("carry")}</T>}</Columns>
      </View>

      <View style={[styles.section, styles.box, { borderColor: colour.brand, paddingVertical: 7 }]}>
        <DualLabel all={all} k={(s) => s.t("name")} />
        <T s={first} style={{ fontSize: 18, fontWeight: 700 }}>
          {`${p.givenName} ${p.familyName}`}
        </T>
        <View style={{ flexDirection: row, gap: 18, marginTop: 2 }}>
          <View>
            <DualLabel all={all} k={(s) => s.t("dateOfBirth")} />
            <T s={first} style={styles.value}>
              {first.day(p.dateOfBirth)}
            </T>
          </View>
          <View>
            <DualLabel all={all} k={(s) => s.t("recordNumber")} />
            <T s={first} style={styles.value}>
              {iso(first, p.healthRecordNumber)}
            </T>
          </View>
        </View>
      </View>

      <View style={[styles.section, { flexDirection: row, gap: 12, alignItems: "center" }]} wrap={false}>
        <Image src={data.qrPngDataUrl} style={{ width: 118, height: 118 }} />
        <View style={{ flex: 1 }}>
          <DualLabel all={all} k={(s) => s.t("code")} />
          <Text style={[dir(first), { fontSize: 19, fontWeight: 700, letterSpacing: 1 }]}>{iso(first, data.shortCode)}</Text>
          {all.map((s, i) => (
            <View key={s.locale} style={{ marginTop: i === 0 ? 3 : 2 }}>
              <T s={s} style={{ fontSize: 9.5, fontWeight: 700 }}>
                {s.t("scanTitle")}
              </T>
              <T s={s} style={{ fontSize: 8, color: colour.inkSoft }}>
                {s.t("scanHint")}
              </T>
            </View>
          ))}
        </View>
      </View>
      <T s={first} style={[styles.small, { marginTop: 2 }]}>
        {`${first.t("issued")} ${first.moment(data.issuedAt)} · ${first.t("issuedBy")} ${iso(first, data.issuedByName)}`}
      </T>

      <View style={styles.section}>
        <AllergyBox all={all} data={data} />
      </View>
      <Footer all={all} />
    </Page>
  );
}

type FactRow = {
  /** One label per language, patient's language first. */
  labels: string[];
  /** One value per language; shown once when every language writes it the same way. */
  values: string[];
  /** A language-neutral line under the value (a team's name). */
  note?: string;
  big?: boolean;
};

/** Label and value rows, each label in every language beside its value. */
function FactTable({ all, rows }: { all: PdfStrings[]; rows: FactRow[] }) {
  const first = all[0];
  const row = first.rtl ? "row-reverse" : "row";
  return (
    <View>
      {rows.map((r, index) => {
        const strip = (v: string) => v.replaceAll(LRM, "");
        const distinct = r.values.filter((v, i) => i === 0 || strip(v) !== strip(r.values[0]));
        return (
          <View
            key={index}
            wrap={false}
            style={{ flexDirection: row, borderBottomWidth: 0.5, borderBottomColor: colour.faint, paddingVertical: 1 }}
          >
            <View style={{ width: "38%", paddingHorizontal: 2 }}>
              {r.labels.map((label, i) => (
                <T
                  key={i}
                  s={all[i]}
                  style={
                    i === 0
                      ? { fontSize: 9, color: colour.ink }
                      : { fontSize: 8, color: colour.inkSoft, ...(first.rtl ? { textAlign: "right" } : {}) }
                  }
                >
                  {label}
                </T>
              ))}
            </View>
            <View style={{ width: "62%", paddingHorizontal: 2 }}>
              {distinct.map((v, i) => (
                <T
                  key={i}
                  s={all[r.values.indexOf(v)]}
                  style={
                    i === 0
                      ? { fontSize: r.big ? 12.5 : 11, fontWeight: 700 }
                      : { fontSize: 9, color: colour.inkSoft, ...(first.rtl ? { textAlign: "right" } : {}) }
                  }
                >
                  {v}
                </T>
              ))}
              {r.note ? (
                <T s={first} style={{ fontSize: 8.5, color: colour.inkSoft }}>
                  {iso(first, r.note)}
                </T>
              ) : null}
            </View>
          </View>
        );
      })}
    </View>
  );
}

function SectionTitle({ all, k }: { all: PdfStrings[]; k: (s: PdfStrings) => string }) {
  return (
    <View style={{ marginBottom: 6, borderBottomWidth: 1.5, borderBottomColor: colour.brand, paddingBottom: 3 }} minPresenceAhead={60}>
      <Columns all={all}>
        {(s) => (
          <T s={s} style={styles.h2}>
            {k(s)}
          </T>
        )}
      </Columns>
    </View>
  );
}

function deviceRows(all: PdfStrings[], d: BookletDevice): FactRow[] {
  const each = (f: (s: PdfStrings) => string) => all.map(f);
  const row = (label: (s: PdfStrings) => string, value: (s: PdfStrings) => string): FactRow => ({
    labels: each(label),
    values: each(value),
  });
  return [
    row((s) => s.t("route"), (s) => s.t(`routes.${d.route}`)),
    row((s) => s.t("catheterType"), (s) => s.t(`catheterTypes.${d.catheterType}`)),
    row((s) => s.t("material"), (s) => s.t(`materials.${d.material}`)),
    row((s) => s.t("length"), (s) => s.t(`lengths.${d.lengthCategory}`)),
    {
      ...row((s) => s.t("size"), (s) => s.t("sizeValue", { ch: iso(s, String(d.sizeCh)), mm: iso(s, s.number(d.sizeMm)) })),
      big: true,
    },
    { ...row((s) => s.t("balloon"), (s) => s.t("balloonValue", { ml: iso(s, String(d.balloonMl)) })), big: true },
    // Maker and lot on one row: they are read together (a recall names both).
    row(
      (s) => `${s.t("maker")} · ${s.t("lot")}`,
      (s) => `${d.maker ? iso(s, [d.maker, d.productName].filter(Boolean).join(" ")) : "—"} · ${d.lot ? iso(s, d.lot) : "—"}`,
    ),
    row((s) => s.t("expiry"), (s) => s.day(d.expiry)),
    {
      ...row((s) => s.t("insertedOn"), (s) => s.moment(d.insertedAt)),
      note: [d.insertedByName, d.organisationName].filter(Boolean).join(", "),
    },
    row((s) => s.t("indication"), () => d.indication),
  ];
}

function DevicePage({ all, data }: { all: PdfStrings[]; data: PassportBookletData }) {
  const d = data.device;
  return (
    <Page size="A5" style={styles.page} wrap>
      <SectionTitle all={all} k={(s) => s.t("deviceTitle")} />
      {d ? (
        <>
          <View style={[styles.box, { backgroundColor: colour.brandSoft, borderColor: colour.brand, marginBottom: 6, paddingVertical: 5 }]} wrap={false}>
            <DualLabel all={all} k={(s) => s.t("datesTitle")} style={{ fontSize: 9, fontWeight: 700, color: colour.brand }} />
            <View style={{ flexDirection: all[0].rtl ? "row-reverse" : "row", gap: 12 }}>
              {([
                ["nextChange", d.plannedChangeOn],
                ["reviewDue", d.reviewDueOn],
              ] as const).map(([key, date]) => (
                <View key={key} style={{ flex: 1 }}>
                  {all.map((s, i) => (
                    <View key={s.locale}>
                      <T s={s} style={styles.label}>
                        {s.t(key)}
                      </T>
                      <T s={s} style={i === 0 ? { fontSize: 14, fontWeight: 700 } : { fontSize: 10, fontWeight: 700, color: colour.inkSoft }}>
                        {s.day(date)}
                      </T>
                    </View>
                  ))}
                </View>
              ))}
            </View>
            <View style={{ marginTop: 2 }}>
              <Columns all={all}>{(s) => <T s={s} style={{ fontSize: 7.5 }}>{s.t("datesNote")}</T>}</Columns>
            </View>
          </View>
          <FactTable all={all} rows={deviceRows(all, d)} />
        </>
      ) : (
        <Columns all={all}>{(s) => <T s={s} style={{ fontSize: 13 }}>{s.t("noDevice")}</T>}</Columns>
      )}
      <Footer all={all} />
    </Page>
  );
}

/** One page per language, facing each other in the folded booklet: room for big type. */
function HelpPage({ s, all, data }: { s: PdfStrings; all: PdfStrings[]; data: PassportBookletData }) {
  const c = data.contacts;
  const team = c.careTeams.find((t) => t.phone) ?? null;
  const ooh = c.careTeams.find((t) => t.outOfHoursPhone)?.outOfHoursPhone ?? null;
  const bullet = (text: string) => (
    <T key={text} s={s} style={{ fontSize: 11, marginBottom: 1.5 }}>
      {`•  ${text}`}
    </T>
  );
  return (
    <Page size="A5" style={styles.page} wrap>
      <View style={{ marginBottom: 6, borderBottomWidth: 1.5, borderBottomColor: colour.brand, paddingBottom: 3 }}>
        <T s={s} style={styles.h2}>
          {s.t("helpTitle")}
        </T>
      </View>
      <T s={s} style={{ fontWeight: 700, fontSize: 11.5 }}>
        {s.t("helpGeneral")}
      </T>
      <View style={[styles.section, styles.box, { borderWidth: 2.5, borderColor: colour.emergency }]} wrap={false}>
        <T s={s} style={{ fontSize: 14, fontWeight: 700, color: colour.emergency }}>
          {s.t("emergencyIntro", { number: iso(s, c.emergencyNumber) })}
        </T>
        {(["emergency1", "emergency2", "emergency3", "emergency4"] as const).map((k) => bullet(s.t(k)))}
      </View>
      <View style={[styles.section, styles.box, { borderWidth: 2, borderColor: colour.urgent }]} wrap={false}>
        <T s={s} style={{ fontSize: 13, fontWeight: 700, color: colour.urgent }}>
          {s.t("urgentIntro")}
        </T>
        {team ? (
          <T s={s} style={{ fontSize: 12, fontWeight: 700 }}>
            {`${s.t("careTeam")}: ${iso(s, team.phone!)}`}
          </T>
        ) : null}
        {ooh ? (
          <T s={s} style={{ fontSize: 12, fontWeight: 700 }}>
            {`${s.t("outOfHours")}: ${iso(s, ooh)}`}
          </T>
        ) : null}
        {(["urgent1", "urgent2", "urgent3", "urgent4", "urgent5"] as const).map((k) => bullet(s.t(k)))}
      </View>
      <View style={styles.section} wrap={false}>
        <T s={s} style={{ fontSize: 11 }}>
          {s.t("selfCare")}
        </T>
      </View>
      <Footer all={all} />
    </Page>
  );
}

function contactRows(all: PdfStrings[], c: PassportBookletData["contacts"]): FactRow[] {
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

function phoneLine(s: PdfStrings, phone: string | null) {
  return phone ? iso(s, phone) : s.t("noPhone");
}

function eventWhat(s: PdfStrings, e: BookletEvent): string {
  let what = s.t(`events.${e.kind}`);
  if (e.reason) what += ` (${s.t(`reasons.${e.reason}`)})`;
  if (e.twocOutcome) what += ` (${s.t(`twoc.${e.twocOutcome}`)})`;
  return what;
}

function eventDetails(s: PdfStrings, e: BookletEvent): string {
  const parts: string[] = [];
  if (e.sizeCh) parts.push(iso(s, `${e.sizeCh} Ch`));
  if (e.material) parts.push(s.t(`materials.${e.material}`));
  if (e.lot) parts.push(`${s.t("lot")} ${iso(s, e.lot)}`);
  return parts.join(s.rtl ? "، " : ", ") || "—";
}

function ContactsAndHistoryPage({ all, data }: { all: PdfStrings[]; data: PassportBookletData }) {
  const first = all[0];
  const c = data.contacts;
  const rowDirection = first.rtl ? "row-reverse" : "row";
  const cell = { when: { width: "21%" }, what: { width: "28%" }, details: { width: "32%" }, by: { width: "19%" } } as const;
  const cellPad = { paddingHorizontal: 3 };
  return (
    <Page size="A5" style={styles.page} wrap>
      <SectionTitle all={all} k={(s) => s.t("contactsTitle")} />
      <FactTable all={all} rows={contactRows(all, c)} />
      <View style={styles.section} minPresenceAhead={80}>
        <SectionTitle all={all} k={(s) => s.t("historyTitle")} />
      </View>
      <Columns all={all}>{(s) => <T s={s} style={styles.small}>{s.t("historyIntro")}</T>}</Columns>
      {data.history.length === 0 ? (
        <Columns all={all}>{(s) => <T s={s}>{s.t("noHistory")}</T>}</Columns>
      ) : (
        <View style={{ marginTop: 6 }}>
          <View
            fixed
            style={{ flexDirection: rowDirection, borderBottomWidth: 1, borderBottomColor: colour.line, paddingBottom: 2, marginBottom: 2 }}
          >
            {(["when", "what", "details", "by"] as const).map((k) => (
              <View key={k} style={[cell[k], cellPad]}>
                {all.map((s, i) => (
                  <T key={s.locale} s={s} style={i === 0 ? { fontSize: 9, fontWeight: 700 } : { fontSize: 8, color: colour.inkSoft }}>
                    {s.t(k)}
                  </T>
                ))}
              </View>
            ))}
          </View>
          {data.history.map((e, index) => (
            <View
              key={index}
              wrap={false}
              style={{ flexDirection: rowDirection, borderBottomWidth: 0.5, borderBottomColor: colour.faint, paddingVertical: 3 }}
            >
              <View style={[cell.when, cellPad]}>
                <T s={first} style={{ fontSize: 9.5, fontWeight: 700 }}>
                  {first.moment(e.at)}
                </T>
              </View>
              <View style={[cell.what, cellPad]}>
                {all.map((s, i) => (
                  <T key={s.locale} s={s} style={i === 0 ? { fontSize: 9.5, fontWeight: 700 } : { fontSize: 8.5, color: colour.inkSoft }}>
                    {eventWhat(s, e)}
                  </T>
                ))}
              </View>
              <View style={[cell.details, cellPad]}>
                {all.map((s, i) => (
                  <T key={s.locale} s={s} style={i === 0 ? { fontSize: 9.5 } : { fontSize: 8.5, color: colour.inkSoft }}>
                    {eventDetails(s, e)}
                  </T>
                ))}
              </View>
              <View style={[cell.by, cellPad]}>
                <T s={first} style={{ fontSize: 9 }}>
                  {iso(first, e.byName)}
                </T>
              </View>
            </View>
          ))}
        </View>
      )}
      <Footer all={all} />
    </Page>
  );
}

/** The patient's way into the portal: the code once, big, with where to type it and until when. */
function PortalPage({ all, activation }: { all: PdfStrings[]; activation: NonNullable<PassportBookletData["portalActivation"]> }) {
  return (
    <Page size="A5" style={styles.page}>
      <View style={{ marginBottom: 6, borderBottomWidth: 1.5, borderBottomColor: colour.brand, paddingBottom: 3 }}>
        {all.map((s, i) => (
          <T key={s.locale} s={s} style={i === 0 ? styles.h2 : [styles.h2, { fontSize: 13, color: colour.inkSoft }]}>
            {s.t("portalTitle")}
          </T>
        ))}
      </View>
      <Columns all={all}>{(s) => <T s={s} style={{ fontSize: 11 }}>{s.t("portalIntro")}</T>}</Columns>
      <View style={[styles.section, styles.box, { borderWidth: 2, borderColor: colour.brand, alignItems: "center", paddingVertical: 12 }]} wrap={false}>
        <DualLabel all={all} k={(s) => s.t("portalCode")} />
        <Text style={{ fontSize: 24, fontWeight: 700, letterSpacing: 2, marginTop: 4, direction: "ltr", textAlign: "center" }}>{activation.code}</Text>
        <Text style={{ fontSize: 10, marginTop: 6, direction: "ltr", textAlign: "center" }}>{activation.activateUrl}</Text>
      </View>
      <View style={styles.section}>
        <Columns all={all}>
          {(s) => (
            <View>
              <T s={s} style={{ fontSize: 11, fontWeight: 700 }}>
                {s.t("portalExpires", { date: s.moment(activation.expiresAt) })}
              </T>
              <T s={s} style={{ fontSize: 10, marginTop: 4 }}>
                {s.t("portalOnce")}
              </T>
            </View>
          )}
        </Columns>
      </View>
      <View style={{ marginTop: 10 }}>
        <Columns all={all}>
          {(s) => (
            <T s={s} style={styles.small}>
              {s.t("portalPrivate")}
            </T>
          )}
        </Columns>
      </View>
      <Footer all={all} />
    </Page>
  );
}

export function PassportBooklet({ data }: { data: PassportBookletData }) {
  const all = data.locales.map((l) => pdfStrings(l));
  return (
    <Document
      title={all.map((s) => s.t("documentTitle")).join(" / ")}
      author="Caddis"
      creator="Caddis"
      producer="Caddis"
      language={all[0].locale}
    >
      <Cover all={all} data={data} />
      <DevicePage all={all} data={data} />
      {all.map((s) => (
        <HelpPage key={s.locale} s={s} all={all} data={data} />
      ))}
      <ContactsAndHistoryPage all={all} data={data} />
      {data.portalActivation ? <PortalPage all={all} activation={data.portalActivation} /> : null}
    </Document>
  );
}
