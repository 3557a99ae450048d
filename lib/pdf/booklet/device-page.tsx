import "server-only";
// The catheter: the next dates the nurse set, then every fact of the device.
import { Page, View } from "@react-pdf/renderer";
import { palette as colour } from "../kit/palette";
import type { PdfStrings } from "../kit/strings";
import { Columns, DualLabel, FactTable, Footer, SectionTitle, styles, T, pageStyle } from "./parts";
import { deviceRows, plannedDates } from "./rows";
import type { PassportBookletData } from "./types";

export function DevicePage({ all, data }: { all: PdfStrings[]; data: PassportBookletData }) {
  const d = data.device;
  return (
    <Page size="A5" style={pageStyle(all)} wrap>
      <SectionTitle all={all} k={(s) => s.t("deviceTitle")} />
      {d ? (
        <>
          <View style={[styles.box, { backgroundColor: colour.brandSoft, borderColor: colour.brand, marginBottom: 6, paddingVertical: 5 }]} wrap={false}>
            <DualLabel all={all} k={(s) => s.t("datesTitle")} style={{ fontSize: 9, fontWeight: 700, color: colour.brand }} />
            <View style={{ flexDirection: all[0].rtl ? "row-reverse" : "row", gap: 12 }}>
              {plannedDates(d).map(([key, date]) => (
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
