/**
 * Renders the app icons from the Caddis mark (public/icon.svg) with Debian's Chromium:
 * icon-192.png, icon-512.png, and icon-maskable-512.png (the mark inside the 80 % safe zone on a
 * full-bleed background). Run: npx tsx scripts/render-icons.ts — and commit the PNGs.
 */
import fs from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { chromium } from "playwright-core";
import { chromiumArgs } from "../tests/e2e/support/browser";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const svg = fs.readFileSync(path.join(root, "public/icon.svg"), "utf8");
const inner = svg.replace(/^<svg[^>]*>/, "").replace(/<\/svg>\s*$/, "");

async function main() {
  const browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium", args: chromiumArgs });
  const page = await browser.newPage();
  const jobs = [
    { file: "icon-192.png", size: 192, body: svg },
    { file: "icon-512.png", size: 512, body: svg },
    // Maskable: launchers crop to a circle or squircle; keep the mark within the central 80 %.
    { file: "icon-maskable-512.png", size: 512, body: `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 32 32"><rect width="32" height="32" fill="#faf7f0"/><g transform="translate(6.4 6.4) scale(0.6)">${inner}</g></svg>` },
  ];
  for (const j of jobs) {
    await page.setViewportSize({ width: j.size, height: j.size });
    const sized = j.body.replace("<svg ", `<svg width="${j.size}" height="${j.size}" `);
    await page.setContent(`<html><body style="margin:0;background:transparent">${sized}</body></html>`);
    await page.screenshot({ path: path.join(root, "public", j.file), omitBackground: true, clip: { x: 0, y: 0, width: j.size, height: j.size } });
    console.log(`[icons] public/${j.file}`);
  }
  await browser.close();
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
