// Plain words beyond Learn: the check-in's result, My catheter, Today and Get help make glossary
// words tappable with the one component (a button with aria-expanded, not a hover), in English
// Arabic and Urdu; axe finds nothing with a meaning open, and at 320 px and 200 % text nothing goes
// sideways and no word breaks inside itself.
import AxeBuilder from "@axe-core/playwright";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { demo } from "../support/http";
import { launch, newPage, signInAs } from "./support/browser";
import { brokenWords, closeDatabase, overflowProblems, PHONE, screenshotAtTextSize, setTextSize } from "./support/portal";

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
  await closeDatabase();
});

const ANSWERS: Record<string, string> = {
  newConfusion: "no", breathless: "no", feelsVeryUnwell: "no", shivering: "no", temperatureC: "not-taken", catheterOut: "no",
  draining: "yes", hoursWithoutUrine: "under-12", pain: "none", blood: "none",
};

/** A check-in that reports urine leaking around the catheter, through to its result. */
async function checkInWithLeak(page: Page, locale: string) {
  await page.goto(`/${locale}/check-in`);
  await page.waitForSelector("[data-question]");
  for (let i = 0; i < 14; i++) {
    if (await page.getByTestId("check-in-result").count()) return;
    const q = (await page.locator("[data-question]").getAttribute("data-question"))!;
    if (q === "other") {
      await page.locator('[data-question="other"] [data-answer="leaking"]').click();
      await page.locator('[data-question="other"] [data-answer="done"]').click();
    } else {
      const wanted = page.locator(`[data-question="${q}"] [data-answer="${ANSWERS[q]}"]`);
      await (await wanted.count() ? wanted : page.locator(`[data-question="${q}"] [data-answer]`).first()).click();
    }
    await page.waitForFunction((prev) => !!document.querySelector('[data-testid="check-in-result"]') || document.querySelector("[data-question]")?.getAttribute("data-question") !== prev, q);
  }
  await page.getByTestId("check-in-result").waitFor();
}

async function axeFindings(page: Page) {
  const result = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa", "wcag22aa", "best-practice"]).analyze();
  return result.violations.map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(" ")).slice(0, 3).join(", ")}`);
}

/** Opens the first glossary word in the container: its meaning shows, and aria-expanded says so. */
async function openTerm(page: Page, container: string) {
  const term = page.locator(`${container} button[data-term]`).first();
  await expect(term.getAttribute("aria-expanded")).resolves.toBe("false");
  await term.click();
  await expect(term.getAttribute("aria-expanded")).resolves.toBe("true");
  const meaning = page.locator(`#${await term.getAttribute("aria-controls")}`.replace(/:/g, "\\:"));
  expect(((await meaning.textContent()) ?? "").length).toBeGreaterThan(10);
  return term;
}

// Urdu: Arthur's pages read in Urdu (Nastaliq), as a patient who chose it would see them.
for (const [locale, who] of [["en", demo.patient], ["ar", demo.patientAr], ["ur", demo.patient]] as const) {
  describe(`${locale}: plain words on the portal pages`, () => {
    let page: Page;
    beforeAll(async () => {
      page = await newPage(browser, PHONE);
      await signInAs(page, who.email, who.password, locale);
    });
    afterAll(async () => {
      await page?.context().close();
    });

    it("the check-in result: a word to tap, its meaning shown and closed again, axe clean", async () => {
      await checkInWithLeak(page, locale);
      const term = await openTerm(page, '[data-testid="check-in-result"]');
      expect(await axeFindings(page)).toEqual([]);
      await screenshotAtTextSize(page, `glossary-check-in-${locale}-390`, 100);
      await term.click();
      await expect(term.getAttribute("aria-expanded")).resolves.toBe("false");
    });

    it("My catheter: Ch, balloon and the route are tappable; 320 px at 200 %: nothing sideways, nothing broken", async () => {
      await page.goto(`/${locale}/my-catheter`);
      expect(await page.locator("main button[data-term]").count()).toBeGreaterThanOrEqual(3);
      await openTerm(page, '[data-testid="size"]');
      expect(await axeFindings(page)).toEqual([]);
      await page.setViewportSize({ width: 320, height: 640 });
      await setTextSize(page, 200);
      expect(await overflowProblems(page)).toEqual([]);
      expect(await brokenWords(page)).toEqual([]);
      await screenshotAtTextSize(page, `glossary-my-catheter-${locale}-320-200`, 200);
      await setTextSize(page, 100);
      await page.setViewportSize(PHONE.viewport);
    });

    it("Today: the bag words are tappable; Get help uses the same component", async () => {
      await page.goto(`/${locale}/today`);
      expect(await page.locator("main button[data-term]").count()).toBeGreaterThanOrEqual(1);
      expect(await axeFindings(page)).toEqual([]);
      await page.goto(`/${locale}/help`);
      expect(await axeFindings(page)).toEqual([]);
    });
  });
}
