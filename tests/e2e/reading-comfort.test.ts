// For people who read or see poorly: large text that still reads (no word or number broken inside
// itself, nothing sideways at 320 px and 200 %), dates in the deployment's region, right-to-left
// details (left-to-right address boxes, the diary chart in reading order, Nastaliq for Urdu) and
// the honest translation-review line at the foot of patient pages.
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { demo } from "../support/http";
import { launch, newPage, screenshot, signInAs } from "./support/browser";
import AxeBuilder from "@axe-core/playwright";
import { brokenWords, closeDatabase, overflowProblems, PHONE, screenshotAtTextSize, setTextSize, smallTargets } from "./support/portal";

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
  await closeDatabase();
});

/** Everything past the right edge, zero-sized boxes too (for the failure message). */
function sticksOut(page: Page) {
  return page.evaluate(() =>
    Array.from(document.querySelectorAll<HTMLElement>("body *"))
      .filter((el) => el.getBoundingClientRect().right > document.documentElement.clientWidth + 1 || el.getBoundingClientRect().left < -1)
      // The widest boxes first: the one that pushes the page is among them.
      .sort((a, b) => b.scrollWidth - a.scrollWidth)
      .filter((el) => !el.querySelector("main, header, nav"))
      .slice(0, 5)
      .map((el) => `${el.tagName.toLowerCase()}.${String(el.className).slice(0, 60)} "${(el.textContent ?? "").trim().slice(0, 30)}"`)
      .join(" | "),
  );
}

const NARROW = { ...PHONE, viewport: { width: 320, height: 640 } };
const pages = ["/today", "/check-in", "/diary", "/my-catheter", "/help", "/people", "/more", "/learn", "/learn/when-to-get-help"];
const MONTHS = "January|February|March|April|May|June|July|August|September|October|November|December";

async function settle(page: Page, path: string) {
  if (path === "/diary") await page.waitForSelector('[data-testid="today-in"]');
  if (path === "/check-in") await page.waitForSelector("[data-question]");
  await page.evaluate(() => document.fonts.ready.then(() => undefined));
}

for (const locale of ["en", "ar"] as const) {
  describe(`${locale}: 320 px wide at 200 % text`, () => {
    let page: Page;
    beforeAll(async () => {
      page = await newPage(browser, NARROW);
      const who = locale === "en" ? demo.patient : demo.patientAr;
      await signInAs(page, who.email, who.password, locale);
      await setTextSize(page, 200);
    });
    afterAll(async () => {
      await page?.context().close();
    });

    for (const path of pages) {
      it(`${path}: nothing sideways, no word or number broken inside itself`, async () => {
        await page.goto(`/${locale}${path}`);
        await settle(page, path);
        expect(await overflowProblems(page, { tablesMayScroll: true }), `${locale}${path}: ${await sticksOut(page)}`).toEqual([]);
        expect(await brokenWords(page), `${locale}${path}`).toEqual([]);
        await screenshotAtTextSize(page, `reading${path.replace(/\//g, "-")}-${locale}-320-200`, 200);
        await page.setViewportSize(NARROW.viewport); // the screenshot helper leaves the phone's 390 px
      });
    }
  });
}

describe("Listen, in a browser with no voice (headless Chromium has none)", () => {
  for (const [locale, path] of [["en", "/learn/when-to-get-help"], ["ar", "/help"], ["pl", "/today"]] as const) {
    it(`${locale}${path}: plays speech made on the server for the page's language and marks the sentence read`, async () => {
      const page = await newPage(browser, PHONE);
      await signInAs(page, demo.patient.email, demo.patient.password, locale);
      await page.goto(`/${locale}${path}`);
      expect(await page.evaluate(() => speechSynthesis.getVoices().length)).toBe(0);
      const first = page.waitForResponse((r) => r.url().includes("/api/speech?"));
      await page.getByTestId("listen-start").click();
      const res = await first;
      expect(res.status()).toBe(200);
      expect(res.headers()["content-type"]).toBe("audio/wav");
      expect(res.headers()["content-language"]).toBe(locale);
      const body = await res.body();
      expect(body.length).toBeGreaterThan(1000);
      expect(body.subarray(0, 4).toString()).toBe("RIFF");
      expect(new URL(res.url()).searchParams.get("lang")).toBe(locale);
      expect(await page.getByTestId("listen").getAttribute("data-engine")).toBe("server");
      // The sentence being read is marked.
      await page.waitForFunction(() => (CSS as unknown as { highlights: Map<string, unknown> }).highlights.has("listen"));
      await page.getByTestId("listen-pause").click();
      await page.getByTestId("listen-resume").waitFor();
      await screenshot(page, `reading-listen${path.replace(/\//g, "-")}-${locale}`);
      await page.getByTestId("listen-stop").click();
      await page.getByTestId("listen-start").waitFor();
      expect(await page.evaluate(() => (CSS as unknown as { highlights: Map<string, unknown> }).highlights.has("listen"))).toBe(false);
      await page.context().close();
    });
  }
});

describe("Listen, paused while the next sentence is still being made", () => {
  it("pausing while the sound loads is a pause, not a failure; going on plays it", async () => {
    const page = await newPage(browser, PHONE);
    await signInAs(page, demo.patient.email, demo.patient.password, "en");
    // The first sentence comes at once; every later one is held back 2 s, as on a busy server.
    let served = 0;
    let secondAsked = () => {};
    const asked = new Promise<void>((r) => (secondAsked = r));
    await page.route("**/api/speech?**", async (route) => {
      if (++served > 1) {
        secondAsked();
        await new Promise((r) => setTimeout(r, 2000));
      }
      await route.continue();
    });
    await page.goto("/en/learn/when-to-get-help");
    await page.getByTestId("listen-start").click();
    await asked;
    await page.getByTestId("listen-pause").click();
    await page.getByTestId("listen-resume").waitFor();
    await page.waitForTimeout(2500);
    expect(await page.getByText("Reading aloud did not work").count()).toBe(0);
    expect(await page.getByTestId("listen-resume").isVisible()).toBe(true);
    await page.getByTestId("listen-resume").click();
    await page.getByTestId("listen-pause").waitFor();
    expect(await page.evaluate(() => (CSS as unknown as { highlights: Map<string, unknown> }).highlights.has("listen"))).toBe(true);
    await page.getByTestId("listen-stop").click();
    await page.context().close();
  });
});

/** Every axe finding (WCAG 2.0 A to 2.2 AA, and best practice), whatever its impact. */
async function axeFindings(page: Page) {
  const result = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa", "wcag22aa", "best-practice"]).analyze();
  return result.violations.map((v) => ({ id: v.id, impact: v.impact, nodes: v.nodes.map((n) => n.target.join(" ")).slice(0, 5) }));
}

/** Answers the check-in up to the question asked, the same way each time. */
const ANSWERS: Record<string, string> = {
  newConfusion: "no", breathless: "no", feelsVeryUnwell: "no", shivering: "no", temperatureC: "not-taken", catheterOut: "no",
  draining: "less", hoursWithoutUrine: "under-12", pain: "none", blood: "none", other: "done",
};
async function answerUntil(page: Page, locale: string, stop: string | null) {
  await page.goto(`/${locale}/check-in`);
  await page.waitForSelector("[data-question]");
  for (let i = 0; i < 12; i++) {
    if (await page.getByTestId("check-in-result").count()) return;
    const q = (await page.locator("[data-question]").getAttribute("data-question"))!;
    if (q === stop) return;
    await page.locator(`[data-question="${q}"] [data-answer="${ANSWERS[q]}"]`).click();
    await page.waitForFunction((prev) => !!document.querySelector('[data-testid="check-in-result"]') || document.querySelector("[data-question]")?.getAttribute("data-question") !== prev, q);
  }
}

for (const locale of ["en", "ar"] as const) {
  describe(`${locale}: pictures and plain words`, () => {
    let page: Page;
    beforeAll(async () => {
      page = await newPage(browser, PHONE);
      const who = locale === "en" ? demo.patient : demo.patientAr;
      await signInAs(page, who.email, who.password, locale);
    });
    afterAll(async () => {
      await page?.context().close();
    });

    it("a Learn page with pictures and tappable words: axe finds nothing; a word shows its meaning", async () => {
      await page.goto(`/${locale}/learn/leg-and-night-bags`);
      expect(await page.getByTestId("picture-legBag").count()).toBe(1);
      expect(await page.getByTestId("picture-nightBag").count()).toBe(1);
      expect(await axeFindings(page)).toEqual([]);
      expect(await smallTargets(page)).toEqual([]);
      const term = page.locator("button[data-term]").first();
      await term.click();
      expect(await term.getAttribute("aria-expanded")).toBe("true");
      await page.getByTestId("term-meaning").first().waitFor();
      expect(await axeFindings(page)).toEqual([]);
      await screenshot(page, `reading-learn-bags-${locale}`);
    });

    it("the plain words page: every term and its meaning; axe finds nothing", async () => {
      await page.goto(`/${locale}/learn/words`);
      expect(await page.locator("[data-testid=glossary-page] dt").count()).toBe(10);
      expect(await axeFindings(page)).toEqual([]);
      await screenshot(page, `reading-words-${locale}`);
    });

    it("check-in: a picture beside the question, and with the result; axe finds nothing", async () => {
      await answerUntil(page, locale, "draining");
      expect(await page.getByTestId("picture-bagBelowBladder").count()).toBe(1);
      expect(await axeFindings(page)).toEqual([]);
      await screenshot(page, `reading-check-in-draining-${locale}`);
      await answerUntil(page, locale, "blood");
      expect(await page.getByTestId("picture-urineColours").count()).toBe(1);
      await screenshot(page, `reading-check-in-blood-${locale}`);
      await answerUntil(page, locale, null);
      await page.getByTestId("check-in-result").waitFor();
      expect(await page.locator("[data-testid^=picture-]").count()).toBeGreaterThan(0);
      expect(await axeFindings(page)).toEqual([]);
      await screenshot(page, `reading-check-in-result-${locale}`);
    });
  });
}

for (const locale of ["en", "ar"] as const) {
  describe(`${locale}: easier reading, kept for the person`, () => {
    it("each text size step lays out at 320 px with nothing sideways and no word broken; stronger contrast; the check-in too; remembered on another phone", async () => {
      const who = locale === "en" ? demo.patient : demo.patientAr;
      const page = await newPage(browser, NARROW);
      await signInAs(page, who.email, who.password, locale);
      // The choice is kept for the person: put it back even when a check below fails, so the
      // files after this one see the usual text size.
      try {
      const rootPx = () => page.evaluate(() => parseFloat(getComputedStyle(document.documentElement).fontSize));
      const sizes: number[] = [];
      for (const step of [0, 1, 2, 3]) {
        await page.goto(`/${locale}/more`);
        const saved = page.waitForResponse((r) => r.url().endsWith("/api/account/reading") && r.request().method() === "PUT");
        await page.locator(`[data-text-step="${step}"]`).click();
        expect((await saved).status()).toBe(200);
        for (const path of ["/today", "/check-in", "/learn/leg-and-night-bags", "/more"]) {
          await page.goto(`/${locale}${path}`);
          await settle(page, path);
          expect(await page.locator("[data-text-size]").getAttribute("data-text-size")).toBe(String(step));
          expect(await overflowProblems(page, { tablesMayScroll: true }), `${locale}${path} step ${step}: ${await sticksOut(page)}`).toEqual([]);
          expect(await brokenWords(page), `${locale}${path} step ${step}`).toEqual([]);
          if (path === "/today") sizes.push(await rootPx());
          if (path === "/today" || path === "/check-in") await screenshot(page, `reading-size${step}${path.replace(/\//g, "-")}-${locale}-320`);
        }
      }
      // Each step larger than the one before; the largest twice the first.
      for (let i = 1; i < sizes.length; i++) expect(sizes[i]).toBeGreaterThan(sizes[i - 1]);
      expect(sizes[3] / sizes[0]).toBeCloseTo(2, 1);

      await page.goto(`/${locale}/more`);
      await page.locator('[data-contrast-choice="high"]').click();
      await page.waitForFunction(() => document.querySelector("[data-contrast]")?.getAttribute("data-contrast") === "high");
      await page.goto(`/${locale}/today`);
      expect(await page.evaluate(() => getComputedStyle(document.body).color)).toBe("rgb(0, 0, 0)");
      await screenshot(page, `reading-contrast-today-${locale}-320`);

      // Another phone, the same person: the same choice.
      const other = await newPage(browser, PHONE);
      await signInAs(other, who.email, who.password, locale);
      await other.goto(`/${locale}/today`);
      expect(await other.locator("[data-text-size]").getAttribute("data-text-size")).toBe("3");
      expect(await other.locator("[data-contrast]").getAttribute("data-contrast")).toBe("high");
      // Back to the usual for the other tests.
      const reset = await other.request.put("/api/account/reading", { data: { textSize: 0, contrast: "standard" }, headers: { origin: new URL(other.url()).origin } });
      expect(reset.status()).toBe(200);
      await other.context().close();
      } finally {
        await page.request.put("/api/account/reading", { data: { textSize: 0, contrast: "standard" }, headers: { origin: new URL(page.url()).origin } }).catch(() => undefined);
        await page.context().close();
      }
    });
  });
}

describe("dates in the deployment's region", () => {
  it("English in this deployment reads day month year (Settings region GB)", async () => {
    const page = await newPage(browser, PHONE);
    await signInAs(page, demo.patient.email, demo.patient.password, "en");
    await page.goto("/en/my-catheter");
    const text = await page.locator("main").innerText();
    expect(text).toMatch(new RegExp(`\\b\\d{1,2} (${MONTHS}) \\d{4}\\b`));
    expect(text).not.toMatch(new RegExp(`\\b(${MONTHS}) \\d{1,2}, \\d{4}\\b`));
    await page.context().close();
  });
});

describe("right to left details", () => {
  it("the e-mail box of an Arabic page keeps what is typed left to right", async () => {
    const page = await newPage(browser, PHONE);
    await page.goto("/ar/sign-in");
    const box = page.locator('input[type="email"]');
    await box.fill("yusuf.haddad@");
    expect(await box.evaluate((el) => getComputedStyle(el).direction)).toBe("ltr");
    expect(await page.locator("html").getAttribute("dir")).toBe("rtl");
    await screenshot(page, "reading-sign-in-ar-email-ltr");
    await page.context().close();
  });

  it("the diary's week chart runs in the same order as its table, from the right in Arabic", async () => {
    const page = await newPage(browser, PHONE);
    await signInAs(page, demo.patientAr.email, demo.patientAr.password, "ar");
    await page.goto("/ar/diary");
    await page.waitForSelector("svg g[data-day]");
    const xs = await page.locator("svg g[data-day]").evaluateAll((gs) => gs.map((g) => g.getBoundingClientRect().left));
    // The table lists the days oldest first, top down; read right to left, the chart does too.
    for (let i = 1; i < xs.length; i++) expect(xs[i]).toBeLessThan(xs[i - 1]);
    await screenshot(page, "reading-diary-ar-chart");
    await page.context().close();
  });

  it("Urdu pages are set in Nastaliq, Arabic pages in Naskh", async () => {
    const page = await newPage(browser, PHONE);
    await page.goto("/ur/activate");
    await page.evaluate(() => document.fonts.ready.then(() => undefined));
    // The face behind a font variable (next/font names it), and whether the page has loaded it.
    const face = (variable: string) =>
      page.evaluate((v) => {
        const family = getComputedStyle(document.documentElement).getPropertyValue(v).split(",")[0].trim().replace(/^['"]|['"]$/g, "");
        return document.fonts.load(`16px "${family}"`, "اردو عربي").then((faces) => ({ family, loaded: faces.length > 0 }));
      }, variable);
    const nastaliq = await face("--font-nastaliq");
    expect((await face("--font-arabic")).family).toBe(nastaliq.family);
    expect(nastaliq.loaded).toBe(true);
    await screenshot(page, "reading-activate-ur-nastaliq");
    await page.goto("/ar/activate");
    await page.evaluate(() => document.fonts.ready.then(() => undefined));
    const naskh = await face("--font-arabic");
    expect(naskh.family).not.toBe(nastaliq.family);
    expect(naskh.loaded).toBe(true);
    await page.context().close();
  });
});

async function saveReviews(admin: Page) {
  const saved = admin.waitForResponse((r) => r.url().endsWith("/api/admin/settings") && r.request().method() === "PATCH");
  await admin.getByTestId("translation-reviews").getByRole("button", { name: "Save reviews" }).click();
  expect((await saved).status()).toBe(200);
  await admin.getByText("Reviews saved.").waitFor();
}

describe("translation review, honestly", () => {
  it("Arabic patient pages say, once and quietly, that a medical translator has not checked them; once an admin records the review, who and when", async () => {
    const patient = await newPage(browser, PHONE);
    await signInAs(patient, demo.patientAr.email, demo.patientAr.password, "ar");
    await patient.goto("/ar/today");
    const note = patient.getByTestId("translation-note");
    expect(await note.count()).toBe(1);
    expect(await note.getAttribute("data-reviewed")).toBe("no");

    const admin = await newPage(browser, { viewport: { width: 1280, height: 900 } });
    await signInAs(admin, demo.admin.email, demo.admin.password, "en");
    await admin.goto("/en/admin/settings");
    const ar = admin.getByTestId("review-ar");
    await ar.getByLabel("Medical translator's name").fill("Layla Test-Translator");
    await ar.getByLabel("Day of the review").fill("2026-11-20");
    await saveReviews(admin);
    await screenshot(admin, "reading-admin-translation-reviews");

    await patient.goto("/ar/today");
    expect(await note.getAttribute("data-reviewed")).toBe("yes");
    expect(await note.innerText()).toContain("2026");
    await screenshot(patient, "reading-today-ar-reviewed");

    // Withdrawn again (the other tests expect the demo's unreviewed state).
    await ar.getByLabel("Medical translator's name").fill("");
    await ar.getByLabel("Day of the review").fill("");
    await saveReviews(admin);
    await patient.goto("/ar/today");
    expect(await note.getAttribute("data-reviewed")).toBe("no");
    await admin.context().close();
    await patient.context().close();
  });
});
