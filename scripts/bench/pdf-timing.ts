/**
 * Times the passport booklet PDF on its own (no HTTP, no storage, no transaction): the record
 * read once, then renderPassportPdf `runs` times. Loaded by pdf-child.mjs through Vite's module
 * runner, which resolves "@/" and "server-only" as the tests do.
 */
import { getBookletRecord } from "@/db/queries/passports";
import { bookletData, generateShortCode, formatShortCode, generateToken, passportUrl } from "@/lib/passport";
import { renderPassportPdf } from "@/lib/pdf";
import { qrPngDataUrl } from "@/lib/qr";

export async function timePassportPdf(patientId: string, runs: number) {
  const record = await getBookletRecord({ patientId: patientId! });
  if (!record) throw new Error(`no patient ${patientId}`);
  const url = passportUrl(generateToken());
  const data = bookletData({
    record,
    url,
    shortCode: formatShortCode(generateShortCode()),
    qrPngDataUrl: await qrPngDataUrl(url),
    issuedAt: new Date(),
    issuedByName: "Bench Nurse",
  });
  await renderPassportPdf(data); // warm: fonts registered, modules loaded
  const times: number[] = [];
  let bytes = 0;
  for (let i = 0; i < runs; i++) {
    const t = performance.now();
    bytes = (await renderPassportPdf(data)).byteLength;
    times.push(performance.now() - t);
  }
  return { times, bytes, history: data.history.length };
}
