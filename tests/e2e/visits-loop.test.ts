// Issue 16 in Chromium: the loop closed. A patient's urgent check-in; a visiting clinician (Rowan
// Ward, through visit access) records observations — RR 21, SpO2 93 % on air, BP 120, pulse 95,
// alert, 37.5 °C, NEWS2 5 medium — and sees the values beside their sub-scores at once, under
// "Earlier observations" and in History; the alert reaches the team's inbox naming the reporter
// and not the patient; the community nurse acknowledges both on the caseload; the patient sees
// "Your care team saw this at …" on Today on a 390 × 844 phone, in English and Arabic.
import { randomUUID } from "node:crypto";
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { demo } from "../support/http";
import { emailsTo } from "../support/mail";
import { launch, newPage, screenshot, signInAs } from "./support/browser";
import { closeDatabase, database, patientIdByHrn, phonePage, runCheckIn, type Step } from "./support/portal";

let browser: Browser;
let arthur: string;
const tag = randomUUID().slice(0, 8);
const note = `Breathless on the stairs since yesterday (${tag}).`;
const no4: Step[] = ["no", "no", "no", "no"];

beforeAll(async () => {
  browser = await launch();
  arthur = await patientIdByHrn("EM-100-001");
  const { rows } = await database().query<{ id: string }>("select id from \"user\" where email = $1", [demo.rowanNurse.email]);
  await database().query("insert into visit_access (patient_id, user_id, reason, expires_at) values ($1, $2, $3, now() + interval '2 hours')", [
    arthur,
    rows[0]!.id,
    `Visiting for the care team (${tag})`,
  ]);
});
afterAll(async () => {
  await browser?.close();
  await closeDatabase();
});

describe("visits and reports that close the loop", () => {
  let checkInId: string;

  it("the patient's urgent check-in tells them the team has been told", async () => {
    const page = await phonePage(browser);
    await signInAs(page, demo.patient.email, demo.patient.password);
    // common practice, no source — a catheter that does not drain is urgent.
    const result = await runCheckIn(page, [...no4, "not-taken", "no", "none", "under-12", "none", "none", "done"]);
    expect(await result.getAttribute("data-level")).toBe("urgent");
    await expect.poll(() => result.getAttribute("data-delivery"), { timeout: 15_000 }).toBe("sent");
    const { rows } = await database().query<{ id: string }>("select id from check_ins where patient_id = $1 order by created_at desc limit 1", [arthur]);
    checkInId = rows[0]!.id;
    await page.goto("/en/today");
    await expect.poll(() => page.getByTestId("recent-check-in").first().getAttribute("data-level")).toBe("urgent");
    expect(await page.getByTestId("care-team-told").first().textContent()).toContain("Your care team has been told");
    await page.context().close();
  });

  it("a visiting clinician records NEWS2 5 (medium) and sees the values beside the sub-scores, under Earlier observations and in History", async () => {
    const page = await newPage(browser, { viewport: { width: 820, height: 1180 }, hasTouch: true });
    await signInAs(page, demo.rowanNurse.email, demo.rowanNurse.password);
    await page.goto(`/en/patients/${arthur}/record/visit`);
    await page.getByTestId("visit-notes").fill(note);
    // The structured visit: one screen, for a tablet.
    await page.locator("fieldset", { hasText: "Draining well?" }).getByLabel("Yes").check();
    await page.locator("fieldset", { hasText: "Bypassing" }).getByLabel("No").check();
    await page.getByLabel("Clear", { exact: true }).check();
    await page.getByLabel("Healthy", { exact: true }).check();
    await page.getByLabel("Bag changed").check();
    await page.getByTestId("finding-sample").check();
    await page.getByTestId("finding-advice").fill("Drink 2 litres a day; keep the bag below the bladder.");
    await page.getByTestId("finding-next-visit").fill(new Date(Date.now() + 7 * 86_400_000).toISOString().slice(0, 10));
    // Source: RCP NEWS2 (2017), chart 1: RR 21 → 2, SpO2 93 % (scale 1) → 2, air → 0, SBP 120 → 0,
    // pulse 95 → 1, alert → 0, 37.5 °C → 0: total 5, medium (chart 4: urgent response).
    await page.getByTestId("obs-respirationRate").fill("21");
    await page.getByTestId("obs-spo2").fill("93");
    await page.getByTestId("obs-systolicBp").fill("120");
    await page.getByTestId("obs-pulse").fill("95");
    await page.getByTestId("obs-temperatureC").fill("37.5");
    await expect.poll(() => page.getByTestId("news2-panel").getAttribute("data-risk")).toBe("medium");
    await screenshot(page, "visit-form-news2-en-820");
    await page.getByTestId("visit-save").click();
    const saved = page.getByTestId("news2-saved");
    await saved.waitFor();
    expect(await saved.getByTestId("news2-total").textContent()).toContain("Total 5");
    const values = (await saved.getByTestId("news2-values").textContent()) ?? "";
    for (const v of ["21 /min", "93 % (scale 1)", "Air", "120 mmHg", "95 /min", "A · Alert", "37.5 °C"]) expect(values).toContain(v);
    expect(await saved.locator('tr[data-parameter="spo2"] td').last().textContent()).toBe("2");
    expect(await page.getByTestId("visit-alerted").textContent()).toContain("alerted");
    expect(await page.getByTestId("visit-sample-chase").textContent()).toContain("result is on the caseload");
    // Earlier observations now holds the visit just saved (it said "none" before).
    await expect.poll(() => page.getByTestId("news2-previous").first().locator('tr[data-parameter="respirationRate"]').textContent()).toContain("21 /min");
    await screenshot(page, "visit-saved-en-820");

    await page.goto(`/en/patients/${arthur}/history`);
    const inHistory = page.getByTestId("history-news2").first();
    await inHistory.waitFor();
    expect(await inHistory.getAttribute("data-risk")).toBe("medium");
    expect(await inHistory.getByTestId("news2-values").textContent()).toContain("93 % (scale 1)");
    expect(await page.getByTestId("history-timeline").textContent()).toContain(note);
    expect(await page.getByTestId("visit-findings").first().textContent()).toContain("Draining: Yes");
    // The trend charts (recharts SVG) and their text equivalent.
    await page.getByTestId("observation-trends").waitFor();
    expect(await page.locator('[data-testid="trend-respirationRate"] .recharts-line').count()).toBeGreaterThan(0);
    expect(await page.locator('[data-testid="trend-total"] .recharts-reference-area').count()).toBeGreaterThan(0);
    const firstRow = page.getByTestId("observation-table").locator("tbody tr").first();
    expect((await firstRow.textContent())?.replace(/\s+/g, " ")).toMatch(/5 · Medium.*21 \(2\).*93 % \(2\).*120 \(0\).*95 \(1\).*A \(0\).*37\.5 \(0\)/);
    await screenshot(page, "visit-history-en-820");
    await page.goto(`/ar/patients/${arthur}/history`);
    await page.getByTestId("observation-trends").waitFor();
    expect(await page.locator("html").getAttribute("dir")).toBe("rtl");
    await screenshot(page, "visit-history-ar-820");
    await page.goto(`/ar/patients/${arthur}/record/visit`);
    await page.getByTestId("visit-form").waitFor();
    await screenshot(page, "visit-form-ar-820");
    await page.context().close();
  });

  it("the alert reaches the team's inbox with the reporter's name and notes, and no patient name", async () => {
    let mail: Awaited<ReturnType<typeof emailsTo>>[number] | undefined;
    await expect
      .poll(
        async () => {
          mail = (await emailsTo("harbourside.team@eastmere.example")).find((m) => m.subject.includes("NEWS2") && (m.text ?? "").includes(tag));
          return Boolean(mail);
        },
        { timeout: 30_000 },
      )
      .toBe(true);
    expect(mail!.subject).toBe("Caddis NEWS2 Medium: patient EM-100-001");
    expect(mail!.text).toContain("Visiting clinician: Priya Sandhu, Rowan Ward");
    expect(mail!.text).toContain(note);
    expect(`${mail!.subject} ${mail!.text} ${mail!.html}`).not.toMatch(/Arthur|Pell/);
  });

  it("the community nurse acknowledges the check-in and the NEWS2 on the caseload", async () => {
    const page = await newPage(browser, { viewport: { width: 1280, height: 900 } });
    await signInAs(page, demo.communityNurse.email, demo.communityNurse.password);
    await page.goto("/en/caseload");
    const { rows } = await database().query<{ id: string; kind: string }>(
      "select id, kind from caseload_items where patient_id = $1 and closed_at is null and (check_in_id = $2 or reporter_notes = $3)",
      [arthur, checkInId, note],
    );
    expect(rows.map((r) => r.kind).sort()).toEqual(["check-in", "news2"]);
    const news2 = rows.find((r) => r.kind === "news2")!;
    const checkIn = rows.find((r) => r.kind === "check-in")!;
    const news2Form = page.getByTestId(`acknowledge-form-${news2.id}`);
    await news2Form.waitFor();
    await screenshot(page, "caseload-to-acknowledge-en-1280");
    await news2Form.getByLabel("Visited").check();
    await news2Form.getByTestId("acknowledge-note").fill("Visited this afternoon; repeat observations 3, GP informed.");
    await news2Form.getByTestId("acknowledge-submit").click();
    await news2Form.waitFor({ state: "detached" });
    const checkInForm = page.getByTestId(`acknowledge-form-${checkIn.id}`);
    // "Other" needs a note: refused first, then accepted.
    await checkInForm.getByLabel(/^Other/).check();
    await checkInForm.getByTestId("acknowledge-submit").click();
    await expect.poll(() => checkInForm.textContent()).toContain("This is needed.");
    await checkInForm.getByLabel("Phoned the patient").check();
    await checkInForm.getByTestId("acknowledge-note").fill("Bag was kinked; draining again.");
    await checkInForm.getByTestId("acknowledge-submit").click();
    await checkInForm.waitFor({ state: "detached" });
    const { rows: closed } = await database().query<{ action: string; closed_by_name: string }>("select action, closed_by_name from caseload_items where id = any($1) order by kind", [
      [checkIn.id, news2.id],
    ]);
    expect(closed).toEqual([
      { action: "phoned", closed_by_name: "Grace Mensah" },
      { action: "visited", closed_by_name: "Grace Mensah" },
    ]);
    await page.context().close();
  });

  it("the patient sees that the care team saw it, on a 390 × 844 phone, in English and Arabic", async () => {
    const page = await phonePage(browser);
    await signInAs(page, demo.patient.email, demo.patient.password);
    await page.goto("/en/today");
    const first = page.getByTestId("recent-check-in").first();
    await expect.poll(() => first.getByTestId("care-team-saw").textContent()).toMatch(/^Your care team saw this at \d{2}:\d{2}$/);
    await screenshot(page, "today-care-team-saw-en-390");
    await page.goto("/ar/today");
    await expect.poll(() => page.getByTestId("care-team-saw").first().textContent()).toContain("اطّلع فريق الرعاية");
    expect(await page.locator("html").getAttribute("dir")).toBe("rtl");
    await screenshot(page, "today-care-team-saw-ar-390");
    await page.context().close();
  });
});
