import "server-only";
// The one-time copy only: the portal activation code, printed once.
import { Page, Text, View } from "@react-pdf/renderer";
import { palette as colour } from "../kit/palette";
import type { PdfStrings } from "../kit/strings";
import { Columns, DualLabel, Footer, styles, T, pageStyle } from "./parts";
import type { PassportBookletData } from "./types";

export /** The patient's way into the portal: the code once, big, with where to type it and until when. */
function PortalPage({ all, activation }: { all: PdfStrings[]; activation: NonNullable<PassportBookletData["portalActivation"]> }) {
  return (
    <Page size="A5" style={pageStyle(all)}>
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
