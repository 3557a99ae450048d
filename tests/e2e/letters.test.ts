// The built app delivers mail by itself (the outbox worker started by instrumentation.ts), the
// Letters tab and the supply request work in Chromium in English and Arabic, and the GP summary
// is seen as the practice sees it, in the fake inbox's web UI. Screenshots in test-results/.
import fs from "node:fs";
import path from "node:path";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db";
import { queueGpSummary } from "@/lib/email/gp-summary";
import { demo } from "../support/http";
import { insertEpisode, mailPatient, sharedInboxUrl, waitForEmails, type MailFixture } from "../support/mail";
import { launch, newPage, screenshot, screenshotDir, signInAs } from "./support/browser";

let browser: Browser;
let fx: MailFixture;
// One signed-in nurse for every test (sign-in is slow on a busy machine; the locale is in the URL).
let page: Page;

beforeAll(async () => {
  browser = await launch();
  fx = await mailPatient({ givenName: "Cecily", familyName: "Marsh" });
  page = await newPage(browser, { viewport: { width: 1280, height: 900 } });
  await signInAs(page, demo.communityNurse.email, demo.communityNurse.password);
});
afterAll(async () => {
  await browser?.close();
  await fx?.cleanup();
});

describe("letters, supplies and the GP summary in the fake inbox", () => {
  it("the app's own worker delivers the GP summary; the Letters tab shows it sent; the inbox shows it as the practice sees it", async () => {
    const { event } = await insertEpisode(fx.patientId, {
      difficulties: "Slight resistance at the bladder neck; <b>not</b> forced",
      findings: [{ severity: "stop", code: "latex-allergy", message: "Latex allergy", source: "mhra-mda-2012-075" }],
      overrides: [{ code: "latex-allergy", reason: "All-silicone catheter confirmed on the label" }],
    });
    await db.transaction((tx) => queueGpSummary(tx, { patientId: fx.patientId, eventId: event.id, cause: "insertion", actorName: "Grace Mensah" }));
    // Nothing but the running app sends it (LISTEN/NOTIFY wakes its worker).
    const [mail] = await waitForEmails(fx.gpInbox, 1, { timeoutMs: 30_000 });
    expect(mail.subject).toBe(`Caddis: catheter inserted, patient ${fx.hrn}`);
    expect(mail.attachments?.[0].contentType).toBe("application/pdf");

    await page.goto(`/en/patients/${fx.patientId}/letters`);
    await expect.poll(() => page.getByRole("heading", { level: 2 }).textContent()).toBe("Letters");
    await expect.poll(async () => (await page.getByText("Sent", { exact: true }).count()) > 0).toBe(true);
    await page.getByText("Show what it says").first().click();
    await screenshot(page, "letters-en");

    const inbox = await newPage(browser, { viewport: { width: 1280, height: 1000 }, baseURL: sharedInboxUrl });
    await inbox.goto(`${sharedInboxUrl}/#/email/${mail.id}`);
    await inbox.waitForTimeout(1500);
    await expect.poll(async () => (await inbox.locator("body").innerText()).includes("Caddis: catheter inserted")).toBe(true);
    await screenshot(inbox, "gp-summary-inbox");
    // The HTML part alone, as the practice's mail client shows it.
    const html = await fetch(`${sharedInboxUrl}/api/email/${mail.id}/html`).then((r) => r.text());
    expect(html).toContain("&lt;b&gt;not&lt;/b&gt; forced");
    const body = await newPage(browser, { viewport: { width: 760, height: 1000 } });
    await body.setContent(html);
    await screenshot(body, "gp-summary-html");
    fs.mkdirSync(screenshotDir, { recursive: true });
    const pdf = await fetch(`${sharedInboxUrl}/api/email/${mail.id}/attachment/${mail.attachments![0].generatedFileName ?? mail.attachments![0].filename}`);
    fs.writeFileSync(path.join(screenshotDir, "gp-summary-e2e.pdf"), Buffer.from(await pdf.arrayBuffer()));
  });

  it("a nurse reviews, adjusts and sends a supply request; it is kept and reaches the practice", async () => {
    await page.goto(`/en/patients/${fx.patientId}/supplies`);
    await expect.poll(() => page.getByRole("heading", { level: 2 }).textContent()).toBe("Supply request");
    await page.getByLabel("Period").selectOption("56");
    await expect.poll(() => page.locator("#qty-night-bag").inputValue()).toBe("56");
    await page.locator("#qty-leg-bag").fill("9");
    await page.getByLabel("Note for the GP (optional)").fill("Prefers the shorter leg bag tube");
    await screenshot(page, "supplies-en-form");
    await page.getByRole("button", { name: /^Send to/ }).click();
    await expect.poll(async () => (await page.getByText(/Request kept and queued/).count()) > 0, { timeout: 20_000 }).toBe(true);
    const mails = await waitForEmails(fx.gpInbox, 2, { timeoutMs: 30_000 });
    const request = mails.find((m) => m.subject.includes("supply request"))!;
    expect(request.text).toContain("Leg bags | 9 |");
    expect(request.text).toContain("Night bags | 56 |");
    await page.reload();
    await expect.poll(async () => (await page.getByText(/56 days, by Grace Mensah/).count()) > 0).toBe(true);
    await screenshot(page, "supplies-en-history");

    // Too many: the form says so and nothing is sent.
    await page.locator("#qty-leg-bag").fill("1000");
    await page.getByRole("button", { name: /^Send to/ }).click();
    await expect.poll(async () => (await page.getByText("Enter a number between 0 and 999.").count()) > 0).toBe(true);
  });

  it("Arabic: the Letters tab and the supply request read right to left", async () => {
    await page.goto(`/ar/patients/${fx.patientId}/letters`);
    expect(await page.locator("html").getAttribute("dir")).toBe("rtl");
    await expect.poll(() => page.getByRole("heading", { level: 2 }).textContent()).toBe("الرسائل");
    await screenshot(page, "letters-ar");
    await page.goto(`/ar/patients/${fx.patientId}/supplies`);
    await expect.poll(() => page.getByRole("heading", { level: 2 }).textContent()).toBe("طلب مستلزمات");
    await screenshot(page, "supplies-ar");
  });

  it("a phone-sized Letters tab has no sideways scrolling, and another team's clinician is refused", async () => {
    await page.setViewportSize({ width: 360, height: 780 });
    await page.goto(`/en/patients/${fx.patientId}/letters`);
    await expect.poll(() => page.getByRole("heading", { level: 2 }).textContent()).toBe("Letters");
    expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth + 1)).toBe(true);
    await screenshot(page, "letters-en-phone");

    const outsider = await newPage(browser);
    await signInAs(outsider, demo.rowanNurse.email, demo.rowanNurse.password);
    const res = await outsider.goto(`/en/patients/${fx.patientId}/letters`);
    expect(res?.status()).toBe(404);
  });
});
