// Helpers for the portal's end-to-end tests: a phone-sized context, scripted check-ins,
// accessibility (axe-core, WCAG 2.2 AA tags), touch-target and large-text checks.
import AxeBuilder from "@axe-core/playwright";
import pg from "pg";
import type { Browser, Page } from "playwright-core";
import { newPage } from "./browser";

export const PHONE = { viewport: { width: 390, height: 844 }, deviceScaleFactor: 1, hasTouch: true, isMobile: true } as const;

export function phonePage(browser: Browser): Promise<Page> {
  return newPage(browser, PHONE);
}

let pool: pg.Pool | null = null;
/** The test database (npm test passes DATABASE_URL to this stage). */
export function database(): pg.Pool {
  pool ??= new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 2 });
  return pool;
}
export async function closeDatabase() {
  await pool?.end();
  pool = null;
}

export async function patientIdByHrn(hrn: string): Promise<string> {
  const { rows } = await database().query<{ id: string }>("select id from patients where health_record_number = $1", [hrn]);
  return rows[0].id;
}

/** A step of a scripted check-in: tap an answer, or type a temperature. */
export type Step = string | { temperature: string };

/** Answers the check-in on screen, one tap per step, and waits for the result. */
export async function runCheckIn(page: Page, steps: Step[], locale = "en") {
  await page.goto(`/${locale}/check-in`);
  await page.waitForSelector("[data-question]");
  for (const step of steps) {
    const question = await page.locator("[data-question]").getAttribute("data-question");
    if (typeof step === "string") {
      const button = page.locator(`[data-question="${question}"] [data-answer="${step}"]`);
      const toggle = (await button.getAttribute("aria-pressed")) !== null;
      await button.click();
      // A tick in a "tap all that apply" list stays on the same screen.
      if (toggle) {
        await page.waitForFunction((s) => document.querySelector(`[data-answer="${s}"]`)?.getAttribute("aria-pressed") === "true", step);
        continue;
      }
    } else {
      await page.locator("#temperature").fill(step.temperature);
      await page.locator('[data-question="temperatureC"] button[type="submit"]').click();
    }
    // Wait for the next screen or the result before the next tap.
    await page.waitForFunction(
      (q) => !!document.querySelector('[data-testid="check-in-result"]') || document.querySelector("[data-question]")?.getAttribute("data-question") !== q,
      question,
    );
  }
  await page.waitForSelector('[data-testid="check-in-result"]');
  return page.locator('[data-testid="check-in-result"]');
}

/** axe-core with the WCAG 2.0 A/AA, 2.1 AA and 2.2 AA rules (target-size needs wcag22aa). */
export async function seriousViolations(page: Page) {
  const result = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21aa", "wcag22aa"]).analyze();
  return result.violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => ({ id: v.id, impact: v.impact, nodes: v.nodes.map((n) => n.target.join(" ")).slice(0, 5) }));
}

/** Visible buttons, links and form controls smaller than 44 × 44 CSS px. */
export async function smallTargets(page: Page, min = 44) {
  return page.evaluate((minSize) => {
    const out: string[] = [];
    for (const el of Array.from(document.querySelectorAll<HTMLElement>("a[href], button, input:not([type=hidden]), select, textarea, [role=button], label:has(input[type=file])"))) {
      const r = el.getBoundingClientRect();
      const style = getComputedStyle(el);
      // Visually hidden controls (skip link, the file input inside its big label) are not targets.
      if (r.width <= 2 || r.height <= 2 || style.visibility === "hidden" || style.display === "none") continue;
      if (el.closest("[hidden]")) continue;
      // A glossary word inside a sentence: WCAG 2.2's inline exception (2.5.8).
      if (el.closest("[data-term], [data-term-close]")) continue;
      if (r.width < minSize || r.height < minSize) out.push(`${el.tagName.toLowerCase()} "${(el.textContent || el.getAttribute("aria-label") || "").trim().slice(0, 40)}" ${Math.round(r.width)}×${Math.round(r.height)}`);
    }
    return out;
  }, min);
}

/** The phone's text size at a percentage (Chromium's own font-size setting, through CDP). */
export async function setTextSize(page: Page, percent: number) {
  const cdp = await page.context().newCDPSession(page);
  await cdp.send("Page.setFontSizes", { fontSizes: { standard: Math.round((16 * percent) / 100), fixed: Math.round((13 * percent) / 100) } });
}

/**
 * Horizontal scrolling, and elements that stick out of the viewport sideways (clipped or off screen).
 * `tablesMayScroll`: a data table may scroll inside its own named, focusable box (WCAG 2.2, 1.4.10
 * Reflow excepts data tables); the page itself still may not.
 */
export async function overflowProblems(page: Page, { tablesMayScroll = false } = {}) {
  return page.evaluate((tablesMayScroll) => {
    const width = document.documentElement.clientWidth;
    const problems: string[] = [];
    if (document.documentElement.scrollWidth > width + 1) problems.push(`page scrolls sideways: ${document.documentElement.scrollWidth} > ${width}`);
    for (const el of Array.from(document.querySelectorAll<HTMLElement>("body *"))) {
      const r = el.getBoundingClientRect();
      if (r.width === 0 || r.height === 0) continue;
      const style = getComputedStyle(el);
      if (style.position === "absolute" && (r.width <= 2 || r.height <= 2)) continue; // sr-only
      if (tablesMayScroll && el.closest('[role="region"][tabindex="0"]') && el.closest("[role=region]")!.querySelector("table")) continue;
      if (r.right > width + 1 || r.left < -1) problems.push(`${el.tagName.toLowerCase()}.${String(el.className).slice(0, 40)} ${Math.round(r.left)}–${Math.round(r.right)}`);
      // Text cut off inside its own box.
      if ((style.overflowX === "hidden" || style.overflowX === "clip") && el.scrollWidth > el.clientWidth + 1) problems.push(`clipped: ${el.tagName.toLowerCase()} "${(el.textContent ?? "").trim().slice(0, 30)}"`);
    }
    return [...new Set(problems)].slice(0, 10);
  }, tablesMayScroll);
}

/**
 * A whole-page screenshot that keeps the text size: Playwright's fullPage capture resets
 * Chromium's font-size setting, so the viewport is made as tall as the page instead.
 */
export async function screenshotAtTextSize(page: Page, name: string, percent: number) {
  const { screenshotDir } = await import("./browser");
  const fs = await import("node:fs");
  const path = await import("node:path");
  fs.mkdirSync(screenshotDir, { recursive: true });
  const height = Math.min(12_000, await page.evaluate(() => document.documentElement.scrollHeight));
  await page.setViewportSize({ width: PHONE.viewport.width, height });
  await setTextSize(page, percent);
  await page.screenshot({ path: path.join(screenshotDir, `${name}.png`) });
  await page.setViewportSize(PHONE.viewport);
  await setTextSize(page, percent);
}

/**
 * Words and numbers broken inside themselves: a word whose pieces sit on more than one line
 * although it is narrower than its block (so it would have fitted on a line of its own). Long
 * e-mail addresses wider than the screen may break; "14 Ch", "01632 960 101", a date may not.
 */
export async function brokenWords(page: Page) {
  return page.evaluate(() => {
    const out: string[] = [];
    const walker = document.createTreeWalker(document.body, NodeFilter.SHOW_TEXT);
    for (let node = walker.nextNode(); node; node = walker.nextNode()) {
      const parent = node.parentElement;
      if (!parent || parent.closest("script, style, svg, [hidden], .sr-only, title")) continue;
      const text = node.textContent ?? "";
      const block = parent.closest<HTMLElement>("p, li, h1, h2, h3, h4, dd, dt, td, th, label, legend, button, a, div, span") ?? parent;
      const room = block.clientWidth;
      // A compound's hard hyphen is a break point of the language ("check-|ins"), as a space is:
      // its parts are the words.
      for (const m of text.matchAll(/[^\s-]+/g)) {
        if (m[0].length < 2) continue;
        const range = document.createRange();
        range.setStart(node, m.index!);
        range.setEnd(node, m.index! + m[0].length);
        const rects = Array.from(range.getClientRects()).filter((r) => r.width > 0);
        // A new line starts where a piece sits below half the height of the one before.
        rects.sort((a, b) => a.top - b.top);
        let lines = rects.length ? 1 : 0;
        for (let i = 1; i < rects.length; i++) if (rects[i].top > rects[i - 1].top + rects[i - 1].height / 2) lines++;
        if (lines <= 1) continue;
        const width = rects.reduce((sum, r) => sum + r.width, 0);
        if (width <= room) out.push(`"${m[0]}" on ${lines} lines (${Math.round(width)} ≤ ${room} px) in ${block.tagName.toLowerCase()}`);
      }
    }
    return [...new Set(out)].slice(0, 15);
  });
}
