// The Passport and Documents tabs in Chromium, as a community nurse uses them: issue the passport
// (with a one-time portal activation code), see the QR and the passport code, download the
// booklet and check it is a PDF in the patient's language and English, reissue after a
// confirmation and find the old token dead; the GP summary of each issue reaches the practice's
// inbox through the outbox; the tab in Arabic; a photo attached through the presigned upload
// and removed again. Screenshots and the booklets go to test-results/.
import fs from "node:fs";
import path from "node:path";
import { eq } from "drizzle-orm";
import type { Browser, Download, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db";
import { patients } from "@/db/schema";
import { findPassportByToken } from "@/lib/passport";
import ar from "@/messages/ar.json";
import en from "@/messages/en.json";
import pl from "@/messages/pl.json";
import { demo } from "../support/http";
import { insertEpisode, mailPatient, waitForEmails, type MailFixture } from "../support/mail";
import { launch, newPage, screenshot, screenshotDir, signInAs } from "./support/browser";

// eslint-disable-next-line @typescript-eslint/no-require-imports
const { PDFParse } = require("pdf-parse") as typeof import("pdf-parse");

const outDir = path.resolve(screenshotDir, "..");
// The passport's short code: 12 random symbols and a check symbol; the activation code: 12.
const CODE = /^[2-9A-HJKMNP-TV-Z]{4}-[2-9A-HJKMNP-TV-Z]{4}-[2-9A-HJKMNP-TV-Z]{5}$/;
const ACTIVATION_CODE = /^[2-9A-HJKMNP-TV-Z]{4}-[2-9A-HJKMNP-TV-Z]{4}-[2-9A-HJKMNP-TV-Z]{4}$/;

async function pdfText(pdf: Buffer) {
  const parser = new PDFParse({ data: pdf });
  try {
    const r = await parser.getText();
    return r.text.normalize("NFKC").replace(/[\u0000-\u0008\u000b-\u001f\u061c\u200e\u200f]/g, "").replace(/\s+/g, " ");
  } finally {
    await parser.destroy();
  }
}

/** Letter-spaced big type can come back from the text layer with a space inside ("KT T4"). */
const squashed = (t: string) => t.replace(/\s/g, "");

async function saved(download: Download, name: string): Promise<Buffer> {
  const file = path.join(outDir, name);
  fs.mkdirSync(outDir, { recursive: true });
  await download.saveAs(file);
  return fs.readFileSync(file);
}

async function downloadOf(page: Page, testId: string, name: string) {
  const [download] = await Promise.all([page.waitForEvent("download"), page.getByTestId(testId).click()]);
  return saved(download, name);
}

let browser: Browser;
let fixture: MailFixture;
let page: Page;

beforeAll(async () => {
  browser = await launch();
  fixture = await mailPatient({ givenName: "Test", familyName: "Passport" });
  await db.update(patients).set({ preferredLocale: "pl" }).where(eq(patients.id, fixture.patientId));
  await insertEpisode(fixture.patientId, { material: "all-silicone", sizeCh: 14, balloonMl: 10, lot: "LOT-E2E-PASS" });
  page = await newPage(browser, { viewport: { width: 1280, height: 900 } });
  await signInAs(page, demo.communityNurse.email, demo.communityNurse.password);
});

afterAll(async () => {
  await page?.context().close();
  await browser?.close();
  await fixture?.cleanup();
});

describe("passport tab", () => {
  let firstToken: string;
  let firstCode: string;

  it("is a tab of the record, says what comes first, and offers an activation code to a patient without an account", async () => {
    await page.goto(`/en/patients/${fixture.patientId}`);
    await page.getByRole("navigation", { name: en.PatientRecord.tabs.label }).getByRole("link", { name: en.PatientRecord.tabs.passport }).click();
    await page.waitForURL(`**/en/patients/${fixture.patientId}/passport`);
    expect(await page.getByTestId("passport-safety").textContent()).toContain("Local policy, the maker's instructions and clinical judgement come first");
    expect(await page.getByText(en.Passport.none).isVisible()).toBe(true);
    expect(await page.getByTestId("passport-activation-choice").isVisible()).toBe(true);
    await screenshot(page, "passport-en-new");
  });

  it("issues it: the QR on screen, the short code beside it, and the activation code once", async () => {
    await page.getByTestId("passport-activation-choice").check();
    await page.getByTestId("passport-issue").click();
    await page.getByTestId("passport-issued").waitFor();
    const qr = page.getByTestId("passport-qr");
    expect(await qr.isVisible()).toBe(true);
    expect(await qr.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth > 0)).toBe(true);
    firstCode = (await page.getByTestId("passport-code").textContent())!.trim();
    expect(firstCode).toMatch(CODE);
    const url = (await page.getByTestId("passport-url").textContent())!.trim();
    firstToken = url.split("/p/")[1];
    expect(await findPassportByToken(firstToken)).toMatchObject({ patientId: fixture.patientId });
    expect((await page.getByTestId("passport-activation-code").textContent())!.trim()).toMatch(ACTIVATION_CODE);
    await screenshot(page, "passport-en-issued");
  });

  it("downloads the booklet: a PDF in Polish and English with the device facts; only the one-time copy has the activation code", async () => {
    const stored = await downloadOf(page, "passport-download", "passport-e2e-pl.pdf");
    expect(stored.subarray(0, 5).toString("latin1")).toBe("%PDF-");
    const text = await pdfText(stored);
    expect(text).toContain(pl.PassportPdf.title);
    expect(text).toContain(en.PassportPdf.title);
    expect(text).toContain("LOT-E2E-PASS");
    expect(squashed(text)).toContain(firstCode);
    expect(text).not.toContain(en.PassportPdf.portalTitle);

    const activation = (await page.getByTestId("passport-activation-code").textContent())!.trim();
    const withCode = await downloadOf(page, "passport-download-with-code", "passport-e2e-pl-portal.pdf");
    const codeText = await pdfText(withCode);
    expect(squashed(codeText)).toContain(activation);
    expect(codeText).toContain(pl.PassportPdf.portalTitle);
    expect(codeText).toContain(en.PassportPdf.portalTitle);
  });

  it("reissues only after a confirmation; the old token and code stop working at once", async () => {
    await page.reload();
    // After a reload the QR is gone (shown once); the booklet stays downloadable.
    expect(await page.getByTestId("passport-qr").count()).toBe(0);
    await page.getByTestId("passport-reissue").click();
    const dialog = page.getByRole("alertdialog");
    await dialog.waitFor();
    expect(await dialog.textContent()).toContain(en.Passport.confirmTitle);
    // Focus moves to the confirming button.
    expect(await page.evaluate(() => document.activeElement?.getAttribute("data-testid"))).toBe("passport-reissue-confirm");
    await screenshot(page, "passport-en-confirm");
    await page.getByRole("button", { name: en.Passport.cancel }).click();
    expect(await findPassportByToken(firstToken)).not.toBeNull();

    await page.getByTestId("passport-reissue").click();
    await page.getByTestId("passport-reissue-confirm").click();
    await page.getByTestId("passport-issued").waitFor();
    const secondCode = (await page.getByTestId("passport-code").textContent())!.trim();
    expect(secondCode).toMatch(CODE);
    expect(secondCode).not.toBe(firstCode);
    expect(await findPassportByToken(firstToken)).toBeNull();
    const secondToken = (await page.getByTestId("passport-url").textContent())!.trim().split("/p/")[1];
    expect(await findPassportByToken(secondToken)).toMatchObject({ patientId: fixture.patientId });
    // The history refreshes from the server after the reissue.
    await expect.poll(() => page.getByRole("cell", { name: new RegExp(en.Passport.statusRevoked) }).count(), { timeout: 15_000 }).toBe(1);
  });

  it("each issue sends its own GP summary to the practice through the outbox", async () => {
    const mail = await waitForEmails(fixture.gpInbox, 2, { timeoutMs: 45_000 });
    expect(mail.filter((m) => m.subject.includes(fixture.hrn))).toHaveLength(2);
  });

  it("in Arabic: mirrored, every label translated, the QR and code after a reissue; the booklet in Arabic and English", async () => {
    await db.update(patients).set({ preferredLocale: "ar" }).where(eq(patients.id, fixture.patientId));
    await page.goto(`/ar/patients/${fixture.patientId}/passport`);
    expect(await page.locator("html").getAttribute("dir")).toBe("rtl");
    expect(await page.getByRole("heading", { name: ar.Passport.title, exact: true }).isVisible()).toBe(true);
    await screenshot(page, "passport-ar");
    await page.getByTestId("passport-reissue").click();
    await page.getByTestId("passport-reissue-confirm").click();
    await page.getByTestId("passport-issued").waitFor();
    expect((await page.getByTestId("passport-code").textContent())!.trim()).toMatch(CODE);
    // Wait for the history to show the new passport (pl, pl, ar: three rows).
    await expect.poll(() => page.locator("table tbody tr").count(), { timeout: 15_000 }).toBe(3);
    const scroll = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(scroll).toBeLessThanOrEqual(0);
    await screenshot(page, "passport-ar-issued");
    const booklet = await downloadOf(page, "passport-download", "passport-e2e-ar.pdf");
    const text = await pdfText(booklet);
    expect(text).toContain(en.PassportPdf.title);
    // The text layer keeps Arabic in visual order and splits some words: single labels are compared.
    for (const word of [ar.PassportPdf.route, ar.PassportPdf.balloon, ar.PassportPdf.allergiesTitle]) expect(text, word).toContain(word);

    // And an English-only booklet, for the renders.
    await db.update(patients).set({ preferredLocale: "en" }).where(eq(patients.id, fixture.patientId));
    await page.goto(`/en/patients/${fixture.patientId}/passport`);
    await page.getByTestId("passport-reissue").click();
    await page.getByTestId("passport-reissue-confirm").click();
    await page.getByTestId("passport-issued").waitFor();
    const english = await downloadOf(page, "passport-download", "passport-e2e-en.pdf");
    expect(await pdfText(english)).toContain(en.PassportPdf.title);
  });
});

describe("documents tab", () => {
  it("attaches a photo through the presigned upload, shows its thumbnail, and removes it after a confirmation", async () => {
    await page.goto(`/en/patients/${fixture.patientId}/documents`);
    expect(await page.getByText(en.Uploads.empty).isVisible()).toBe(true);
    // Both problems at once when nothing is filled in.
    await page.getByTestId("upload-submit").click();
    expect(await page.getByText(en.Uploads.labelRequired).isVisible()).toBe(true);
    expect(await page.getByText(en.Uploads.chooseFile).isVisible()).toBe(true);

    await page.getByLabel(en.Uploads.label).fill("Label of today's catheter");
    const png = Buffer.from(
      "iVBORw0KGgoAAAANSUhEUgAAAAgAAAAICAIAAABLbSncAAAAFklEQVR4nGNkaPjPQATg/E+UOlKkBgAb4QOLbS1ZowAAAABJRU5ErkJggg==",
      "base64",
    );
    await page.getByLabel(en.Uploads.file).setInputFiles({ name: "label.png", mimeType: "image/png", buffer: png });
    await page.getByTestId("upload-submit").click();
    await expect.poll(() => page.getByTestId("upload-status").textContent(), { timeout: 20_000 }).toBe(en.Uploads.uploaded);
    const item = page.getByTestId("upload-item");
    await expect.poll(() => item.count(), { timeout: 15_000 }).toBe(1);
    const thumb = item.locator("img");
    await expect.poll(() => thumb.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth > 0), { timeout: 15_000 }).toBe(true);
    await screenshot(page, "documents-en");

    await page.getByTestId("upload-remove").click();
    await page.getByTestId("upload-remove-confirm").click();
    await expect.poll(() => item.count(), { timeout: 15_000 }).toBe(0);
    expect(await page.getByText(en.Uploads.empty).isVisible()).toBe(true);
  });

  it("in Arabic, mirrored", async () => {
    await page.goto(`/ar/patients/${fixture.patientId}/documents`);
    expect(await page.locator("html").getAttribute("dir")).toBe("rtl");
    expect(await page.getByRole("heading", { name: ar.Uploads.title }).isVisible()).toBe(true);
    await screenshot(page, "documents-ar");
  });
});
