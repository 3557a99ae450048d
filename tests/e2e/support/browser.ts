// playwright-core driving Debian's chromium; no browser is ever downloaded.
import fs from "node:fs";
import path from "node:path";
import { chromium, type Browser, type BrowserContextOptions, type Page } from "playwright-core";
import { afterAll, beforeAll } from "vitest";
import { totpCode, totpSecretFor } from "../../support/totp";

export const baseUrl = process.env.E2E_BASE_URL ?? "http://localhost:3100";
export const screenshotDir = path.resolve(__dirname, "../../../test-results/screenshots");

export const chromiumArgs = [
  "--headless",
  "--no-sandbox",
  "--disable-gpu",
  "--disable-quic",
  "--no-first-run",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
];

export async function launch(extraArgs: string[] = []): Promise<Browser> {
  return chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium", args: [...chromiumArgs, ...extraArgs] });
}

/**
 * One Chromium for a test file: launched before its tests, closed after them with the file's
 * database pool. Returns a getter, as the browser exists only once the file has started.
 */
export function browserForFile(extraArgs: string[] = []): () => Browser {
  let browser: Browser | undefined;
  beforeAll(async () => {
    browser = await launch(extraArgs);
  });
  afterAll(async () => {
    await browser?.close();
    const { pool } = await import("@/db");
    await pool.end().catch(() => {});
  });
  return () => browser!;
}

export async function newPage(browser: Browser, options: BrowserContextOptions = {}): Promise<Page> {
  const context = await browser.newContext({ baseURL: baseUrl, ...options });
  return context.newPage();
}

export async function screenshot(page: Page, name: string) {
  fs.mkdirSync(screenshotDir, { recursive: true });
  await page.screenshot({ path: path.join(screenshotDir, `${name}.png`), fullPage: true });
}

// Addresses 10.77.x.y with x picked per test file, so files that follow each other within the
// sign-in limit's minute never share an address.
const fileOctet = 1 + Math.floor(Math.random() * 250);
let ip = 1;
/**
 * Signs in through the real form. Each sign-in is sent as from its own address so the
 * per-address sign-in limit is not what a test of something else runs into. When the form
 * stays put, the error it shows is the test's failure message.
 */
export async function signInAs(page: Page, email: string, password: string, locale = "en", totpSecret?: string) {
  await page.context().setExtraHTTPHeaders({ "x-forwarded-for": `10.77.${fileOctet}.${1 + (ip++ % 250)}` });
  await page.goto(`/${locale}/sign-in`);
  await page.getByLabel(/e-mail|correo|adres|adresă|البريد|ای میل/i).first().fill(email);
  await page.locator('input[type="password"]').fill(password);
  await page.locator('button[type="submit"]').click();
  await page
    .waitForURL((url) => !url.pathname.endsWith("/sign-in") && !url.pathname.endsWith("/home"), { timeout: 30_000 })
    .catch(async (e: unknown) => {
      const alert = await page.locator('[role="alert"]').allTextContents().catch(() => []);
      throw new Error(`sign-in as ${email} stayed on ${page.url()}; the page said: ${alert.join(" | ").trim() || "nothing"} (${String(e)})`);
    });
  // Two-step sign-in: the code from the account's TOTP secret (the seed's or createStaff's).
  if (new URL(page.url()).pathname.endsWith("/two-factor")) {
    const secret = totpSecret ?? totpSecretFor(email);
    if (!secret) throw new Error(`${email} asks for a TOTP code and no secret is known`);
    await page.locator('input[autocomplete="one-time-code"]').fill(totpCode(secret));
    await page.locator('button[type="submit"]').click();
    await page.waitForURL((url) => !url.pathname.endsWith("/two-factor") && !url.pathname.endsWith("/home"), { timeout: 30_000 });
  }
}
