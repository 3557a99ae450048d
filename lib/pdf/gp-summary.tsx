import "server-only";
// The GP summary as a PDF (A4), drawn from the same content model as the e-mail so the two
// always agree. Same toolkit and fonts as the passport booklet.
import { Document, Page, renderToBuffer, StyleSheet, Text, View } from "@react-pdf/renderer";
import type { Block, EmailContent } from "@/lib/email/render";
import { emailDates, emailTranslator } from "@/lib/email/i18n";
import { directionOf } from "@/lib/i18n/routing";
import { PDF_FONT_FAMILY, registerPdfFonts } from "./fonts";

const c = {
  brand: "#0b5563",
  ink: "#1c1f21",
  soft: "#4f565b",
  line: "#d9d3c6",
  sunk: "#f1ece1",
  stop: ["#a4231b", "#fbe6e3"],
  warn: ["#8a4b00", "#fdf0d9"],
  info: ["#1f4e99", "#e3ecfa"],
} as const;

function styles(rtl: boolean) {
  const align = rtl ? "right" : "left";
  const family = rtl ? ["CaddisArabic", ...PDF_FONT_FAMILY.filter((f) => f !== "CaddisArabic")] : PDF_FONT_FAMILY;
  return StyleSheet.create({
    page: { paddingTop: 36, paddingBottom: 54, paddingHorizontal: 40, fontFamily: family, fontSize: 10.5, color: c.ink },
    brand: { fontSize: 14, fontWeight: 700, color: c.brand, textAlign: align, marginBottom: 6 },
    title: { fontSize: 18, fontWeight: 700, marginBottom: 6, textAlign: align },
    intro: { lineHeight: 1.45, marginBottom: 8, textAlign: align },
    heading: { fontSize: 12.5, fontWeight: 700, color: c.brand, marginTop: 10, marginBottom: 4, textAlign: align },
    row: { flexDirection: rtl ? "row-reverse" : "row", borderBottomWidth: 0.75, borderBottomColor: c.line, paddingVertical: 3 },
    label: { lineHeight: 1.45, width: "38%", fontWeight: 700, color: c.soft, textAlign: align, paddingHorizontal: 3 },
    value: { lineHeight: 1.45, width: "62%", textAlign: align, paddingHorizontal: 3 },
    para: { lineHeight: 1.45, marginBottom: 5, textAlign: align },
    item: { lineHeight: 1.45, marginBottom: 2, textAlign: align },
    cellHead: { lineHeight: 1.45, flex: 1, fontWeight: 700, backgroundColor: c.sunk, padding: 3, textAlign: align },
    cell: { lineHeight: 1.45, flex: 1, padding: 3, textAlign: align },
    // No lineHeight on the page: inherited, it hides the text this one draws with `render` (@react-pdf 4.9).
    footer: { position: "absolute", bottom: 20, left: 40, right: 40, fontSize: 8.5, color: c.soft, textAlign: align },
    small: { lineHeight: 1.45, fontSize: 8.5, color: c.soft, marginTop: 2, textAlign: align },
  });
}

function BlockView({ block, s, rtl }: { block: Block; s: ReturnType<typeof styles>; rtl: boolean }) {
  switch (block.type) {
    case "heading":
      // Never the last line of a page without what it heads.
      return (
        <Text style={s.heading} minPresenceAhead={48}>
          {block.text}
        </Text>
      );
    case "paragraph":
      return <Text style={s.para}>{block.text}</Text>;
    case "facts":
      return (
        <View>
          {block.rows.map((r, i) => (
            <View key={i} style={s.row} wrap={false}>
              <Text style={s.label}>{r.label}</Text>
              <Text style={s.value}>{r.value}</Text>
            </View>
          ))}
        </View>
      );
    case "list":
      return (
        <View>
          {block.items.map((item, i) => (
            <Text key={i} style={s.item}>
              {rtl ? `${item} •` : `• ${item}`}
            </Text>
          ))}
        </View>
      );
    case "notice": {
      const [strong, soft] = c[block.tone];
      return (
        <View
          wrap={false}
          style={{
            backgroundColor: soft,
            padding: 6,
            marginBottom: 5,
            ...(rtl ? { borderRightWidth: 4, borderRightColor: strong } : { borderLeftWidth: 4, borderLeftColor: strong }),
          }}
        >
          <Text style={{ textAlign: rtl ? "right" : "left", lineHeight: 1.45 }}>
            <Text style={{ fontWeight: 700, color: strong }}>{block.label}</Text> {block.text}
          </Text>
        </View>
      );
    }
    case "table":
      return (
        <View>
          <View style={s.row}>
            {block.head.map((h, i) => (
              <Text key={i} style={s.cellHead}>
                {h}
              </Text>
            ))}
          </View>
          {block.rows.map((row, i) => (
            <View key={i} style={s.row} wrap={false}>
              {row.map((v, j) => (
                <Text key={j} style={s.cell}>
                  {v}
                </Text>
              ))}
            </View>
          ))}
        </View>
      );
    case "action":
      return null;
  }
}

export async function renderContentPdf(content: EmailContent, meta: { kind: string; generatedAt: Date }): Promise<Buffer> {
  registerPdfFonts();
  const rtl = directionOf(content.locale) === "rtl";
  const s = styles(rtl);
  const t = emailTranslator(content.locale);
  const d = emailDates(content.locale);
  const doc = (
    <Document title={content.title} author="Caddis" subject={content.subject} creator="Caddis" producer="Caddis" language={content.locale}>
      <Page size="A4" style={s.page}>
        <Text
          style={s.footer}
          fixed
          render={({ pageNumber, totalPages }) =>
            `${t("pdf.generated", { date: d.at(meta.generatedAt) })} · ${t("pdf.page", { page: pageNumber, pages: totalPages })}`
          }
        />
        <Text style={s.brand}>{t("pdf.brand")}</Text>
        <Text style={s.title}>{content.title}</Text>
        {content.intro ? <Text style={s.intro}>{content.intro}</Text> : null}
        {content.blocks.map((b, i) => (
          <BlockView key={i} block={b} s={s} rtl={rtl} />
        ))}
        <View style={{ marginTop: 12 }}>
          {content.footer.map((f, i) => (
            <Text key={i} style={s.small}>
              {f}
            </Text>
          ))}
        </View>
      </Page>
    </Document>
  );
  return renderToBuffer(doc);
}
