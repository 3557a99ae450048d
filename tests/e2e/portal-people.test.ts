// Getting into the portal on a phone: a patient opens their account with a code from the care
// team; a patient invites a carer, who sees that patient only and loses access the moment the
// patient removes them.
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { demo } from "../support/http";
import { waitForEmails } from "../support/mail";
import { launch, screenshot, signInAs } from "./support/browser";
import { closeDatabase, patientIdByHrn, phonePage } from "./support/portal";

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
  await closeDatabase();
});

describe("getting in", () => {
  it("a clinician makes a code and the patient opens their account with it, on a phone", async () => {
    const nurse = await phonePage(browser);
    await signInAs(nurse, demo.communityNurse.email, demo.communityNurse.password);
    const rosa = await patientIdByHrn("EM-100-005");
    // On the record's Passport tab, without printing a new booklet.
    await nurse.goto(`/en/patients/${rosa}/passport`);
    await nurse.getByTestId("make-activation-code").click();
    const code = (await nurse.getByTestId("activation-code").textContent())!.trim();
    expect(code).toMatch(/^[0-9A-Z]{4}-[0-9A-Z]{4}-[0-9A-Z]{4}$/);
    expect(await nurse.getByTestId("portal-invite").textContent()).toMatch(/\/es\/activate/);
    await screenshot(nurse, "staff-portal-invite-code-en-phone");
    await nurse.context().close();

    const page = await phonePage(browser);
    await page.context().setExtraHTTPHeaders({ "x-forwarded-for": "10.78.0.1" });
    await page.goto("/en/activate");
    await screenshot(page, "portal-activate-en");
    await page.getByLabel("Your code").fill(code.toLowerCase());
    await page.getByLabel("Your e-mail address").fill("rosa.jimenez@eastmere.example");
    await page.getByLabel("Choose a password").fill("river-lantern-quiet-morning");
    await page.getByRole("button", { name: "Open my account" }).click();
    await page.waitForURL(/\/es\/today$/, { timeout: 30_000 });
    expect(await page.locator("h1").first().textContent()).toBe("Hoy");
    await page.context().close();
  }, 180_000);

  it("refuses a wrong code with a plain message", async () => {
    const page = await phonePage(browser);
    await page.context().setExtraHTTPHeaders({ "x-forwarded-for": "10.78.0.2" });
    await page.goto("/ar/activate");
    await page.locator('input[autocomplete="one-time-code"]').fill("ABCD-EFGH-JKMN");
    await page.locator('input[type="email"]').fill("someone@eastmere.example");
    await page.locator('input[type="password"]').fill("river-lantern-quiet-morning");
    await page.locator('button[type="submit"]').click();
    // The code's own message, beside the box, under the form's summary.
    await page.locator('[role="alert"]').filter({ hasText: /هذا الرمز لا يعمل/ }).waitFor();
    expect(await page.getByTestId("form-error").textContent()).toMatch(/\S/);
    await screenshot(page, "portal-activate-ar");
    await page.context().close();
  });
});

describe("carers", () => {
  it("a carer accepts, sees only the linked patient, and loses access when the patient removes them", async () => {
    const arthur = await patientIdByHrn("EM-100-001");
    const yusuf = await patientIdByHrn("EM-100-003");
    const email = `e2e.carer.${Date.now()}@eastmere.example`;

    // The patient invites by e-mail on My people; the link reaches the carer's inbox only.
    const patient = await phonePage(browser);
    await signInAs(patient, demo.patient.email, demo.patient.password);
    await patient.goto("/en/people");
    await patient.getByLabel("Their e-mail address").fill(email);
    await patient.getByRole("button", { name: "Make an invitation" }).click();
    await patient.getByTestId("invite-result").waitFor();
    expect(await patient.getByTestId("invite-result").textContent()).toContain(email);
    await screenshot(patient, "portal-people-invited-en");
    const [mail] = await waitForEmails(email, 1, { timeoutMs: 60_000 });
    expect(mail, "the invitation e-mail reached the fake inbox").toBeTruthy();
    const link = /https?:\/\/[^\s"<]+\/en\/carer-invite\/[A-Za-z0-9_-]{43}/.exec(mail.text ?? "")?.[0];
    expect(link).toBeTruthy();

    // The carer opens the link and makes an account.
    const carer = await phonePage(browser);
    await carer.context().setExtraHTTPHeaders({ "x-forwarded-for": "10.78.0.3" });
    const inviteRes = await carer.goto(new URL(link!).pathname);
    expect(inviteRes?.headers()["referrer-policy"]).toBe("no-referrer");
    await screenshot(carer, "portal-carer-invite-en");
    await carer.getByLabel("Your name").fill("Sam Pell");
    await carer.getByLabel("Choose a password").fill("harbour-kettle-blue-window");
    await carer.getByTestId("accept-invite").click();
    await carer.waitForURL(/\/en\/today$/, { timeout: 30_000 });
    expect(await carer.textContent("main")).toMatch(/You are helping Arthur Pell/);

    // That patient only.
    const origin = new URL(carer.url()).origin;
    const range = `from=${encodeURIComponent(new Date(Date.now() - 86_400_000).toISOString())}&to=${encodeURIComponent(new Date().toISOString())}`;
    expect((await carer.request.get(`/api/diary?patientId=${arthur}&${range}`)).status()).toBe(200);
    expect((await carer.request.get(`/api/diary?patientId=${yusuf}&${range}`)).status()).toBe(404);
    await carer.goto("/en/diary");
    await carer.getByTestId("drink-250").click();
    await carer.waitForSelector('[data-testid="diary-added"]');

    // The patient removes the carer: one tap to ask, one to confirm.
    await patient.goto("/en/people");
    const card = patient.getByTestId("carer").filter({ hasText: "Sam Pell" });
    await card.getByTestId("remove-carer").click();
    const removed = patient.waitForResponse((r) => r.request().method() === "DELETE" && r.url().includes("/carers/"));
    await card.getByTestId("confirm-remove").click();
    expect((await removed).status()).toBe(204);
    // The page says so, then the list is fetched again without them.
    await expect.poll(() => patient.getByTestId("carer").filter({ hasText: "Sam Pell" }).count(), { timeout: 30_000 }).toBe(0);
    await screenshot(patient, "portal-people-removed-en");
    await patient.goto("/en/people");
    expect(await patient.getByTestId("carer").filter({ hasText: "Sam Pell" }).count()).toBe(0);

    // At once: the carer's next request is refused and the next page shows no patient.
    expect((await carer.request.get(`/api/diary?patientId=${arthur}&${range}`)).status()).toBe(404);
    const post = await carer.request.post("/api/check-ins", {
      data: { patientId: arthur, answers: { draining: "yes", pain: "none" }, idempotencyKey: "0b8f1c2d-3e4f-4a5b-8c6d-7e8f9a0b1c2d" },
      headers: { origin },
    });
    expect(post.status()).toBe(404);
    await carer.goto("/en/today");
    // Told why (issue 17), not "not linked yet".
    expect(await carer.getByTestId("carer-removed").textContent()).toMatch(/You no longer help Arthur/);
    await carer.context().close();
    await patient.context().close();
  }, 180_000);
});
