// Transfer of care in Chromium, as the people involved do it: the ward nurse registers a patient,
// records the insertion, fills the discharge checklist and refers to the community team, and
// issues the passport; the community nurse sees "Referred to you", accepts and reissues; the
// device card, the booklet (pdftoppm) and the patient's Get help then give the community team and
// its out-of-hours number; the GP summaries in the fake inbox carry the action line, the supplies
// and the TWOC date, and the second says what it replaces. A declined and an unanswered referral
// too. Screenshots (390 × 844 and desktop; en, pl, ar) and the booklet page go to test-results/.
import { execFileSync } from "node:child_process";
import { randomUUID } from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { eq } from "drizzle-orm";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db";
import { organisations, referrals } from "@/db/schema";
import { sendReferralReminders } from "@/lib/email/referral-mail";
import { demoDevice } from "../support/fixtures";
import { demo } from "../support/http";
import { emailsTo, waitForEmails } from "../support/mail";
import { PHONE } from "./support/portal";
import { baseUrl, launch, newPage, screenshot, screenshotDir, signInAs } from "./support/browser";

const outDir = path.resolve(screenshotDir, "..");
const tag = randomUUID().slice(0, 8);
const gpInbox = `gp.toc.${tag}@eastmere.example`;
const origin = new URL(baseUrl).origin;
/** Text as read: phone numbers are isolated (U+2066…U+2069) with no-break spaces, for right-to-left pages. */
const plain = (t: string) => t.replace(/[\u2066-\u2069]/g, "").replace(/\u00a0/g, " ");

let browser: Browser;
let ward: Page;
let community: Page;
let gpId: string;
const org: Record<string, string> = {};

async function post(page: Page, url: string, data: unknown) {
  const res = await page.request.post(url, { data, headers: { origin } });
  const body = await res.text();
  expect(res.status(), body.slice(0, 400)).toBeLessThan(300);
  return JSON.parse(body);
}

/** Registration and insertion go through the same routes the forms use (their own e2e tests cover the forms). */
async function registerWithCatheter(familyName: string, preferredLocale = "en") {
  const { patient } = await post(ward, "/api/patients", {
    givenName: "Nora",
    familyName,
    healthRecordNumber: `TOC-${tag}-${familyName}`.slice(0, 17).toUpperCase(),
    dateOfBirth: "1941-03-09",
    sex: "female",
    preferredLocale,
    allergies: { latex: "no", chlorhexidine: "no", lidocaine: "no", other: "" },
    gpPracticeId: gpId,
    careTeamOrganisationIds: [org["Larch Ward"]],
  });
  await post(ward, `/api/patients/${patient.id}/episodes`, {
    ...demoDevice,
    lengthCategory: "female",
    lot: "LW2231",
    expiry: "2029-05-31",
    indication: "Acute urinary retention",
    insertedAt: new Date(Date.now() - 2 * 3_600_000).toISOString(),
    gelKind: "plain",
    gelVolumeMl: 6,
    attempts: 2,
    difficulties: "Second attempt needed; went in easily with more gel",
    overrides: [],
  });
  return patient.id as string;
}

/** The ward nurse's referral through the Care team tab. */
async function referThroughForm(patientId: string, { withChecklist }: { withChecklist: boolean }) {
  await ward.goto(`/en/patients/${patientId}/care-team`);
  const form = ward.getByTestId("referral-form");
  await form.getByLabel("Search the directory").fill("Harbour");
  await expect.poll(() => form.getByTestId("directory").locator("li").count(), { timeout: 20_000 }).toBe(1);
  await form.getByLabel(/Harbourside Community Nursing Team/).check();
  await form.getByLabel("Handover note").fill("Home today with a long-term catheter (retention). Daughter helps in the mornings. First change due in 12 weeks.");
  await form.getByLabel("leaves the care team").check();
  if (withChecklist) {
    for (const item of ["Emptying the bag", "Changing the bags", "Leg bag and night bag", "When to get help, and who to call"]) await form.getByLabel(item).check();
    await form.getByTestId("checklist-supplies").getByLabel("Yes").check();
    await form.getByLabel("For how many days").fill("7");
    await form.getByLabel("Catheter valve").check();
    await form.getByLabel("Planned trial without catheter").fill("2027-01-14");
    await form.getByLabel("First community visit").fill("2026-12-05");
    await form.getByTestId("checklist-portal").getByLabel("No").check();
  } else {
    await form.getByTestId("checklist-supplies").getByLabel("No").check();
    await form.getByTestId("checklist-portal").getByLabel("No").check();
  }
  await form.getByTestId("referral-submit").click();
  await expect.poll(() => ward.getByTestId("referral-sent").isVisible()).toBe(true);
}

beforeAll(async () => {
  browser = await launch();
  for (const o of await db.select({ id: organisations.id, name: organisations.name }).from(organisations)) org[o.name] = o.id;
  const [gp] = await db
    .insert(organisations)
    .values({ name: `Transfer Surgery ${tag}`, kind: "gp_practice", phone: "01632 960 388", inboxEmail: gpInbox, locale: "en" })
    .returning({ id: organisations.id });
  gpId = gp.id;
  ward = await newPage(browser, { viewport: { width: 1280, height: 900 } });
  await signInAs(ward, demo.wardNurse.email, demo.wardNurse.password);
  community = await newPage(browser, { viewport: { width: 1280, height: 900 } });
  await signInAs(community, demo.communityNurse.email, demo.communityNurse.password);
}, 120_000);

afterAll(async () => {
  await browser?.close();
});

describe("transfer of care", () => {
  let patientId: string;
  let token: string;

  it("the ward refers, the community team accepts, and every contact follows", async () => {
    patientId = await registerWithCatheter(`Hale${tag}`);
    await referThroughForm(patientId, { withChecklist: true });
    // The checklist is on the record with what was not taught said plainly.
    await ward.reload();
    await expect.poll(() => ward.getByTestId("checklist-summary").innerText()).toContain("Not taught: Washing around the catheter");
    await expect.poll(async () => plain(await ward.getByTestId("pending-referrals").innerText())).toContain("Waiting for Harbourside Community Nursing Team");
    await screenshot(ward, "transfer-ward-care-team-en");
    // The ward issues the passport while it still leads: its GP summary is no. 1.
    await post(ward, `/api/patients/${patientId}/passport`, { reissue: true });

    // The community nurse sees the referral on top of the caseload and accepts it.
    await community.goto("/en/caseload");
    const incoming = community.getByTestId("incoming-referral").filter({ hasText: `Hale${tag}` });
    await expect.poll(async () => plain(await incoming.innerText())).toContain("From Larch Ward, Tomasz Reid");
    await screenshot(community, "transfer-caseload-referred-en");
    await incoming.getByTestId("referral-accept").click();
    await expect.poll(() => community.getByTestId("referral-answered").innerText()).toContain("your team now leads");

    await community.goto(`/en/patients/${patientId}/care-team`);
    await expect.poll(() => community.getByTestId("care-team-list").innerText()).toContain("Harbourside Community Nursing Team");
    expect(await community.getByTestId("care-team-list").innerText()).not.toContain("Larch Ward");
    expect(plain(await community.getByTestId("lead-contact").innerText())).toContain("01632 960 299");
    await expect.poll(() => community.getByTestId("transfer-timeline").innerText()).toContain("Referral accepted");
    await screenshot(community, "transfer-community-care-team-en");

    // The community team reissues the passport: its booklet and card now name the community team.
    const issued = await post(community, `/api/patients/${patientId}/passport`, { reissue: true });
    token = issued.url.split("/p/")[1];
  }, 180_000);

  it("the device card gives the community team, its out-of-hours number, and what a nurse needs before recatheterising", async () => {
    const card = await newPage(browser, PHONE);
    await card.goto(`/en/p/${token}`);
    expect(await card.getByTestId("card-team").innerText()).toBe("Harbourside Community Nursing Team");
    expect(plain(await card.getByTestId("card-phone").innerText())).toContain("01632 960 210");
    expect(plain(await card.getByTestId("card-out-of-hours").innerText())).toContain("01632 960 299");
    expect(await card.getByTestId("card-drainage").first().innerText()).toBe("Catheter valve");
    expect(await card.getByTestId("card-lot").first().innerText()).toBe("LW2231");
    expect(await card.getByTestId("card-insertion").first().innerText()).toContain("The last insertion was difficult");
    await screenshot(card, "transfer-device-card-en-phone");
    // An English-speaking patient's card is in English alone, whatever the reader's language.
    expect(await card.locator("section[lang]").first().getAttribute("lang")).toBe("en");
    for (const locale of ["pl", "ar"]) {
      await card.goto(`/${locale}/p/${token}`);
      await screenshot(card, `transfer-device-card-${locale}-phone`);
    }
  }, 120_000);

  it("the booklet prints the community team, the out-of-hours number and the discharge checklist", async () => {
    const res = await community.request.get(`/api/patients/${patientId}/passport/pdf`);
    expect(res.status()).toBe(200);
    fs.mkdirSync(outDir, { recursive: true });
    const file = path.join(outDir, "transfer-booklet.pdf");
    fs.writeFileSync(file, await res.body());
    const text = execFileSync("pdftotext", ["-layout", file, "-"]).toString();
    expect(text).toContain("Harbourside Community Nursing Team");
    expect(text).toContain("01632 960 299");
    expect(text).toContain("Not yet shown");
    expect(text).not.toContain("01632 960 101"); // the ward's number is gone
    // Every page as an image, to look at (the contacts page holds the checklist).
    execFileSync("pdftoppm", ["-png", "-r", "80", file, path.join(outDir, "transfer-booklet")]);
  }, 120_000);

  it("Get help in the patient's portal gives the community team's numbers", async () => {
    const { code } = await post(community, `/api/patients/${patientId}/invite`, {});
    const patient = await newPage(browser, PHONE);
    await patient.context().setExtraHTTPHeaders({ "x-forwarded-for": `10.78.0.${Math.floor(Math.random() * 200)}` });
    const activated = await patient.request.post("/api/activate", {
      data: { code, email: `nora.${tag}@eastmere.example`, password: `Nora-${tag}-long-password` },
      headers: { origin },
    });
    expect(activated.status(), await activated.text()).toBe(201);
    await patient.goto("/en/help");
    const help = plain(await patient.locator("main").innerText());
    expect(help).toContain("Harbourside Community Nursing Team");
    expect(help).toContain("01632 960 299");
    expect(help).not.toContain("Larch Ward");
    await screenshot(patient, "transfer-get-help-en-phone");
  }, 120_000);

  it("the GP summaries carry the action line, the supplies and the TWOC date; the second says what it replaces", async () => {
    // No. 1 is the insertion's, no. 2 the ward's passport, no. 3 the community team's reissue.
    const mails = await waitForEmails(gpInbox, 3, { timeoutMs: 60_000 });
    const byNumber = (n: number) => mails.find((m) => m.attachments?.some((a) => a.filename.endsWith(`-no${n}.pdf`)));
    expect(byNumber(1)?.subject).toContain("catheter inserted");
    const first = { ...byNumber(2)!, text: byNumber(2)?.text ?? "" };
    const second = { ...byNumber(3)!, text: byNumber(3)?.text ?? "", html: byNumber(3)?.html ?? "" };
    expect(first.subject).toContain("passport issued");
    expect(first.text.indexOf("For the practice")).toBeLessThan(first.text.indexOf("Patient"));
    expect(first.text).toContain("Awaiting trial without catheter on Thursday, 14 January 2027");
    expect(first.text).toMatch(/Supplies for \d+ days/);
    expect(first.text).toMatch(/valve/i);
    expect(first.text).toContain("Not taught: washing around the catheter");
    expect(first.text).toContain("Larch Ward, 01632 960 101");
    expect(second.text).toContain("This is summary no. 3 for this patient. It replaces the one of");
    expect(second.text).toContain("Referral accepted: a new lead team");
    expect(second.text).toContain("Harbourside Community Nursing Team, 01632 960 210 (out of hours 01632 960 299)");
    const page = await newPage(browser, { viewport: { width: 760, height: 1000 } });
    await page.setContent(second.html);
    await screenshot(page, "transfer-gp-summary-2");
  }, 120_000);

  it("a declined referral: the reason goes back and the ward keeps the patient", async () => {
    const id = await registerWithCatheter(`Voss${tag}`, "pl");
    await referThroughForm(id, { withChecklist: false });
    await community.goto("/en/caseload");
    const incoming = community.getByTestId("incoming-referral").filter({ hasText: `Voss${tag}` });
    await incoming.getByTestId("referral-decline").click();
    await incoming.getByLabel("Why you decline").fill("Outside our area: the Westside team covers this address");
    // The answer is the route's; the card may leave the list as soon as the caseload refreshes,
    // so its "declined" line is not waited for.
    const [answer] = await Promise.all([
      community.waitForResponse((r) => /\/api\/referrals\/[^/]+\/decline$/.test(new URL(r.url()).pathname) && r.request().method() === "POST"),
      incoming.getByTestId("referral-decline-send").click(),
    ]);
    expect(answer.status()).toBeLessThan(300);
    await community.goto("/en/caseload");
    await expect.poll(() => community.getByTestId("incoming-referral").filter({ hasText: `Voss${tag}` }).count()).toBe(0);
    await ward.goto("/en/caseload");
    const declined = ward.getByTestId("referral-declined").filter({ hasText: `Voss${tag}` });
    await expect.poll(() => declined.innerText()).toContain("Outside our area");
    await screenshot(ward, "transfer-caseload-declined-en");
    // A Polish-speaking patient's card: on /en the English half comes first, on /pl the Polish.
    const { url } = await post(ward, `/api/patients/${id}/passport`, { reissue: true });
    const card = await newPage(browser, PHONE);
    for (const [locale, first] of [["en", "en"], ["pl", "pl"]] as const) {
      await card.goto(`/${locale}/p/${url.split("/p/")[1]}`);
      expect(await card.locator("section[lang]").evaluateAll((s) => s.map((e) => e.getAttribute("lang")))).toEqual(first === "en" ? ["en", "pl"] : ["pl", "en"]);
      await screenshot(card, `transfer-device-card-pl-patient-on-${locale}`);
    }
    // The ward still leads: the patient keeps its numbers.
    await ward.goto(`/pl/patients/${id}/care-team`);
    await expect.poll(() => ward.getByTestId("care-team-list").innerText()).toContain("Larch Ward");
    await screenshot(ward, "transfer-care-team-pl");
    await ward.goto(`/ar/patients/${id}/care-team`);
    await screenshot(ward, "transfer-care-team-ar");
  }, 180_000);

  it("an unanswered referral is flagged on the ward's caseload and sent again to the community team", async () => {
    const id = await registerWithCatheter(`Ash${tag}`);
    await referThroughForm(id, { withChecklist: false });
    await db.update(referrals).set({ createdAt: new Date(Date.now() - 25 * 3_600_000) }).where(eq(referrals.patientId, id));
    await ward.goto("/en/caseload");
    const flagged = ward.getByTestId("referral-unanswered").filter({ hasText: `Ash${tag}` });
    await expect.poll(async () => plain(await flagged.innerText())).toContain("not answered by Harbourside Community Nursing Team");
    await screenshot(ward, "transfer-caseload-unanswered-en");
    const phone = await newPage(browser, PHONE);
    await signInAs(phone, demo.wardNurse.email, demo.wardNurse.password, "ar");
    await phone.goto("/ar/caseload");
    await screenshot(phone, "transfer-caseload-ar-phone");
    // The schedule's sweep: the reminder goes to the community team's inbox through the outbox.
    expect((await sendReferralReminders()).sent).toBeGreaterThanOrEqual(1);
    const hrn = `TOC-${tag}-Ash${tag}`.slice(0, 17).toUpperCase();
    await expect
      .poll(async () => (await emailsTo("harbourside.team@eastmere.example")).some((m) => m.subject.includes("Referral still waiting") && m.subject.includes(hrn)), { timeout: 60_000 })
      .toBe(true);
  }, 180_000);
});
