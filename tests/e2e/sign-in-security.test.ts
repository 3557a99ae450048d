// Sign-in that holds against guessing, as people meet it in Chromium: a patient sees where they
// are signed in and signs out a phone; someone guesses a nurse's password from thirty addresses,
// the nurse is told by e-mail and held back on a new browser, and the admin sees the account
// under attack. (A clinician setting up two-step sign-in at first sign-in: admin.test.ts.)
import { describe, expect, it } from "vitest";
import { demo } from "../support/http";
import { waitForEmails } from "../support/mail";
import { createStaff, orgIdsByName } from "../support/staff";
import { baseUrl, browserForFile, newPage, screenshot, signInAs } from "./support/browser";
import { PHONE } from "./support/portal";

const ANDROID = "Mozilla/5.0 (Linux; Android 14; Pixel 8) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/131.0.0.0 Mobile Safari/537.36";

const browserOf = browserForFile();

describe("your sessions", () => {
  it("a patient signed in on a phone and a computer sees both, and signs the phone out from the computer", { timeout: 180_000 }, async () => {
    const phone = await newPage(browserOf(), { ...PHONE, userAgent: ANDROID });
    await signInAs(phone, demo.patientAr.email, demo.patientAr.password);
    const desk = await newPage(browserOf(), { viewport: { width: 1280, height: 900 } });
    await signInAs(desk, demo.patientAr.email, demo.patientAr.password);

    // More → Sign-in and password → where you are signed in.
    await desk.goto("/en/more");
    await desk.getByRole("link", { name: "Sign-in and password" }).click();
    await desk.waitForURL(/\/en\/more\/security$/);
    await screenshot(desk, "portal-security-en");
    await desk.getByRole("link", { name: "See where you are signed in" }).click();
    await desk.waitForURL(/\/en\/more\/sessions$/);
    const sessions = desk.getByTestId("session");
    await expect.poll(() => sessions.count()).toBeGreaterThanOrEqual(2);
    await expect.poll(() => sessions.first().textContent()).toContain("This device");
    const phoneRow = sessions.filter({ hasText: "Chrome on Android" });
    await expect.poll(() => phoneRow.count()).toBe(1);
    expect(await phoneRow.textContent()).toContain("Phone");
    expect(await desk.content()).not.toMatch(/session_token|"token"/);
    await screenshot(desk, "sessions-desktop-en");

    const before = await sessions.count();
    await phoneRow.getByRole("button", { name: "Sign out this device" }).click();
    await expect.poll(() => sessions.count()).toBe(before - 1);
    expect(await sessions.filter({ hasText: "Chrome on Android" }).count()).toBe(0);
    await screenshot(desk, "sessions-desktop-after-en");

    // The phone is signed out at its next step.
    await phone.goto("/en/today");
    await phone.waitForURL(/\/en\/sign-in$/);

    // Back on the phone, in Arabic.
    await signInAs(phone, demo.patientAr.email, demo.patientAr.password, "ar");
    await phone.goto("/ar/more/sessions");
    await expect.poll(() => phone.getByTestId("session").count()).toBeGreaterThanOrEqual(2);
    expect(await phone.locator("html").getAttribute("dir")).toBe("rtl");
    await screenshot(phone, "sessions-phone-ar");
    await phone.context().close();
    await desk.context().close();
  });
});

describe("an account under attack", () => {
  it("is slowed, its owner is e-mailed, the owner's new browser is told how long to wait, and the admin sees it", { timeout: 240_000 }, async () => {
    const orgs = await orgIdsByName(["Harbourside Community Nursing Team"]);
    const nurse = await createStaff({ role: "clinician", organisationIds: [orgs["Harbourside Community Nursing Team"]!], name: "Wren Halloway", email: `wren.halloway.${Date.now().toString(36)}@eastmere.example` });

    // Thirty wrong passwords from thirty addresses (the suite's server trusts loopback as its
    // proxy). The guesser waits out short holds, as a patient one would: each wait doubles.
    const statuses: number[] = [];
    for (let i = 0; i < 30; i++) {
      const res = await fetch(`${baseUrl}/api/auth/sign-in/email`, {
        method: "POST",
        headers: { "content-type": "application/json", origin: baseUrl, "x-forwarded-for": `198.18.${i}.${i + 7}` },
        body: JSON.stringify({ email: nurse.email, password: `summer-guess-${i}` }),
      });
      statuses.push(res.status);
      const wait = Number(res.headers.get("retry-after") ?? 0);
      if (res.status === 429 && wait <= 8) await new Promise((r) => setTimeout(r, wait * 1000 + 100));
    }
    expect(statuses.slice(0, 5)).toEqual([401, 401, 401, 401, 401]);
    // Thirty tries, and only nine or so were checked in the time it took.
    expect(statuses.filter((s) => s === 401).length).toBeLessThanOrEqual(10);
    expect(statuses.filter((s) => s === 429).length).toBeGreaterThanOrEqual(20);

    // On a browser she has never used, her right password is held back, and she is told for how long.
    const fresh = await newPage(browserOf(), { viewport: { width: 1280, height: 900 } });
    await fresh.context().setExtraHTTPHeaders({ "x-forwarded-for": "203.0.113.200" });
    await fresh.goto("/en/sign-in");
    await fresh.getByLabel("E-mail address").fill(nurse.email);
    await fresh.locator('input[type="password"]').fill(nurse.password);
    await fresh.locator('button[type="submit"]').click();
    const alert = fresh.locator('[role="alert"]').filter({ hasText: /\S/ }).first();
    await alert.waitFor();
    expect(await alert.textContent()).toMatch(/Too many wrong tries for this account\. You can try again in \d+ (seconds?|minutes?)/);
    await screenshot(fresh, "sign-in-held-en");
    await fresh.context().close();

    // She was told, through the outbox, in the fake inbox.
    const [mail] = await waitForEmails(nurse.email, 1, { timeoutMs: 30_000 });
    expect(mail.subject).toBe("Someone is trying to sign in to your Caddis account");
    expect(mail.text).toMatch(/forgot-password/);

    // The admin sees the account, and what Caddis did about it.
    const admin = await newPage(browserOf(), { viewport: { width: 1280, height: 900 } });
    await signInAs(admin, demo.admin.email, demo.admin.password);
    await admin.goto("/en/admin");
    await admin.getByRole("link", { name: "Sign-in attempts" }).first().click();
    await admin.waitForURL(/\/en\/admin\/sign-ins$/);
    const row = admin.getByTestId("attacked-account").filter({ hasText: "Wren Halloway" });
    await expect.poll(() => row.count()).toBe(1);
    const text = (await row.textContent())!;
    expect(text).toContain("Held back until");
    expect(text).toContain("Owner told by e-mail");
    expect(text).toContain("Clinician");
    await screenshot(admin, "admin-sign-ins-en");
    await admin.goto("/ar/admin/sign-ins");
    await expect.poll(() => admin.getByTestId("attacked-account").count()).toBeGreaterThanOrEqual(1);
    await screenshot(admin, "admin-sign-ins-ar");
    await admin.context().close();
  });
});
