import "server-only";
// The cover: the title in both languages, who it belongs to, the QR and its code, the allergies.
import { Image, Page, Text, View } from "@react-pdf/renderer";
import { palette as colour } from "../kit/palette";
import type { PdfStrings } from "../kit/strings";
import { AllergyBox, Columns, DualLabel, Footer, Mark, styles, T, pageStyle } from "./parts";
import { iso } from "./rows";
import type { PassportBookletData } from "./types";


export function Cover({ all, data }: { all: PdfStrings[]; data: PassportBookletData }) {
  const first = all[0];
  const p = data.patient;
  const row = first.rtl ? "row-reverse" : "row";
  return (
    <Page size="A5" style={pageStyle(all)}>
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

      {data.readerCopy ? null : (
        <View style={[styles.section, { flexDirection: row, gap: 12, alignItems: "center" }]} wrap={false}>
          <Image src={data.qrPngDataUrl} style={{ width: 118, height: 118 }} />
          <View style={{ flex: 1 }}>
            <DualLabel all={all} k={(s) => s.t("code")} />
            {/* Latin letters only, laid out left to right on the reading side: no direction marks, so no Arabic-script font (and its taller line) joins it. */}
            <Text style={{ direction: "ltr", textAlign: first.rtl ? "right" : "left", fontSize: 19, fontWeight: 700, letterSpacing: 1 }}>{data.shortCode}</Text>
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
      )}
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
