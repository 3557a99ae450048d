// Issue 14's stories in Chromium, across the people they involve: a check-in answered offline at
// 02:00 reaches the nurse with that time after the tab was closed; going back in a check-in
// keeps the answers; a diary entry made offline keeps its time; a record an admin closed refuses
// a nurse's change on screen. (The camera stories are in episodes.test.ts.)
import { randomUUID } from "node:crypto";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { eq } from "drizzle-orm";
import { db, pool } from "@/db";
import { account, careTeam, catheterEpisodes, checkIns, organisations, patients, user } from "@/db/schema";
import { hashPassword } from "@/lib/auth/password";
import { demoCatheterRow } from "../support/fixtures";
import { demo } from "../support/http";
import { launch, newPage, screenshot, signInAs } from "./support/browser";
import { closeDatabase, database, patientIdByHrn, phonePage } from "./support/portal";

let browser: Browser;
const created: string[] = [];
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
  if (created.length) await database().query("delete from patients where id = any($1::uuid[])", [created]);
  await closeDatabase();
  await pool.end();
});

/** Taps through the check-in from its first screen (the page is already on /check-in). */
async function answer(page: Page, steps: string[]) {
  for (const step of steps) {
    const q = await page.locator("[data-question]").getAttribute("data-question");
    await page.locator(`[data-question="${q}"] [data-answer="${step}"]`).click();
    if (step === "leaking" || step === "constipated") continue;
    await page.waitForFunction((x) => !!document.querySelector('[data-testid="check-in-result"]') || document.querySelector("[data-question]")?.getAttribute("data-question") !== x, q);
  }
}

describe("a check-in answered offline keeps its time, across a closed tab, to the nurse's screen", () => {
  it("answered at 02:00 with no signal, sent at the real time once back online, seen by the nurse as answered at 02:00", async () => {
    const arthur = await patientIdByHrn("EM-100-001");
    // The phone's clock: 02:00 this morning (or yesterday, when it is not yet 02:30 now).
    const twoAm = new Date();
    twoAm.setHours(2, 0, 0, 0);
    if (twoAm.getTime() > Date.now() - 30 * 60_000) twoAm.setDate(twoAm.getDate() - 1);

    const page = await phonePage(browser);
    await signInAs(page, demo.patient.email, demo.patient.password);
    await page.clock.install({ time: twoAm });
    await page.goto("/en/check-in");
    await page.waitForSelector("[data-question]");
    await page.context().setOffline(true);
    // Less urine and some pain: "soon", answered on the phone at once.
    await answer(page, ["no", "no", "no", "no", "not-taken", "no", "less", "under-12", "mild", "none", "done"]);
    const result = page.locator('[data-testid="check-in-result"]');
    await expect.poll(() => result.getAttribute("data-delivery")).toBe("waiting");
    await expect.poll(() => page.getByTestId("waiting-to-send").textContent()).toMatch(/Waiting to send \(1\)/);
    await screenshot(page, "story-offline-check-in-waiting-en-390");
    const [queued] = await page.evaluate(() => JSON.parse(localStorage.getItem("caddis.checkInOutbox.v1") ?? "[]"));
    // The phone's clock runs on from 02:00 while the questions are answered.
    const answeredAt = new Date(queued.answeredAt).getTime();
    expect(answeredAt - twoAm.getTime()).toBeGreaterThanOrEqual(0);
    expect(answeredAt - twoAm.getTime()).toBeLessThan(60_000);

    // The tab is closed while still offline; later the phone is back online and Caddis is opened again.
    const context2 = page.context();
    await page.close();
    await context2.setOffline(false);
    const again = await context2.newPage();
    await again.goto("/en/today");
    await expect.poll(async () => (await database().query("select 1 from check_ins where idempotency_key = $1", [queued.idempotencyKey])).rowCount, { timeout: 45_000 }).toBe(1);
    const { rows } = await database().query<{ answered_at: Date; created_at: Date; level: string }>("select answered_at, created_at, level from check_ins where idempotency_key = $1", [queued.idempotencyKey]);
    expect(rows[0].answered_at.getTime()).toBe(answeredAt);
    expect(rows[0].created_at.getTime() - twoAm.getTime()).toBeGreaterThan(30 * 60_000);
    await expect.poll(() => again.getByTestId("waiting-to-send").count()).toBe(0);
    await context2.close();

    // The nurse sees it as answered at 02:00, and that it arrived later.
    const nurse = await newPage(browser, { viewport: { width: 1280, height: 900 } });
    await signInAs(nurse, demo.communityNurse.email, demo.communityNurse.password);
    await nurse.goto(`/en/patients/${arthur}/check-ins`);
    // Listed by when it was answered: other check-ins made since come before it.
    const first = nurse.getByTestId("check-in-list").locator("li", { has: nurse.getByTestId("check-in-received-later") }).first();
    const shown = await first.getByTestId("check-in-answered").textContent();
    expect(shown).toMatch(/2:00|02:00/);
    expect(await first.getByTestId("check-in-received-later").textContent()).toMatch(/answered offline, received/);
    await screenshot(nurse, "story-offline-check-in-nurse-en-1280");
    await nurse.context().close();
  });

  it("going back keeps the answer given: a ticked 'Leaking' is still ticked, and the button says Done", async () => {
    const page = await phonePage(browser);
    await signInAs(page, demo.patient.email, demo.patient.password);
    await page.goto("/en/check-in");
    await page.waitForSelector("[data-question]");
    await answer(page, ["no", "no", "no", "no", "not-taken", "no", "yes", "none", "pink", "leaking"]);
    await page.getByRole("button", { name: "Back" }).click();
    await page.waitForSelector('[data-question="blood"]');
    expect(await page.locator('[data-question="blood"] [data-answer="pink"]').getAttribute("aria-pressed")).toBe("true");
    await screenshot(page, "story-check-in-back-keeps-answer-en-390");
    await page.locator('[data-question="blood"] [data-answer="pink"]').click();
    await page.waitForSelector('[data-question="other"]');
    expect(await page.locator('[data-question="other"] [data-answer="leaking"]').getAttribute("aria-pressed")).toBe("true");
    expect(await page.locator('[data-question="other"] [data-answer="done"]').textContent()).toBe("Done");
    await page.context().close();
  });

  it("after 'it came out' no drainage question is asked, and the advice says not to put it back", async () => {
    const page = await phonePage(browser);
    await signInAs(page, demo.patient.email, demo.patient.password);
    await page.goto("/en/check-in");
    await page.waitForSelector("[data-question]");
    await answer(page, ["no", "no", "no", "no", "not-taken", "yes"]);
    expect(await page.locator("[data-question]").getAttribute("data-question")).toBe("pain");
    await answer(page, ["none", "none", "done"]);
    const text = await page.getByTestId("check-in-result").textContent();
    expect(text).toMatch(/Do not try to put the catheter back in/);
    expect(text).not.toMatch(/kinked|below your bladder/);
    await screenshot(page, "story-catheter-out-en-390");
    await page.context().close();
  });
});

describe("the diary keeps an entry made offline, with its own time", () => {
  it("adds a drink with no signal: shown at once as waiting, sent when back online", async () => {
    const page = await phonePage(browser);
    await signInAs(page, demo.carer.email, demo.carer.password);
    await page.goto("/en/diary");
    await page.waitForSelector('[data-testid="today-in"]');
    await page.context().setOffline(true);
    const before = (await database().query<{ n: number }>("select count(*)::int as n from diary_entries")).rows[0].n;
    await page.getByTestId("drink-330").click();
    await expect.poll(() => page.getByTestId("diary-waiting").count()).toBeGreaterThan(0);
    await expect.poll(() => page.getByTestId("waiting-to-send").textContent()).toMatch(/Waiting to send \(1\)/);
    await screenshot(page, "story-diary-offline-en-390");
    const [queued] = await page.evaluate(() => JSON.parse(localStorage.getItem("caddis.diaryOutbox.v1") ?? "[]"));
    await page.context().setOffline(false);
    await expect.poll(async () => (await database().query("select 1 from diary_entries where client_key = $1", [queued.clientKey])).rowCount, { timeout: 45_000 }).toBe(1);
    const { rows } = await database().query<{ at: Date }>("select at from diary_entries where client_key = $1", [queued.clientKey]);
    expect(rows[0].at.toISOString()).toBe(queued.at);
    expect((await database().query<{ n: number }>("select count(*)::int as n from diary_entries")).rows[0].n).toBe(before + 1);
    await expect.poll(() => page.getByTestId("diary-waiting").count()).toBe(0);
    await page.context().close();
  });
});

describe("overdue dates in words, and an old instruction as history", () => {
  it("My catheter says a review 52 days past is overdue; Today shows a three-day-old 'call now' as history", async () => {
    const tag = randomUUID().slice(0, 8);
    const email = `overdue.${tag}@eastmere.example`;
    const password = `Overdue-${tag}-password`;
    const userId = randomUUID();
    await db.insert(user).values({ id: userId, email, name: "Nell Overby", role: "patient", locale: "en", emailVerified: true });
    await db.insert(account).values({ id: randomUUID(), userId, accountId: userId, providerId: "credential", password: await hashPassword(password) });
    const [harbourside] = await db.select({ id: organisations.id }).from(organisations).where(eq(organisations.name, "Harbourside Community Nursing Team"));
    const [p] = await db
      .insert(patients)
      .values({ givenName: "Nell", familyName: "Overby", healthRecordNumber: `E2E-OD-${tag}`, dateOfBirth: "1939-03-03", sex: "female", userId, allergyLatex: "no", allergyChlorhexidine: "no", allergyLidocaine: "no" })
      .returning({ id: patients.id });
    created.push(p.id);
    try {
      await db.insert(careTeam).values({ patientId: p.id, organisationId: harbourside.id });
      const day = (n: number) => new Date(Date.now() + n * 86_400_000).toISOString().slice(0, 10);
      await db.insert(catheterEpisodes).values(
        demoCatheterRow({ patientId: p.id, organisationId: harbourside.id, insertedAt: new Date(Date.now() - 80 * 86_400_000), plannedChangeOn: day(4), reviewDueOn: day(-52) }),
      );
      const threeDaysAgo = new Date(Date.now() - 3 * 86_400_000);
      await db.insert(checkIns).values({ patientId: p.id, reportedByUserId: userId, answers: { draining: "none", pain: "severe" }, level: "urgent", ruleIds: ["TRIAGE-NO-DRAINAGE"], idempotencyKey: randomUUID(), answeredAt: threeDaysAgo, createdAt: threeDaysAgo });

      const page = await phonePage(browser);
      await signInAs(page, email, password);
      await page.goto("/en/my-catheter");
      expect(await page.getByTestId("review-due").textContent()).toBe("Overdue by 52 days. Please call your care team.");
      expect(await page.getByTestId("next-change-due").textContent()).toBe("In 4 days.");
      await screenshot(page, "story-my-catheter-overdue-en-390");
      await page.goto("/en/today");
      expect(await page.getByTestId("last-check-in-advice").count()).toBe(0);
      expect(await page.getByTestId("last-check-in-old").textContent()).toMatch(/more than a day ago/);
      expect(await page.textContent("main")).toMatch(/What we said then: Call your care team now/);
      await screenshot(page, "story-today-old-instruction-en-390");
      await page.context().close();
    } finally {
      await db.delete(user).where(eq(user.id, userId));
    }
  });
});

describe("a closed record refuses writes on screen", () => {
  it("a nurse with the change form open saves after an admin closed the record: told it is closed; the record then offers no writes", async () => {
    const { rows: teams } = await database().query<{ id: string }>("select id from organisations where name = 'Harbourside Community Nursing Team'");
    const { rows: gps } = await database().query<{ id: string }>("select id from organisations where kind = 'gp_practice' limit 1");
    const { rows: made } = await database().query<{ id: string }>(
      "insert into patients (given_name, family_name, health_record_number, date_of_birth, sex, allergy_latex, allergy_chlorhexidine, allergy_lidocaine, gp_practice_id) values ('Wren', 'Closewood', $1, '1941-07-09', 'female', 'no', 'no', 'no', $2) returning id",
      [`E2E-CL-${randomUUID().slice(0, 8)}`, gps[0].id],
    );
    const patientId = made[0].id;
    created.push(patientId);
    await database().query("insert into care_team (patient_id, organisation_id) values ($1, $2)", [patientId, teams[0].id]);

    const nurse = await newPage(browser, { viewport: { width: 1280, height: 900 } });
    await signInAs(nurse, demo.communityNurse.email, demo.communityNurse.password);
    await nurse.goto(`/en/patients/${patientId}`);
    await nurse.getByRole("button", { name: "Edit details" }).click();
    await nurse.getByLabel("Family name").fill("Closewood-Hart");

    // Meanwhile an admin closes the record.
    const admin = await newPage(browser, { viewport: { width: 1280, height: 900 } });
    await signInAs(admin, demo.admin.email, demo.admin.password);
    await admin.goto(`/en/admin/patients?q=Closewood`);
    admin.on("dialog", (d) => void d.accept());
    await admin.getByRole("button", { name: "Close the record of Wren Closewood" }).click();
    await admin.getByLabel("Why is the record being closed?").fill("Moved out of the area; care handed over");
    await admin.getByRole("button", { name: "Close the record", exact: true }).click();
    await expect.poll(async () => (await database().query<{ closed_at: Date | null }>("select closed_at from patients where id = $1", [patientId])).rows[0].closed_at).not.toBeNull();
    await screenshot(admin, "story-closed-record-admin-en-1280");
    await admin.context().close();

    await nurse.getByRole("button", { name: /Save/ }).click();
    await expect.poll(() => nurse.getByText("This record is closed and can no longer be changed.").count()).toBe(1);
    await screenshot(nurse, "story-closed-record-refused-en-1280");
    expect((await database().query<{ family_name: string }>("select family_name from patients where id = $1", [patientId])).rows[0].family_name).toBe("Closewood");

    await nurse.goto(`/en/patients/${patientId}`);
    expect(await nurse.getByTestId("record-closed").textContent()).toMatch(/closed on .* It can be read but not changed/);
    expect(await nurse.getByRole("link", { name: "Record an insertion" }).count()).toBe(0);
    expect(await nurse.getByRole("button", { name: "Edit details" }).count()).toBe(0);
    await nurse.goto(`/en/patients/${patientId}/passport`);
    expect(await nurse.getByTestId("passport-issue").count()).toBe(0);
    await screenshot(nurse, "story-closed-record-passport-en-1280");
    await nurse.context().close();
  });
});
