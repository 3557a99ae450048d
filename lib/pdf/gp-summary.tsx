import "server-only";
// The GP summary as a PDF (A4), drawn from the same content model as the e-mail so the two
// always agree. Same toolkit and fonts as the passport booklet.
// @react-pdf/renderer is imported dynamically: scripts/worker.ts runs under tsx as CommonJS,
// where a static import fails (@react-pdf's packages export their files for `import` only).
import type { Styles } from "@react-pdf/renderer";
import type { Block, EmailContent } from "@/lib/email/render";
import { emailDates, emailTranslator } from "@/lib/email/i18n";
import { directionOf } from "@/lib/i18n/routing";
import { PDF_FONT_FAMILY, pdfFontFamily, registerPdfFonts } from "./kit/fonts";
import { palette } from "./kit/palette";
import { direction as textDirection, pdfText } from "./kit/rtl";

type Pdf = typeof import("@react-pdf/renderer");

const cleaner = (rtl: boolean) => (text: string) => pdfText(text, rtl);

function plainBlock(b: Block, plain: (text: string) => string): Block {
  switch (b.type) {
    case "heading":
    case "paragraph":
      return { ...b, text: plain(b.text) };
    case "facts":
      return { ...b, rows: b.rows.map((r) => ({ label: plain(r.label), value: plain(r.value) })) };
    case "list":
      return { ...b, items: b.items.map(plain) };
    case "notice":
      return { ...b, label: plain(b.label), text: plain(b.text) };
    case "table":
      return { ...b, head: b.head.map(plain), rows: b.rows.map((r) => r.map(plain)) };
    case "action":
      return b;
  }
}

const c = palette;

function styles(locale: string, rtl: boolean) {
  const align = rtl ? ("right" as const) : ("left" as const);
  const stack = pdfFontFamily(locale);
  const family = rtl ? [stack[stack.length - 1], ...stack.slice(0, -1)] : PDF_FONT_FAMILY;
  // The paragraph direction, set on every text (it is not inherited): a line mixing Arabic with a
  // Latin name then reads from the right.
  const direction = rtl ? ("rtl" as const) : ("ltr" as const);
  // Nastaliq's words climb from left to right: Urdu needs more leading.
  const lh = locale === "ur" ? 2.2 : 1.45;
  return {
    page: { paddingTop: 36, paddingBottom: 54, paddingHorizontal: 40, fontFamily: family, fontSize: 10.5, color: c.ink },
    brand: { direction, fontSize: 14, fontWeight: 700, color: c.brand, textAlign: align, marginBottom: 6 },
    title: { direction, fontSize: 18, fontWeight: 700, marginBottom: 6, textAlign: align },
    intro: { direction, lineHeight: lh, marginBottom: 8, textAlign: align },
    heading: { direction, fontSize: 12.5, fontWeight: 700, color: c.brand, marginTop: 10, marginBottom: 4, textAlign: align },
    row: { flexDirection: rtl ? "row-reverse" : "row", borderBottomWidth: 0.75, borderBottomColor: c.faint, paddingVertical: 3 },
    label: { direction, lineHeight: lh, width: "38%", fontWeight: 700, color: c.inkSoft, textAlign: align, paddingHorizontal: 3 },
    value: { direction, lineHeight: lh, width: "62%", textAlign: align, paddingHorizontal: 3 },
    para: { direction, lineHeight: lh, marginBottom: 5, textAlign: align },
    item: { direction, lineHeight: lh, marginBottom: 2, textAlign: align },
    cellHead: { direction, lineHeight: lh, flex: 1, fontWeight: 700, backgroundColor: c.sunk, padding: 3, textAlign: align },
    cell: { direction, lineHeight: lh, flex: 1, padding: 3, textAlign: align },
    // No lineHeight on the page: inherited, it hides the text this one draws with `render` (@react-pdf 4.9).
    footer: { direction, position: "absolute", bottom: 20, left: 40, right: 40, fontSize: 8.5, color: c.inkSoft, textAlign: align },
    small: { direction, lineHeight: lh, fontSize: 8.5, color: c.inkSoft, marginTop: 2, textAlign: align },
  } satisfies Styles;
}

function BlockView({ pdf, block, s, rtl }: { pdf: Pdf; block: Block; s: ReturnType<typeof styles>; rtl: boolean }) {
  const { Text, View } = pdf;
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
      const { strong, soft } = c.tone[block.tone];
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
          <Text style={{ ...textDirection(rtl), lineHeight: 1.45 }}>
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

export async function renderContentPdf(raw: EmailContent, meta: { generatedAt: Date; region: string | null }): Promise<Buffer> {
  const plain = cleaner(directionOf(raw.locale) === "rtl");
  const content: EmailContent = {
    ...raw,
    title: plain(raw.title),
    intro: raw.intro ? plain(raw.intro) : raw.intro,
    blocks: raw.blocks.map((b) => plainBlock(b, plain)),
    footer: raw.footer.map(plain),
  };
  const pdf: Pdf = await import("@react-pdf/renderer");
  const { Document, Page, Text, View } = pdf;
  registerPdfFonts(pdf.Font);
  const rtl = directionOf(content.locale) === "rtl";
  const s = styles(content.locale, rtl);
  const t = emailTranslator(content.locale);
  const d = emailDates(content.locale, meta.region);
  const doc = (
    <Document title={content.title} author="Caddis" subject={content.subject} creator="Caddis" producer="Caddis" language={content.locale}>
      <Page size="A4" style={s.page}>
        <Text
          style={s.footer}
          fixed
          render={({ pageNumber, totalPages }) =>
            plain(`${t("pdf.generated", { date: d.at(meta.generatedAt) })} · ${t("pdf.page", { page: pageNumber, pages: totalPages })}`)
          }
        />
        <Text style={s.brand}>{plain(t("pdf.brand"))}</Text>
        <Text style={s.title}>{content.title}</Text>
        {content.intro ? <Text style={s.intro}>{content.intro}</Text> : null}
        {content.blocks.map((b, i) => (
          <BlockView key={i} pdf={pdf} block={b} s={s} rtl={rtl} />
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
  return pdf.renderToBuffer(doc);
}
