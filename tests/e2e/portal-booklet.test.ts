// The booklet from the portal, as a patient with the largest text step (200 %) and strong
// contrast: My catheter offers it on a 390 × 844 phone without anything sideways, axe finds
// nothing, and the downloaded PDF's help pages are in twice the printed type (more pages).
import { execFileSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import AxeBuilder from "@axe-core/playwright";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { demo } from "../support/http";
import { launch, newPage, signInAs } from "./support/browser";
import { brokenWords, closeDatabase, overflowProblems, PHONE, screenshotAtTextSize } from "./support/portal";

let browser: Browser;
const dir = fs.mkdtempSync(path.join(os.tmpdir(), "caddis-e2e-booklet-"));
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
  await closeDatabase();
  fs.rmSync(dir, { recursive: true, force: true });
});

async function setComfort(page: Page, textSize: number, contrast: "standard" | "high") {
  const res = await page.request.put("/api/account/reading", { data: { textSize, contrast }, headers: { origin: new URL(page.url()).origin } });
  expect(res.status()).toBe(200);
}

async function downloadBooklet(page: Page, name: string) {
  const [download] = await Promise.all([page.waitForEvent("download"), page.getByTestId("booklet-download").click()]);
  const file = path.join(dir, `${name}.pdf`);
  await download.saveAs(file);
  expect(fs.readFileSync(file).subarray(0, 5).toString()).toBe("%PDF-");
  return Number(/Pages:\s+(\d+)/.exec(execFileSync("pdfinfo", [file], { encoding: "utf8" }))![1]);
}

for (const [locale, who] of [["en", demo.patient], ["ar", demo.patientAr]] as const) {
  describe(`${locale}: the booklet from My catheter at the largest text`, () => {
    let page: Page;
    beforeAll(async () => {
      page = await newPage(browser, PHONE);
      await signInAs(page, who.email, who.password, locale);
    });
    afterAll(async () => {
      await setComfort(page, 0, "standard").catch(() => {});
      await page?.context().close();
    });

    it("is offered without anything sideways, axe finds nothing, and the PDF follows the person's text size", async () => {
      await page.goto(`/${locale}/my-catheter`);
      const printed = await downloadBooklet(page, `${locale}-printed-size`);
      // The person's own largest step (200 %, kept with their account), on the phone's own size.
      await setComfort(page, 3, "high");
      await page.goto(`/${locale}/my-catheter`);
      await page.getByTestId("booklet-download").scrollIntoViewIfNeeded();
      expect(await overflowProblems(page)).toEqual([]);
      expect(await brokenWords(page)).toEqual([]);
      const axe = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa", "wcag22aa", "best-practice"]).analyze();
      expect(axe.violations.map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(" ")).slice(0, 3).join(", ")}`)).toEqual([]);
      const large = await downloadBooklet(page, `${locale}-large`);
      expect(large).toBeGreaterThan(printed);
      await screenshotAtTextSize(page, `portal-booklet-${locale}-390-step3`, 100);
    });
  });
}
