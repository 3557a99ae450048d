import "server-only";
// PDFs made on the server with @react-pdf/renderer (kept out of the bundle by
// serverExternalPackages in next.config.ts).
import { Font, renderToBuffer } from "@react-pdf/renderer";
import { registerPdfFonts } from "./kit/fonts";
import { PassportBooklet, type PassportBookletData } from "./booklet";

export type { PassportBookletData } from "./booklet";

/** The passport booklet as PDF bytes. */
export async function renderPassportPdf(data: PassportBookletData): Promise<Buffer> {
  registerPdfFonts(Font);
  return renderToBuffer(<PassportBooklet data={data} />);
}
