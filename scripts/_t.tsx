import "./server-only-shim.cjs";
import fs from "node:fs";
import { renderContentPdf } from "@/lib/pdf/gp-summary";
async function main() {
  const buf = await renderContentPdf({ locale: process.argv[2] ?? "en", subject: "S", title: "Title", intro: "Intro", blocks: [{ type: "paragraph", text: "Hello مرحبا Łódź" }], footer: ["f1"] }, { kind: "x", generatedAt: new Date() });
  fs.writeFileSync("/tmp/t.pdf", buf);
}
main();
