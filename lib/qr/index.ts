import "server-only";
// QR codes for the passport: SVG markup for pages, a PNG data URL for the PDF booklet.
// Error correction M (15 %) survives a folded or slightly worn paper card.
import QRCode from "qrcode";

const options = { errorCorrectionLevel: "M" as const, margin: 2 };

/** Standalone SVG markup (dark modules on white). */
export async function qrSvg(text: string): Promise<string> {
  return QRCode.toString(text, { ...options, type: "svg", color: { dark: "#1c1f21", light: "#ffffff" } });
}

/** The same SVG as a data: URL, for an <img> (no markup is injected into the page). */
export async function qrSvgDataUrl(text: string): Promise<string> {
  const svg = await qrSvg(text);
  return `data:image/svg+xml;base64,${Buffer.from(svg).toString("base64")}`;
}

/** A PNG data URL for @react-pdf's <Image>; `scale` pixels per module. */
export async function qrPngDataUrl(text: string, scale = 10): Promise<string> {
  return QRCode.toDataURL(text, { ...options, type: "image/png", scale, color: { dark: "#000000", light: "#ffffff" } });
}
