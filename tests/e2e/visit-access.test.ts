// Issue 5 in Chromium: a clinician of another organisation (Rowan Ward) meets a patient at home
// with his passport. They type the short code, see the device card (no name, headers checked),
// sign in from the card, state a reason, record a visit with NEWS2 and a change through the care
// team's own forms, and the care team sees all of it in the access log. Also: the old token after
// a reissue, the card in Arabic, the 429 page, and the Scan page reading the QR from the camera.
import { randomUUID } from "node:crypto";
import { eq, inArray } from "drizzle-orm";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db, pool } from "@/db";
import { careTeam, catheterEpisodes, organisations, patients } from "@/db/schema";
import en from "@/messages/en.json";
import { demoCatheterRow } from "../support/fixtures";
import { demo } from "../support/http";
import { totpCode, totpSecretFor } from "../support/totp";
import { baseUrl, launch, newPage, screenshot, signInAs } from "./support/browser";
import { writeQrVideo } from "./support/fake-camera";

// Patients of this test's own (Harbourside's care), so the demo records other tests read stay as seeded.
const created: string[] = [];
async function makePatient(opts: { familyName: string; locale: string; sex: "male" | "female"; latex?: boolean; chlorhexidine?: boolean; route: "urethral" | "suprapubic" }) {
  const [team] = await db.select({ id: organisations.id }).from(organisations).where(eq(organisations.name, "Harbourside Community Nursing Team"));
  const [p] = await db
    .insert(patients)
    .values({
      givenName: "Edmund",
      familyName: opts.familyName,
      healthRecordNumber: `E2E-QR-${randomUUID()}`,
      dateOfBirth: "1946-05-20",
      sex: opts.sex,
      preferredLocale: opts.locale,
      allergyLatex: opts.latex ? "yes" : "no",
      allergyChlorhexidine: opts.chlorhexidine ? "yes" : "no",
      allergyLidocaine: "no",
    })
    .returning({ id: patients.id });
  created.push(p.id);
  await db.insert(careTeam).values({ patientId: p.id, organisationId: team.id });
  const insertedAt = new Date(Date.now() - 20 * 86_400_000);
  await db.insert(catheterEpisodes).values(
    demoCatheterRow({ patientId: p.id, organisationId: team.id, insertedAt, route: opts.route, sizeCh: opts.route === "suprapubic" ? 16 : 14 }),
  );
  return p.id;
}

let browser: Browser;
let arthur: string;
let yusuf: string;
let nursePage: Page;
type Issued = { url: string; shortCode: string };
let oldPassport: Issued;
let passport: Issued;
let yusufPassport: Issued;
const tokenOf = (p: Issued) => p.url.split("/p/")[1]!;

async function issue(patientId: string): Promise<Issued> {
  const res = await nursePage.request.post(`/api/patients/${patientId}/passport`, { data: { reissue: true }, headers: { origin: new URL(baseUrl).origin } });
  expect(res.status()).toBe(201);
  return res.json();
}

beforeAll(async () => {
  browser = await launch();
  arthur = await makePatient({ familyName: `Quill-${randomUUID().slice(0, 6)}`, locale: "en", sex: "male", latex: true, route: "urethral" });
  yusuf = await makePatient({ familyName: `Rahal-${randomUUID().slice(0, 6)}`, locale: "ar", sex: "male", chlorhexidine: true, route: "suprapubic" });
  nursePage = await newPage(browser, { viewport: { width: 1280, height: 900 } });
  await signInAs(nursePage, demo.communityNurse.email, demo.communityNurse.password);
  oldPassport = await issue(arthur);
  passport = await issue(arthur);
  yusufPassport = await issue(yusuf);
});
afterAll(async () => {
  await browser?.close();
  if (created.length) await db.delete(patients).where(inArray(patients.id, created));
  await pool.end();
});

describe("visiting clinician from the passport", () => {
  it("enters the short code, sees the device card, signs in, states a reason, records NEWS2 and a change; the access log shows it", async () => {
    const page = await newPage(browser, { viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true });
    await page.context().setExtraHTTPHeaders({ "x-forwarded-for": `10.89.${1 + Math.floor(Math.random() * 250)}.1` });
    await page.goto("/en/p");
    await page.getByTestId("code-input").fill(passport.shortCode.toLowerCase());
    const [card] = await Promise.all([page.waitForResponse((r) => r.url().includes("/en/p/code?code=")), page.getByRole("button", { name: "Show the device card" }).click()]);
    expect(card.status()).toBe(200);
    const headers = card.headers();
    expect(headers["referrer-policy"]).toBe("no-referrer");
    expect(headers["cache-control"]).toBe("no-store");
    expect(headers["x-robots-tag"]).toBe("noindex");
    await expect.poll(() => page.getByTestId("card-size").textContent()).toMatch(/\d+ Ch/);
    const text = (await page.locator("main").textContent()) ?? "";
    expect(text).toContain("Latex");
    expect(text).not.toMatch(/Edmund|Quill|E2E-QR|1946/);
    expect(await page.getByTestId("card-phone").getAttribute("href")).toMatch(/^tel:\+?\d+$/);
    await screenshot(page, "device-card-code-en-390");

    // Sign in from the card, then the reason.
    await page.getByTestId("card-sign-in").click();
    await page.getByLabel(/e-mail/i).fill(demo.rowanNurse.email);
    await page.locator('input[type="password"]').fill(demo.rowanNurse.password);
    await page.locator('button[type="submit"]').click();
    // Staff sign in in two steps: the code is asked for here, on the card's own page.
    await page.locator('input[autocomplete="one-time-code"]').fill(totpCode(totpSecretFor(demo.rowanNurse.email)!));
    await screenshot(page, "visit-access-second-step-en-390");
    await page.locator('button[type="submit"]').click();
    await page.getByTestId("visit-reason").or(page.locator('[role="alert"]').filter({ hasText: /\S/ })).first().waitFor();
    await screenshot(page, "visit-access-after-code-en-390");
    await page.getByTestId("visit-reason").waitFor();
    await page.getByTestId("visit-reason").fill("Out-of-hours visit: catheter bypassing, patient feverish");
    await page.getByTestId("visit-submit").click();
    await page.waitForURL(`**/en/patients/${arthur}`);
    await expect.poll(() => page.locator("main").textContent()).toContain("through visit access");

    // A visit with NEWS2, scored as typed. Source: RCP NEWS2 (2017) chart 1: RR 22 → 2,
    // SpO2 95 (scale 1) → 1, air → 0, SBP 105 → 1, pulse 95 → 1, alert → 0, 38.3 °C → 1: total 6, medium.
    await page.goto(`/en/patients/${arthur}/record/visit`);
    await page.getByTestId("visit-notes").fill("Bypassing since this morning; temperature raised.");
    await page.getByTestId("obs-respirationRate").fill("22");
    await page.getByTestId("obs-spo2").fill("95");
    await page.getByTestId("obs-systolicBp").fill("105");
    await page.getByTestId("obs-pulse").fill("95");
    await page.getByTestId("obs-temperatureC").fill("38.3");
    await expect.poll(() => page.getByTestId("news2-total").textContent()).toContain("Total 6");
    expect(await page.getByTestId("news2-band").textContent()).toContain("Medium");
    expect(await page.getByTestId("news2-response").textContent()).toContain("Urgent response");
    await screenshot(page, "visit-news2-en-390");
    await page.getByTestId("visit-save").click();
    await page.getByTestId("visit-saved").waitFor();
    expect(await page.getByTestId("news2-saved").getAttribute("data-risk")).toBe("medium");
    expect(await page.getByTestId("visit-alerted").isVisible()).toBe(true);

    // A planned change through the care team's own form (it starts from the catheter in place).
    await page.goto(`/en/patients/${arthur}/record/change`);
    await page.getByTestId("change-form").waitFor();
    await page.locator('input[name="changeKind"][value="planned"]').check();
    await page.locator('input[name="needReviewed"]').check();
    await page.getByTestId("save").click();
    await page.waitForURL(`**/en/patients/${arthur}`, { timeout: 30_000 });
    await page.context().close();

    // The care team sees who came, why, and what they did.
    await nursePage.goto(`/en/patients/${arthur}/access`);
    const log = (await nursePage.locator("main").textContent()) ?? "";
    expect(log).toContain("Was given visit access");
    expect(log).toContain("Out-of-hours visit: catheter bypassing, patient feverish");
    expect(log).toContain("Recorded a visit");
    expect(log).toContain(en.PatientAccessLog.actions.episode_change);
    expect(log).toContain("Visit access");
    await screenshot(nursePage, "access-log-visit-en");
  });

  it("shows the plain 'no longer valid' page for the token a reissue revoked", async () => {
    const page = await newPage(browser);
    const res = await page.goto(`/en/p/${tokenOf(oldPassport)}`);
    expect(res?.status()).toBe(200);
    await page.getByTestId("card-invalid").waitFor();
    expect(await page.locator("main").textContent()).toContain("This passport is no longer valid");
    await page.context().close();
  });

  it("shows the card in Arabic and English, mirrored, with the phone digits in order", async () => {
    const page = await newPage(browser, { viewport: { width: 390, height: 844 } });
    await page.goto(`/ar/p/${tokenOf(yusufPassport)}`);
    expect(await page.locator("html").getAttribute("dir")).toBe("rtl");
    await page.getByTestId("card-ar").waitFor();
    expect(await page.getByTestId("card-ar").getAttribute("dir")).toBe("rtl");
    expect(await page.getByTestId("card-en").getAttribute("dir")).toBe("ltr");
    const phone = page.getByTestId("card-phone");
    const digits = (await phone.getAttribute("href"))!.replace("tel:", "");
    // The number is isolated left-to-right inside the Arabic label, so its digits keep their order.
    const label = (await phone.textContent()) ?? "";
    expect(label).toMatch(/\u2066[^\u2069]+\u2069/);
    expect(label.match(/\u2066([^\u2069]+)\u2069/)![1]!.replace(/\D/g, "")).toBe(digits.replace(/\D/g, ""));
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await screenshot(page, "device-card-ar-390");
    await page.goto(`/en/p/${tokenOf(passport)}`);
    await screenshot(page, "device-card-en-390");
    await page.context().close();
  });

  it("answers 429 from one address over the limit", async () => {
    const page = await newPage(browser);
    await page.context().setExtraHTTPHeaders({ "x-forwarded-for": "10.88.0.99" });
    let last = 0;
    for (let i = 0; i < 31; i++) last = (await page.request.get(`/en/p/${tokenOf(passport)}`)).status();
    expect(last).toBe(429);
    const res = await page.goto(`/en/p/${tokenOf(passport)}`);
    expect(res?.status()).toBe(429);
    expect(res?.headers()["referrer-policy"]).toBe("no-referrer");
    expect(Number(res?.headers()["retry-after"])).toBeGreaterThan(0);
    expect(await page.locator("h1").first().textContent()).toBe("Too many requests");
    await page.context().close();
  });

  it("reads the passport QR with the camera on the Scan page and opens the card", async () => {
    const video = await writeQrVideo(passport.url);
    const camera = await launch(["--use-fake-ui-for-media-stream", "--use-fake-device-for-media-stream", `--use-file-for-fake-video-capture=${video}`]);
    try {
      const page = await newPage(camera, { viewport: { width: 1280, height: 900 } });
      await signInAs(page, demo.rowanNurse.email, demo.rowanNurse.password);
      await page.goto("/en/scan");
      await page.getByTestId("scan-toggle").click();
      await page.waitForURL(`**/en/p/${tokenOf(passport)}`, { timeout: 60_000 });
      await expect.poll(() => page.getByTestId("card-size").textContent()).toMatch(/\d+ Ch/);
    } finally {
      await camera.close();
    }
  });
});
