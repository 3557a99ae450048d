import "server-only";
// The booklet's building blocks: its styles, text in either direction (kit/rtl), columns side by
// side per language, labels in every language, the fact table, section titles, the footer.
import { Path, Rect, StyleSheet, Svg, Text, View } from "@react-pdf/renderer";
import type { ReactNode } from "react";
import { PDF_FONT_FAMILY, pdfFontFamily } from "../kit/fonts";
import { palette as colour } from "../kit/palette";
import { direction, pdfText, withoutMarks } from "../kit/rtl";
import type { PdfStrings } from "../kit/strings";
import { allergyList, iso, notRecordedLine, type FactRow } from "./rows";
import type { PassportBookletData } from "./types";

export const styles = StyleSheet.create({
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

// Latin and Latin Extended glyphs come from two subset files, so "każdej" is two font runs, and
// react-pdf offers a hyphenation break between runs. The line breaker's infinity forbids it.
const NO_BREAK = 10000;

const dir = (s: PdfStrings) => direction(s.rtl);

export function T({ s, style, children }: { s: PdfStrings; style?: object | object[]; children: ReactNode }) {
  const extra = Array.isArray(style) ? style : style ? [style] : [];
  return (
    <Text
      hyphenationPenalty={NO_BREAK}
      // Arabic script is taller: more leading, one step larger, as on screen. Nastaliq's words
      // climb from left to right: react-pdf sets the baseline 1.6 em (the PDF font's ascent) below
      // the line's top and the tails reach 0.6 em under it, so an Urdu line is 2.2.
      style={[dir(s), { lineHeight: 1.35 }, ...extra, ...(s.rtl ? [{ fontSize: bigger(extra), lineHeight: s.locale === "ur" ? 2.2 : 1.5 }] : []), ...urdu(s)]}
    >
      {typeof children === "string" ? pdfText(children, s.rtl) : children}
    </Text>
  );
}

/** Urdu text in its own font stack (Nastaliq); other languages keep the page's. */
function urdu(s: PdfStrings) {
  return s.locale === "ur" ? [{ fontFamily: pdfFontFamily(s.locale) as unknown as string }] : [];
}

/** A booklet page in the first language's font stack; an Urdu footer line needs more room at the foot. */
export function pageStyle(all: PdfStrings[]) {
  return [styles.page, { fontFamily: pdfFontFamily(all[0].locale) as unknown as string }, ...(all.some((s) => s.locale === "ur") ? [{ paddingBottom: 64 }] : [])];
}

function bigger(styleList: object[]): number {
  const size = styleList.reduce<number>((acc, st) => ((st as { fontSize?: number }).fontSize ?? acc), 11);
  return Math.round(size * 1.1 * 10) / 10;
}

/** Side by side, one column per language; the patient's language on the start side. */
export function Columns({ all, children }: { all: PdfStrings[]; children: (s: PdfStrings) => ReactNode }) {
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
export function DualLabel({ all, k, style }: { all: PdfStrings[]; k: (s: PdfStrings) => string; style?: object }) {
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

export function Mark() {
  return (
    <Svg viewBox="0 0 32 32" style={{ width: 22, height: 22 }}>
      <Rect x="9" y="3" width="14" height="26" rx="7" fill={colour.brand} />
      <Rect x="12" y="6" width="8" height="20" rx="4" fill="#faf7f0" />
      <Path d="M12 11h8M12 16h8M12 21h8" stroke={colour.brand} strokeWidth={2} />
    </Svg>
  );
}

export function Footer({ all }: { all: PdfStrings[] }) {
  const first = all[0];
  // A translated language says whether a medical translator reviewed it; English (the source)
  // carries the caution only while a language beside it is not reviewed.
  const unreviewed = all.some((s) => s.locale !== "en" && !s.review);
  const lines = all.flatMap((s) =>
    s.review ? [{ s, text: s.t("translationReviewed", { date: s.day(s.review.reviewedOn) }) }] : s.locale !== "en" || unreviewed ? [{ s, text: s.t("translationNote") }] : [],
  );
  return (
    <View style={styles.footer} fixed>
      {lines.map(({ s, text }) => (
        <T key={s.locale} s={s} style={{ fontSize: 7.5, color: colour.inkSoft, lineHeight: 1.3 }}>
          {text}
        </T>
      ))}
      <Text
        style={[dir(first), { fontSize: 7.5, color: colour.inkSoft }, ...urdu(first)]}
        render={({ pageNumber, totalPages }) => {
          return pdfText(first.t("page", { page: iso(first, String(pageNumber)), total: iso(first, String(totalPages)) }), first.rtl);
        }}
      />
    </View>
  );
}

export function AllergyBox({ all, data }: { all: PdfStrings[]; data: PassportBookletData }) {
  const any = allergyList(all[0], data.patient.allergies).length > 0 || notRecordedLine(all[0], data.patient.allergies) !== null;
  return (
    <View
      wrap={false}
      style={[
        styles.box,
        any ? { borderWidth: 2.5, borderColor: colour.tone.stop.strong, backgroundColor: colour.tone.stop.soft } : { borderColor: colour.line },
      ]}
    >
      <Columns all={all}>
        {(s) => {
          const items = allergyList(s, data.patient.allergies);
          const unknown = notRecordedLine(s, data.patient.allergies);
          return (
            <View>
              <T s={s} style={{ fontSize: 11, fontWeight: 700, color: any ? colour.tone.stop.strong : colour.ink }}>
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

/** Label and value rows, each label in every language beside its value. */
export function FactTable({ all, rows }: { all: PdfStrings[]; rows: FactRow[] }) {
  const first = all[0];
  const row = first.rtl ? "row-reverse" : "row";
  return (
    <View>
      {rows.map((r, index) => {
        const strip = withoutMarks;
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

export function SectionTitle({ all, k }: { all: PdfStrings[]; k: (s: PdfStrings) => string }) {
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
