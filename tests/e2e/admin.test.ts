// Administration in Chromium: every admin page in English and Arabic (screenshots looked at),
// and an admin inviting a nurse who accepts from the e-mail in the fake inbox and signs in.
import type { Page } from "playwright-core";
import { describe, expect, it } from "vitest";
import { demo, totpCode } from "../support/http";
import { waitForEmails } from "../support/mail";
import { createOrganisation, createStaff } from "../support/staff";
import { browserForFile, newPage, screenshot, signInAs } from "./support/browser";

const browserOf = browserForFile();

const pages = [
  { path: "/admin", name: "admin-home" },
  { path: "/admin/organisations", name: "admin-organisations" },
  { path: "/admin/organisations/new", name: "admin-organisation-new" },
  { path: "/admin/staff", name: "admin-staff" },
  { path: "/admin/settings", name: "admin-settings" },
  { path: "/admin/audit", name: "admin-audit" },
  { path: "/admin/patients", name: "admin-patients" },
  { path: "/admin/sign-ins", name: "admin-sign-ins" },
  { path: "/account", name: "account" },
];

/** On the set-up page: password, the key the page shows, a code from it; returns the secret. */
async function enrolTotpInBrowser(page: Page, password: string, shot: string) {
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Continue" }).click();
  const secretBox = page.getByTestId("totp-secret");
  await secretBox.waitFor();
  const secret = (await secretBox.textContent())!.replace(/\s/g, "");
  await screenshot(page, `${shot}-scan-en`);
  await page.locator('input[autocomplete="one-time-code"]').fill(totpCode(secret));
  await page.getByRole("button", { name: "Turn on two-step sign-in" }).click();
  await page.getByTestId("backup-codes").waitFor();
  expect(await page.getByTestId("backup-codes").locator("li").count()).toBe(10);
  await screenshot(page, `${shot}-backup-codes-en`);
  await page.getByRole("button", { name: "Continue" }).click();
  return secret;
}

describe("inviting a nurse", () => {
  it("an admin (signed in with a TOTP code from the demo secret) invites a nurse, who accepts from the fake inbox and signs in to their caseload", async () => {
    const admin = await newPage(browserOf(), { viewport: { width: 1280, height: 900 } });
    await signInAs(admin, demo.admin.email, demo.admin.password);
    await admin.goto("/en/admin/staff");
    const email = `ines.varga.${Date.now().toString(36)}@eastmere.example`;
    const form = admin.locator("form").filter({ has: admin.getByLabel("Work e-mail address") });
    await form.getByLabel("Work e-mail address").fill(email);
    await form.getByLabel("Name (optional)").fill("Ines Varga");
    await form.getByLabel("Larch Ward").check();
    await form.getByRole("button", { name: "Send invitation" }).click();
    // The link is e-mailed, not shown.
    await admin.getByText("We have e-mailed them the link.", { exact: false }).waitFor();
    expect(await admin.getByTestId("invite-link").count()).toBe(0);
    expect(await admin.content()).not.toMatch(/accept-invite\/[A-Za-z0-9_-]{20,}/);
    await screenshot(admin, "admin-staff-invited-en");

    // The app's own worker delivers it to the fake inbox.
    const [mail] = await waitForEmails(email, 1, { timeoutMs: 30_000 });
    expect(mail, "invitation e-mail in the fake inbox").toBeTruthy();
    expect(mail.subject).toBe("You are invited to Caddis");
    expect(mail.text).toContain("Larch Ward");
    const link = mail.text!.match(/https?:\/\/\S+\/accept-invite\/[A-Za-z0-9_-]+/)![0];
    expect(link).toMatch(/\/en\/accept-invite\/[A-Za-z0-9_-]{43}$/);
    // The staff page now says it went.
    const pending = admin.locator("li").filter({ hasText: email });
    await expect
      .poll(async () => {
        await admin.reload();
        return pending.getByTestId("invite-mail-state").textContent();
      }, { timeout: 20_000 })
      .toMatch(/^Invitation e-mailed/);
    await screenshot(admin, "admin-staff-pending-en");
    await admin.context().close();

    // The nurse, in their own browser, opens the link from the e-mail.
    const nurse = await newPage(browserOf());
    await nurse.context().setExtraHTTPHeaders({ "x-forwarded-for": "10.78.0.2" });
    await nurse.goto(new URL(link).pathname);
    await expect.poll(() => nurse.locator("h1").textContent()).toBe("Set up your Caddis account");
    await expect.poll(() => nurse.getByLabel("Your name").inputValue()).toBe("Ines Varga");
    await nurse.getByLabel("Password", { exact: true }).fill("short");
    await nurse.getByLabel("Password again").fill("short");
    await nurse.getByRole("button", { name: "Create account and sign in" }).click();
    await expect.poll(() => nurse.getByText("Use at least 12 characters.").count()).toBeGreaterThan(0);
    await screenshot(nurse, "accept-invite-en");
    await nurse.getByLabel("Password", { exact: true }).fill("Larch-ward-nurse-pass-26");
    await nurse.getByLabel("Password again").fill("Larch-ward-nurse-pass-26");
    await nurse.getByRole("button", { name: "Create account and sign in" }).click();
    // Staff sign in in two steps: before anything else she sets up her authenticator app.
    await nurse.waitForURL(/\/en\/two-factor\/setup$/, { timeout: 30_000 });
    const secret = await enrolTotpInBrowser(nurse, "Larch-ward-nurse-pass-26", "invited-nurse");
    await nurse.waitForURL(/\/en\/caseload$/, { timeout: 30_000 });
    await expect.poll(() => nurse.locator("h1").first().textContent()).toBe("Caseload");
    // The link worked once.
    await nurse.goto(new URL(link).pathname);
    await expect.poll(() => nurse.locator("h1").textContent()).toBe("This link does not work");
    await nurse.context().close();

    // And she signs in again the ordinary way: password, then the code from her app.
    const again = await newPage(browserOf());
    await signInAs(again, email, "Larch-ward-nurse-pass-26", "en", secret);
    expect(new URL(again.url()).pathname).toBe("/en/caseload");
    await again.context().close();
  });
});

describe("administration pages", () => {
  // Runs after the invitation above, so the access log has events to show.
  it("the admin signs in with the TOTP code and sees each admin page, in English and Arabic", { timeout: 300_000 }, async () => {
    const page = await newPage(browserOf(), { viewport: { width: 1280, height: 900 } });
    await signInAs(page, demo.admin.email, demo.admin.password);
    expect(new URL(page.url()).pathname).toBe("/en/admin");
    for (const locale of ["en", "ar"]) {
      for (const p of pages) {
        const res = await page.goto(`/${locale}${p.path}`);
        expect(res?.status(), p.path).toBe(200);
        await expect.poll(() => page.locator("h1").count()).toBeGreaterThan(0);
        expect(await page.locator("html").getAttribute("dir")).toBe(locale === "ar" ? "rtl" : "ltr");
        await screenshot(page, `${p.name}-${locale}`);
      }
    }
    // The organisation editor and a staff member's page.
    await page.goto("/en/admin/organisations");
    await page.getByRole("link", { name: "Larch Ward" }).click();
    await page.waitForURL(/\/en\/admin\/organisations\/[0-9a-f-]{36}$/);
    await screenshot(page, "admin-organisation-edit-en");
    await page.goto("/en/admin/staff");
    await page.getByRole("link", { name: "Tomasz Reid" }).click();
    await page.waitForURL(/\/en\/admin\/staff\/[^/]+$/);
    await screenshot(page, "admin-staff-member-en");
    await page.context().close();
  });

  it("the sign-in's second step refuses a wrong code and says so", async () => {
    const page = await newPage(browserOf());
    await page.context().setExtraHTTPHeaders({ "x-forwarded-for": "10.78.0.1" });
    await page.goto("/en/sign-in");
    await page.getByLabel("E-mail address").fill(demo.admin.email);
    await page.locator('input[type="password"]').fill(demo.admin.password);
    await page.locator('button[type="submit"]').click();
    await page.waitForURL(/\/en\/two-factor$/);
    await page.locator('input[autocomplete="one-time-code"]').fill("12345");
    await page.locator('button[type="submit"]').click();
    await expect.poll(() => page.getByRole("alert").first().textContent()).toContain("6 digits");
    await screenshot(page, "two-factor-en");
    await page.context().close();
  });

  it("the public account pages read in English and Arabic", async () => {
    const page = await newPage(browserOf());
    for (const locale of ["en", "ar"]) {
      await page.goto(`/${locale}/forgot-password`);
      await expect.poll(() => page.locator("h1").count()).toBe(1);
      await screenshot(page, `forgot-password-${locale}`);
      await page.goto(`/${locale}/accept-invite/not-a-real-invitation-token-000000`);
      await expect.poll(() => page.locator("h1").count()).toBe(1);
      expect(await page.locator('meta[name="referrer"]').getAttribute("content")).toBe("no-referrer");
      await screenshot(page, `accept-invite-invalid-${locale}`);
    }
    await page.context().close();
  });
});

describe("an organisation that requires two-step sign-in", () => {
  it("sends its nurse to set it up after signing in, and lets them in once it is done", { timeout: 180_000 }, async () => {
    const org = await createOrganisation({ name: `Strict Ward ${Date.now().toString(36)}`, requireTwoFactor: true });
    const nurse = await createStaff({ role: "clinician", organisationIds: [org.id], twoFactor: false });
    const page = await newPage(browserOf());
    await signInAs(page, nurse.email, nurse.password);
    expect(new URL(page.url()).pathname).toBe("/en/two-factor/setup");
    // Staff pages send them back here until it is done.
    await page.goto("/en/caseload");
    await page.waitForURL(/\/en\/two-factor\/setup$/);
    await screenshot(page, "two-factor-setup-en");
    const secret = await enrolTotpInBrowser(page, nurse.password, "two-factor-setup");
    await page.waitForURL(/\/en\/caseload$/);
    await page.goto("/ar/two-factor/setup");
    // Done: the set-up page now sends them home.
    await page.waitForURL(/\/ar\/caseload$/);
    await page.context().close();
    // The next sign-in asks for the code.
    const again = await newPage(browserOf());
    await signInAs(again, nurse.email, nurse.password, "ar", secret);
    expect(new URL(again.url()).pathname).toBe("/ar/caseload");
    await again.context().close();
  });
});
