// Issue 17 on a 390 × 844 phone: the patient sees who looked at the record (a visiting clinician's
// QR view and visit access with the reason), the check-in history says who answered, a carer with
// alerts on is told of the patient's urgent check-in by e-mail, and the screens speak to her about
// the patient by name. (A removed carer seeing why is in portal-people.test.ts.)
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { demo } from "../support/http";
import { emailsTo } from "../support/mail";
import { launch, screenshot, signInAs } from "./support/browser";
import { closeDatabase, database, patientIdByHrn, phonePage, runCheckIn, type Step } from "./support/portal";

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
  await closeDatabase();
});

const REASON = "Out-of-hours visit: bypassing around the catheter";
const no4: Step[] = ["no", "no", "no", "no"];

describe("the portal reaches out", () => {
  it("the patient's access page lists a visiting clinician's QR view and visit access with the reason (en, ar); carers are refused", async () => {
    const arthur = await patientIdByHrn("EM-100-001");
    const yusuf = await patientIdByHrn("EM-100-003");
    const db = database();
    const { rows } = await db.query<{ id: string }>("select id from \"user\" where email = $1", [demo.rowanNurse.email]);
    const priya = rows[0].id;
    // What the passport flow writes (tests/e2e/visit-access.test.ts drives it on screen): the card
    // opened by QR, then visit access with the reason. Stamped seconds ago, not minutes: the page
    // lists newest first, and earlier files' events of the last minutes would push these to page 2.
    for (const p of [arthur, yusuf]) {
      await db.query(
        `insert into audit_events (action, actor_user_id, actor_role, patient_id, via, reason, at) values
         ('passport.card.view', $1, 'clinician', $2, 'qr', null, now() - interval '2 seconds'),
         ('visit-access.grant', $1, 'clinician', $2, 'visit_access', $3, now() - interval '1 second')`,
        [priya, p, REASON],
      );
    }
    const page = await phonePage(browser);
    await signInAs(page, demo.patient.email, demo.patient.password);
    await page.goto("/en/more");
    await page.getByRole("link", { name: "Who looked at my record" }).click();
    await page.waitForURL(/\/en\/more\/access$/);
    const lines = page.getByTestId("access-line");
    const qr = lines.filter({ hasText: "By scanning the QR code on your device card" }).filter({ hasText: "Priya Sandhu" });
    const visit = lines.filter({ hasText: `Reason they gave: ${REASON}` });
    expect(await visit.first().textContent()).toMatch(/Priya Sandhu.*Clinician · Rowan Ward.*With visit access/);
    expect(await qr.count()).toBeGreaterThan(0);
    // Outside my care team only.
    await page.getByLabel("Only people outside my care team").check();
    await page.getByRole("button", { name: "Show" }).click();
    await page.waitForURL(/who=outside/);
    expect(await qr.count()).toBeGreaterThan(0);
    expect(await page.locator('[data-via="care_team"]').count()).toBe(0);
    expect(await lines.filter({ hasText: REASON }).count()).toBeGreaterThan(0);
    await screenshot(page, "portal-who-looked-en");
    await page.context().close();

    const ar = await phonePage(browser);
    await signInAs(ar, demo.patientAr.email, demo.patientAr.password, "ar");
    await ar.goto("/ar/more/access?who=outside");
    expect(await ar.getByTestId("access-line").filter({ hasText: "بمسح رمز QR على بطاقة جهازك" }).count()).toBeGreaterThan(0);
    expect(await ar.locator("html").getAttribute("dir")).toBe("rtl");
    await screenshot(ar, "portal-who-looked-ar");
    await ar.context().close();

    const carer = await phonePage(browser);
    await signInAs(carer, demo.carer.email, demo.carer.password);
    const refused = await carer.goto("/en/more/access");
    expect(refused?.status()).toBe(403);
    expect((await carer.request.get(`/api/patients/${arthur}/access-log`)).status()).toBe(403);
    await carer.context().close();
  }, 180_000);

  it("a carer with alerts on is told of the patient's urgent check-in; history says who answered", async () => {
    const started = new Date();
    const carer = await phonePage(browser);
    await signInAs(carer, demo.carer.email, demo.carer.password);
    await carer.goto("/en/more");
    // Speaks to her about Arthur.
    expect(await carer.getByRole("link", { name: "Arthur's catheter" }).count()).toBe(1);
    const toggle = carer.getByTestId("carer-alert-toggle");
    if (!(await toggle.isChecked())) {
      await toggle.check();
      await carer.getByTestId("carer-alert-saved").waitFor();
    }
    // By e-mail (another file may have left her on texts).
    const channel = carer.getByTestId("carer-alert-channel");
    if ((await channel.inputValue()) !== "email") {
      await channel.selectOption("email");
      await expect.poll(() => channel.inputValue()).toBe("email");
      await carer.getByTestId("carer-alert-saved").waitFor();
    }
    await screenshot(carer, "portal-carer-alerts-on-en");

    const patient = await phonePage(browser);
    await signInAs(patient, demo.patient.email, demo.patient.password);
    // common practice, no source — a catheter that does not drain is urgent.
    const result = await runCheckIn(patient, [...no4, "not-taken", "no", "none", "under-12", "none", "none", "done"]);
    expect(await result.getAttribute("data-level")).toBe("urgent");
    // The phone's outbox delivers the check-in; the history shows it once it has arrived.
    await expect
      .poll(
        async () => {
          await patient.goto("/en/more/check-ins");
          return patient.getByTestId("history-check-in").first().getAttribute("data-level", { timeout: 2_000 }).catch(() => null);
        },
        { timeout: 60_000 },
      )
      .toBe("urgent");
    const first = patient.getByTestId("history-check-in").first();
    expect(await first.getAttribute("data-level")).toBe("urgent");
    expect(await first.getByTestId("history-who").textContent()).toBe("Answered by you");
    await screenshot(patient, "portal-check-in-history-en");
    await patient.context().close();

    // Through the outbox: sent once, and in the inbox.
    const db = database();
    await expect
      .poll(
        async () =>
          (await db.query("select status from outbound_messages where kind = 'carer-alert' and to_address = $1 and created_at >= $2", [demo.carer.email, started])).rows.map(
            (r) => r.status,
          ),
        { timeout: 60_000 },
      )
      .toEqual(["sent"]);
    const mails = await emailsTo(demo.carer.email);
    expect(mails.some((m) => m.subject === "Arthur reported an urgent problem")).toBe(true);

    // The carer's history names who answered; her Today names Arthur.
    await carer.goto("/en/more/check-ins");
    expect(await carer.locator("h1").textContent()).toBe("Arthur's past check-ins");
    expect(await carer.getByTestId("history-who").first().textContent()).toBe("Answered by Arthur Pell");
    await screenshot(carer, "portal-check-in-history-carer-en");
    await carer.goto("/en/today");
    expect(await carer.textContent("main")).toMatch(/Arthur's last check-in/);
    await carer.context().close();
  }, 180_000);
});
