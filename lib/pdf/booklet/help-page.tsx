import "server-only";
// When to get help, in one language a page: the emergency number first, then the care team.
import { Page, View } from "@react-pdf/renderer";
import { palette as colour } from "../kit/palette";
import type { PdfStrings } from "../kit/strings";
import { Footer, styles, T, pageStyle } from "./parts";
import { iso } from "./rows";
import type { PassportBookletData } from "./types";

export /** One page per language, facing each other in the folded booklet: room for big type. */
function HelpPage({ s, all, data }: { s: PdfStrings; all: PdfStrings[]; data: PassportBookletData }) {
  const c = data.contacts;
  // The reader's own text size and contrast on the portal copy (lib/validations/reading).
  const z = (size: number) => size * (data.readerCopy?.textScale ?? 1);
  const strong = data.readerCopy?.highContrast ?? false;
  const ink = strong ? { color: "#000000" } : {};
  const border = (width: number) => (strong ? width + 1 : width);
  const team = c.careTeams.find((t) => t.phone) ?? null;
  const ooh = c.careTeams.find((t) => t.outOfHoursPhone)?.outOfHoursPhone ?? null;
  const bullet = (text: string) => (
    <T key={text} s={s} style={{ fontSize: z(11), marginBottom: 1.5, ...ink }}>
      {`•  ${text}`}
    </T>
  );
  return (
    <Page size="A5" style={pageStyle(all)} wrap>
      <View style={{ marginBottom: 6, borderBottomWidth: border(1.5), borderBottomColor: colour.brand, paddingBottom: 3 }}>
        <T s={s} style={[styles.h2, { fontSize: z(16) }]}>
          {s.t("helpTitle")}
        </T>
      </View>
      <T s={s} style={{ fontWeight: 700, fontSize: z(11.5), ...ink }}>
        {s.t("helpGeneral")}
      </T>
      <View style={[styles.section, styles.box, { borderWidth: border(2.5), borderColor: colour.tone.stop.strong }]} wrap={false}>
        <T s={s} style={{ fontSize: z(14), fontWeight: 700, color: colour.tone.stop.strong }}>
          {s.t("emergencyIntro", { number: iso(s, c.emergencyNumber) })}
        </T>
        {(["emergency1", "emergency2", "emergency3", "emergency4"] as const).map((k) => bullet(s.t(k)))}
      </View>
      <View style={[styles.section, styles.box, { borderWidth: border(2), borderColor: colour.tone.warn.strong }]} wrap={false}>
        <T s={s} style={{ fontSize: z(13), fontWeight: 700, color: colour.tone.warn.strong }}>
          {s.t("urgentIntro")}
        </T>
        {team ? (
          <T s={s} style={{ fontSize: z(12), fontWeight: 700, ...ink }}>
            {`${s.t("careTeam")}: ${iso(s, team.phone!)}`}
          </T>
        ) : null}
        {ooh ? (
          <T s={s} style={{ fontSize: z(12), fontWeight: 700, ...ink }}>
            {`${s.t("outOfHours")}: ${iso(s, ooh)}`}
          </T>
        ) : null}
        {(["urgent1", "urgent2", "urgent3", "urgent4", "urgent5"] as const).map((k) => bullet(s.t(k)))}
      </View>
      <View style={styles.section} wrap={false}>
        <T s={s} style={{ fontSize: z(11), ...ink }}>
          {s.t("selfCare")}
        </T>
      </View>
      <Footer all={all} />
    </Page>
  );
}
