import "server-only";
// The passport booklet: A5 pages (two to an A4 sheet, folded), big type, the QR on the cover,
// the patient's language and English side by side. Every word comes from the PassportPdf
// catalogue namespace; right-to-left columns get direction "rtl" and right alignment.
import { Document, Image, Page, Path, Rect, StyleSheet, Svg, Text, View } from "@react-pdf/renderer";
import type { ReactNode } from "react";
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
    allergies: { latex: boolean; chlorhexidine: boolean; lidocaine: boolean; other: string | null };
  };
  device: BookletDevice | null;
  history: BookletEvent[];
  contacts: {
    emergencyNumber: string;
    outOfHoursServiceName: string | null;
    careTeams: BookletContact[];
    gp: BookletContact | null;
  };
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
  section: { marginTop: 10 },
  box: { borderWidth: 1, borderColor: colour.faint, borderRadius: 6, padding: 10 },
  footer: { position: "absolute", bottom: 18, left: 26, right: 26, borderTopWidth: 0.5, borderTopColor: colour.faint, paddingTop: 4 },
});

const LRM = "\u200E";

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
  return <Text style={[dir(s), { lineHeight: 1.35 }, ...extra, ...(s.rtl ? [{ fontSize: bigger(extra) }] : [])]}>{children}</Text>;
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
        render={({ pageNumber, totalPages }) => first.t("page", { page: iso(first, String(pageNumber)), total: iso(first, String(totalPages)) })}
      />
    </View>
  );
}

function allergyList(s: PdfStrings, a: PassportBookletData["patient"]["allergies"]): string[] {
  const out: string[] = [];
  if (a.latex) out.push(s.t("allergy.latex"));
  if (a.chlorhexidine) out.push(s.t("allergy.chlorhexidine"));
  if (a.lidocaine) out.push(s.t("allergy.lidocaine"));
  if (a.other?.trim()) out.push(`${s.t("allergy.other")}: ${a.other.trim()}`);
  return out;
}

function AllergyBox({ all, data }: { all: PdfStrings[]; data: PassportBookletData }) {
  const any = allergyList(all[0], data.patient.allergies).length > 0;
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
          return (
            <View>
              <T s={s} style={{ fontSize: 13, fontWeight: 700, color: any ? colour.emergency : colour.ink }}>
                {s.t("allergiesTitle")}
              </T>
              {items.length ? (
                <>
                  {items.map((item) => (
                    <T key={item} s={s} style={{ fontSize: 13, fontWeight: 700 }}>
                      {item}
                    </T>
                  ))}
                  <T s={s} style={{ fontSize: 9.5 }}>
                    {s.t("allergyCheck")}
                  </T>
                </>
              ) : (
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
  return (
    <Page size="A5" style={styles.page}>
      <View style={[styles.brandRow, { flexDirection: first.rtl ? "row-reverse" : "row" }]}>
        <Mark />
        <Text style={styles.brandName}>Caddis</Text>
      </View>
      {all.map((s, i) => (
        <T key={s.locale} s={s} style={i === 0 ? styles.h1 : styles.h1Second}>
          {s.t("title")}
        </T>
      ))}
      <View style={{ marginTop: 6 }}>
        <Columns all={all}>{(s) => <T s={s} style={{ fontSize: 10 }}>{s.t("carry")}</T>}</Columns>
      </View>

      <View style={[styles.section, styles.box, { borderColor: colour.brand }]}>
        <DualLabel all={all} k={(s) => s.t("name")} />
        <T s={first} style={{ fontSize: 18, fontWeight: 700 }}>
          {`${p.givenName} ${p.familyName}`}
        </T>
        <View style={{ flexDirection: first.rtl ? "row-reverse" : "row", gap: 18, marginTop: 4 }}>
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

      <View style={[styles.section, { alignItems: "center" }]} wrap={false}>
        <Image src={data.qrPngDataUrl} style={{ width: 128, height: 128 }} />
        <DualLabel all={all} k={(s) => s.t("code")} />
        <Text style={{ fontSize: 20, fontWeight: 700, letterSpacing: 1.5, marginTop: 1 }}>{data.shortCode}</Text>
        <T s={first} style={[styles.small, { textAlign: "center" }]}>
          {`${first.t("issued")} ${first.moment(data.issuedAt)} · ${first.t("issuedBy")} ${iso(first, data.issuedByName)}`}
        </T>
      </View>
      <View style={{ marginTop: 6 }}>
        <Columns all={all}>
          {(s) => (
            <View>
              <T s={s} style={{ fontSize: 10.5, fontWeight: 700 }}>
                {s.t("scanTitle")}
              </T>
              <T s={s} style={{ fontSize: 9 }}>
                {s.t("scanHint")}
              </T>
            </View>
          )}
        </Columns>
      </View>

      <View style={styles.section}>
        <AllergyBox all={all} data={data} />
      </View>
      <Footer all={all} />
    </Page>
  );
}

function Fact({ s, label, value }: { s: PdfStrings; label: string; value: string }) {
  return (
    <View style={{ marginBottom: 3 }} wrap={false}>
      <T s={s} style={styles.label}>
        {label}
      </T>
      <T s={s} style={styles.value}>
        {value}
      </T>
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

function deviceFacts(s: PdfStrings, d: BookletDevice): { label: string; value: string }[] {
  const rows = [
    { label: s.t("route"), value: s.t(`routes.${d.route}`) },
    { label: s.t("catheterType"), value: s.t(`catheterTypes.${d.catheterType}`) },
    { label: s.t("material"), value: s.t(`materials.${d.material}`) },
    { label: s.t("length"), value: s.t(`lengths.${d.lengthCategory}`) },
    { label: s.t("size"), value: s.t("sizeValue", { ch: iso(s, String(d.sizeCh)), mm: iso(s, s.number(d.sizeMm)) }) },
    { label: s.t("balloon"), value: s.t("balloonValue", { ml: iso(s, String(d.balloonMl)) }) },
    { label: s.t("maker"), value: d.maker ? iso(s, [d.maker, d.productName].filter(Boolean).join(" · ")) : "—" },
    { label: s.t("lot"), value: d.lot ? iso(s, d.lot) : "—" },
    { label: s.t("expiry"), value: s.day(d.expiry) },
    { label: s.t("insertedOn"), value: s.moment(d.insertedAt) },
    {
      label: s.t("insertedBy"),
      value: iso(s, [d.insertedByName, d.organisationName].filter(Boolean).join(", ")),
    },
    { label: s.t("indication"), value: d.indication },
  ];
  return rows;
}

function phoneLine(s: PdfStrings, phone: string | null) {
  return phone ? iso(s, phone) : s.t("noPhone");
}

function DevicePage({ all, data }: { all: PdfStrings[]; data: PassportBookletData }) {
  const d = data.device;
  return (
    <Page size="A5" style={styles.page} wrap>
      <SectionTitle all={all} k={(s) => s.t("deviceTitle")} />
      {d ? (
        <>
          <View style={[styles.box, { marginBottom: 10 }, { backgroundColor: colour.brandSoft, borderColor: colour.brand }]} wrap={false}>
            <Columns all={all}>
              {(s) => (
                <View>
                  <T s={s} style={{ fontSize: 13, fontWeight: 700, color: colour.brand }}>
                    {s.t("datesTitle")}
                  </T>
                  <T s={s} style={styles.label}>
                    {s.t("nextChange")}
                  </T>
                  <T s={s} style={{ fontSize: 15, fontWeight: 700 }}>
                    {s.day(d.plannedChangeOn)}
                  </T>
                  <T s={s} style={styles.label}>
                    {s.t("reviewDue")}
                  </T>
                  <T s={s} style={{ fontSize: 15, fontWeight: 700 }}>
                    {s.day(d.reviewDueOn)}
                  </T>
                  <T s={s} style={{ fontSize: 8.5, marginTop: 4 }}>
                    {s.t("datesNote")}
                  </T>
                </View>
              )}
            </Columns>
          </View>
          <Columns all={all}>
            {(s) => (
              <View>
                {deviceFacts(s, d).map((f) => (
                  <Fact key={f.label} s={s} label={f.label} value={f.value} />
                ))}
              </View>
            )}
          </Columns>
        </>
      ) : (
        <Columns all={all}>{(s) => <T s={s} style={{ fontSize: 13 }}>{s.t("noDevice")}</T>}</Columns>
      )}

      <Footer all={all} />
    </Page>
  );
}

function HelpPage({ all, data }: { all: PdfStrings[]; data: PassportBookletData }) {
  const c = data.contacts;
  const team = c.careTeams.find((t) => t.phone) ?? null;
  const ooh = c.careTeams.find((t) => t.outOfHoursPhone)?.outOfHoursPhone ?? null;
  const bullet = (s: PdfStrings, text: string) => (
    <T key={text} s={s} style={{ fontSize: 10, marginBottom: 1.5 }}>
      {`•  ${text}`}
    </T>
  );
  return (
    <Page size="A5" style={styles.page} wrap>
      <SectionTitle all={all} k={(s) => s.t("helpTitle")} />
      <Columns all={all}>{(s) => <T s={s} style={{ fontWeight: 700 }}>{s.t("helpGeneral")}</T>}</Columns>
      <View style={[styles.section, styles.box, { borderWidth: 2.5, borderColor: colour.emergency }]} wrap={false}>
        <Columns all={all}>
          {(s) => (
            <View>
              <T s={s} style={{ fontSize: 13, fontWeight: 700, color: colour.emergency }}>
                {s.t("emergencyIntro", { number: iso(s, c.emergencyNumber) })}
              </T>
              {(["emergency1", "emergency2", "emergency3", "emergency4"] as const).map((k) => bullet(s, s.t(k)))}
            </View>
          )}
        </Columns>
      </View>
      <View style={[styles.section, styles.box, { borderWidth: 2, borderColor: colour.urgent }]} wrap={false}>
        <Columns all={all}>
          {(s) => (
            <View>
              <T s={s} style={{ fontSize: 12, fontWeight: 700, color: colour.urgent }}>
                {s.t("urgentIntro")}
              </T>
              {team ? (
                <T s={s} style={{ fontSize: 11, fontWeight: 700 }}>
                  {`${s.t("careTeam")}: ${iso(s, team.phone!)}`}
                </T>
              ) : null}
              {ooh ? (
                <T s={s} style={{ fontSize: 11, fontWeight: 700 }}>
                  {`${s.t("outOfHours")}: ${iso(s, ooh)}`}
                </T>
              ) : null}
              {(["urgent1", "urgent2", "urgent3", "urgent4", "urgent5"] as const).map((k) => bullet(s, s.t(k)))}
            </View>
          )}
        </Columns>
      </View>
      <View style={styles.section} wrap={false}>
        <Columns all={all}>{(s) => <T s={s} style={{ fontSize: 10.5 }}>{s.t("selfCare")}</T>}</Columns>
      </View>
      <Footer all={all} />
    </Page>
  );
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
  return parts.join(", ") || "—";
}

function ContactsAndHistoryPage({ all, data }: { all: PdfStrings[]; data: PassportBookletData }) {
  const first = all[0];
  const c = data.contacts;
  const rowDirection = first.rtl ? "row-reverse" : "row";
  const cell = { when: { width: "21%" }, what: { width: "28%" }, details: { width: "32%" }, by: { width: "19%" } } as const;
  const cellPad = { paddingHorizontal: 3 };
  return (
    <Page size="A5" style={styles.page} wrap>
      <View>
        <SectionTitle all={all} k={(s) => s.t("contactsTitle")} />
        <Columns all={all}>
          {(s) => (
            <View>
              <Fact s={s} label={s.t("emergency")} value={iso(s, c.emergencyNumber)} />
              {c.careTeams.map((team) => (
                <View key={team.name}>
                  <Fact s={s} label={`${s.t("careTeam")}: ${iso(s, team.name)}`} value={phoneLine(s, team.phone)} />
                  {team.outOfHoursPhone ? (
                    <Fact
                      s={s}
                      label={`${s.t("outOfHours")}${c.outOfHoursServiceName ? `: ${iso(s, c.outOfHoursServiceName)}` : ""}`}
                      value={iso(s, team.outOfHoursPhone)}
                    />
                  ) : null}
                </View>
              ))}
              {c.gp ? <Fact s={s} label={`${s.t("gp")}: ${iso(s, c.gp.name)}`} value={phoneLine(s, c.gp.phone)} /> : null}
            </View>
          )}
        </Columns>
      </View>
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
      <HelpPage all={all} data={data} />
      <ContactsAndHistoryPage all={all} data={data} />
    </Document>
  );
}
