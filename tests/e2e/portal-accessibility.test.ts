// Every portal page on a 390 × 844 phone, in English and Arabic: axe-core finds no serious or
// critical WCAG 2.2 AA violation; every button, link and field is at least 44 × 44 px; at 200 %
// text size nothing scrolls sideways or is cut off; a screenshot of each is saved to look at.
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { LEARN_PAGES } from "@/lib/shared/learn";
import { demo } from "../support/http";
import { launch, screenshot, signInAs } from "./support/browser";
import { closeDatabase, overflowProblems, patientIdByHrn, phonePage, runCheckIn, screenshotAtTextSize, seriousViolations, setTextSize, smallTargets } from "./support/portal";

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
  await closeDatabase();
});

const portalPages = ["/today", "/check-in", "/diary", "/my-catheter", "/help", "/people", "/more", "/learn", ...LEARN_PAGES.map((p) => `/learn/${p.slug}`)];
const publicPages = ["/activate", "/carer-invite/not-a-real-invitation-token-000000000000", "/offline"];

const shotName = (path: string, locale: string, suffix = "") => `portal${path.replace(/\//g, "-").replace(/-not-a-real.*/, "-invalid")}-${locale}${suffix}`;

/** A week of drinks and bag emptyings, so the diary's chart and table have something to show. */
async function fillDiary(page: Page, patientId: string) {
  const origin = new URL(page.url()).origin;
  const now = Date.now();
  for (let day = 6; day >= 0; day--) {
    for (const [hoursAgo, kind, volumeMl] of [[2, "in", 250], [4, "out", 350], [6, "in", 330], [9, "out", 500], [11, "in", 500]] as const) {
      const at = new Date(now - day * 86_400_000 - hoursAgo * 3_600_000);
      if (now - at.getTime() > 6.9 * 86_400_000) continue;
      const res = await page.request.post("/api/diary", { data: { patientId, kind, volumeMl: volumeMl - day * 10, at: at.toISOString() }, headers: { origin } });
      expect(res.status()).toBe(201);
    }
  }
}

async function settle(page: Page, path: string) {
  if (path === "/diary") await page.waitForSelector('[data-testid="today-in"]');
  if (path === "/check-in") await page.waitForSelector("[data-question]");
  await page.evaluate(() => document.fonts.ready.then(() => undefined));
}

for (const locale of ["en", "ar"] as const) {
  describe(`portal pages in ${locale}`, () => {
    let page: Page;
    beforeAll(async () => {
      page = await phonePage(browser);
      const who = locale === "en" ? demo.patient : demo.patientAr;
      await signInAs(page, who.email, who.password, locale);
      await fillDiary(page, await patientIdByHrn(locale === "en" ? "EM-100-001" : "EM-100-003"));
    });
    afterAll(async () => {
      await page?.context().close();
    });

    for (const path of [...portalPages, ...publicPages]) {
      it(`${path}: no serious axe violation, targets ≥ 44 px, screenshot`, async () => {
        const res = await page.goto(`/${locale}${path}`);
        expect(res?.status(), path).toBe(200);
        await settle(page, path);
        expect(await page.locator("html").getAttribute("dir")).toBe(locale === "ar" ? "rtl" : "ltr");
        expect(await seriousViolations(page), `${locale}${path}`).toEqual([]);
        expect(await smallTargets(page), `${locale}${path}`).toEqual([]);
        await screenshot(page, shotName(path, locale));
      });
    }

    it("a check-in result: no serious axe violation, targets ≥ 44 px", async () => {
      await runCheckIn(page, ["no", "no", "yes"], locale);
      expect(await seriousViolations(page)).toEqual([]);
      expect(await smallTargets(page)).toEqual([]);
    });

    it("every Learn page carries the safety notice with both numbers; translations carry the review mark", async () => {
      for (const p of LEARN_PAGES) {
        await page.goto(`/${locale}/learn/${p.slug}`);
        const notice = page.getByTestId("safety-notice");
        expect(await notice.count(), p.slug).toBe(1);
        expect(await notice.locator('a[href="tel:999"]').count()).toBe(1);
        expect(await notice.locator('a[href^="tel:01632"]').count()).toBeGreaterThan(0);
        expect(await page.getByTestId("translation-note").count()).toBe(locale === "en" ? 0 : 1);
      }
    });
  });

  describe(`portal pages in ${locale} at 200 % text size`, () => {
    let page: Page;
    beforeAll(async () => {
      page = await phonePage(browser);
      const who = locale === "en" ? demo.patient : demo.patientAr;
      await signInAs(page, who.email, who.password, locale);
      await setTextSize(page, 200);
    });
    afterAll(async () => {
      await page?.context().close();
    });

    for (const path of [...portalPages.filter((p) => !p.startsWith("/learn/") || p.endsWith("when-to-get-help")), ...publicPages]) {
      it(`${path}: no sideways scroll, nothing cut off`, async () => {
        await page.goto(`/${locale}${path}`);
        await settle(page, path);
        const rootPx = await page.evaluate(() => parseFloat(getComputedStyle(document.documentElement).fontSize));
        expect(rootPx).toBeGreaterThanOrEqual(32);
        expect(await overflowProblems(page), `${locale}${path}`).toEqual([]);
        // The bottom bar no longer floats over the page; "Get help" stays in the header.
        if (portalPages.includes(path)) {
          expect(await page.evaluate(() => getComputedStyle(document.querySelector('[data-testid="portal-nav"]')!).position)).toBe("static");
          expect(await page.getByTestId("get-help").isVisible()).toBe(true);
        }
        await screenshotAtTextSize(page, shotName(path, locale, "-200"), 200);
      });
    }
  });
}

describe("installable", () => {
  it("has a web app manifest with 192 and 512 px icons from the Caddis mark, linked from every page", async () => {
    const page = await phonePage(browser);
    await page.goto("/en/sign-in");
    const href = await page.locator('link[rel="manifest"]').getAttribute("href");
    expect(href).toBe("/manifest.webmanifest");
    const manifest = await (await page.request.get(href!)).json();
    expect(manifest.display).toBe("standalone");
    const sizes = manifest.icons.map((i: { sizes: string }) => i.sizes);
    expect(sizes).toEqual(expect.arrayContaining(["192x192", "512x512"]));
    for (const icon of manifest.icons as { src: string; type: string }[]) {
      const res = await page.request.get(icon.src);
      expect(res.status(), icon.src).toBe(200);
      expect(res.headers()["content-type"]).toContain(icon.type.split("+")[0]);
    }
    await page.context().close();
  });
});
