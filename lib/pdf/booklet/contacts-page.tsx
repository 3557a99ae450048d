import "server-only";
// Who to call, the discharge checklist, then the catheter's history, most recent first, over as many pages as it needs.
import { Page, View } from "@react-pdf/renderer";
import { palette as colour } from "../kit/palette";
import type { PdfStrings } from "../kit/strings";
import { Columns, FactTable, Footer, SectionTitle, styles, T, pageStyle } from "./parts";
import { checklistRows, contactRows, eventDetails, eventWhat, iso } from "./rows";
import type { PassportBookletData } from "./types";

export function ContactsAndHistoryPage({ all, data }: { all: PdfStrings[]; data: PassportBookletData }) {
  const first = all[0];
  const c = data.contacts;
  const rowDirection = first.rtl ? "row-reverse" : "row";
  const cell = { when: { width: "21%" }, what: { width: "28%" }, details: { width: "32%" }, by: { width: "19%" } } as const;
  const cellPad = { paddingHorizontal: 3 };
  return (
    <Page size="A5" style={pageStyle(all)} wrap>
      <SectionTitle all={all} k={(s) => s.t("contactsTitle")} />
      <FactTable all={all} rows={contactRows(all, c)} />
      {data.checklist ? (
        <View style={styles.section} wrap={false}>
          <SectionTitle all={all} k={(s) => s.t("checklist.title")} />
          <FactTable all={all} rows={checklistRows(all, data.checklist)} />
        </View>
      ) : null}
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
