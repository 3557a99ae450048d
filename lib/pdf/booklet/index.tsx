import "server-only";
// The passport booklet: A5 pages (two to an A4 sheet, folded), big type, the QR on the cover,
// the patient's language and English side by side. Every word comes from the PassportPdf
// catalogue namespace; rows are built in rows.ts, laid out by parts.tsx, one file a page.
import { Document } from "@react-pdf/renderer";
import { pdfStrings } from "../kit/strings";
import { ContactsAndHistoryPage } from "./contacts-page";
import { Cover } from "./cover";
import { DevicePage } from "./device-page";
import { HelpPage } from "./help-page";
import { PortalPage } from "./portal-page";
import type { TranslationReview } from "@/lib/validations/settings";
import type { PassportBookletData } from "./types";

export type { PassportBookletData } from "./types";

export function PassportBooklet({ data }: { data: PassportBookletData }) {
  const all = data.locales.map((l) => pdfStrings(l, data.region, (data.translationReviews as Record<string, TranslationReview | undefined>)[l] ?? null));
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
