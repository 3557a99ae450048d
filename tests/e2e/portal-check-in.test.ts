// "How am I?" on a 390 × 844 phone in Chromium: scripted answer sets give the expected level
// (word, mark and colour together), the result is stored once, and a check-in made offline is
// kept on the phone and delivered exactly once when the network returns.
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { demo } from "../support/http";
import { launch, screenshot, signInAs } from "./support/browser";
import { closeDatabase, database, phonePage, runCheckIn, type Step } from "./support/portal";

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
  await closeDatabase();
});

const no4: Step[] = ["no", "no", "no", "no"]; // confusion, breathless, very unwell, shivering

// Expected levels follow triageCheckIn's rules (lib/clinical/triage.ts), each with its source.
const scripts: { name: string; steps: Step[]; level: string; reason?: RegExp; advice?: RegExp }[] = [
  {
    // Source: NICE NG51 — new confusion is a high-risk sepsis sign; the first question ends the check-in.
    name: "new confusion",
    steps: ["yes"],
    level: "emergency",
    reason: /newly confused/,
  },
  {
    // Source: IDSA CA-UTI 2010 — rigors with fever (≥ 38 °C).
    name: "shaking with 38.6 °C",
    steps: ["no", "no", "no", "yes", { temperature: "38.6" }],
    level: "emergency",
    reason: /shaking and your temperature/,
  },
  {
    // common practice, no source — a catheter that does not drain is urgent.
    name: "nothing draining for under 12 hours",
    steps: [...no4, "not-taken", "no", "none", "under-12", "none", "none", "done"],
    level: "urgent",
    reason: /not draining/,
    advice: /bent or kinked/,
  },
  {
    // Source: IDSA CA-UTI 2010 — acute haematuria (red urine or clots).
    name: "red urine, normal temperature",
    steps: [...no4, { temperature: "37.2" }, "no", "yes", "none", "red", "done"],
    level: "urgent",
    reason: /red or has clots/,
  },
  {
    // common practice, no source — some pain is for the team within a day.
    name: "some pain",
    steps: [...no4, "not-taken", "no", "yes", "mild", "none", "done"],
    level: "soon",
    reason: /some pain/,
  },
  {
    // Source: NICE NG113 1.1.1, QS90 — cloudy or smelly urine alone: self-care, no antibiotics, no dipstick.
    name: "cloudy urine only",
    steps: [...no4, "not-taken", "no", "yes", "none", "none", "cloudyOrSmelly", "done"],
    level: "self-care",
    advice: /does not need antibiotics/,
  },
  {
    // Nothing wrong: self-care, in 10 taps.
    name: "all well",
    steps: [...no4, "not-taken", "no", "yes", "none", "none", "done"],
    level: "self-care",
  },
];

describe("check-in on a phone", () => {
  describe("a patient signs in and gets the expected level for each scripted answer set", () => {
    let page: Page;
    beforeAll(async () => {
      page = await phonePage(browser);
      await signInAs(page, demo.patient.email, demo.patient.password);
    });
    afterAll(async () => {
      await page?.context().close();
    });
    const words: Record<string, RegExp> = { emergency: /Emergency: call now/, urgent: /Urgent: get help today/, soon: /Soon: tell your care team/, "self-care": /Self-care at home/ };

    for (const s of scripts) {
      it(`${s.name} → ${s.level}`, async () => {
        expect(s.steps.length, `${s.name}: at most about 10 taps`).toBeLessThanOrEqual(11);
        const result = await runCheckIn(page, s.steps);
        expect(await result.getAttribute("data-level"), s.name).toBe(s.level);
        // Word, mark and colour together: the badge has the level's word and an SVG mark.
        const badge = result.locator(`[data-level="${s.level}"]`).first();
        expect(await badge.textContent()).toMatch(words[s.level]);
        expect(await badge.locator("svg").count()).toBe(1);
        if (s.reason) expect(await result.textContent()).toMatch(s.reason);
        if (s.advice) expect(await result.textContent()).toMatch(s.advice);
        // The emergency number and the care team's number as tel: links.
        expect(await page.locator('[data-testid="check-in-result"] a[href="tel:999"]').count()).toBeGreaterThan(0);
        expect(await page.locator('[data-testid="check-in-result"] a[href^="tel:01632"]').count()).toBeGreaterThan(0);
        await expect.poll(() => result.getAttribute("data-delivery"), { timeout: 15_000 }).toBe("sent");
        await screenshot(page, `portal-check-in-result-${s.level}-${s.name.replace(/[^a-z0-9]+/gi, "-")}-en`);
      });
    }

    it("Today then shows the last check-in and its advice", async () => {
      await page.goto("/en/today");
      expect(await page.locator("[data-level]").first().getAttribute("data-level")).toBe("self-care");
      expect(await page.textContent("main")).toMatch(/You can look after this at home/);
    });
  });

  it("shows the result in Arabic, right to left, with the same level", async () => {
    const page = await phonePage(browser);
    await signInAs(page, demo.patientAr.email, demo.patientAr.password, "ar");
    // Suprapubic catheter out: urgent (common practice, no source — the tract can close); no drainage questions after it.
    const result = await runCheckIn(page, [...no4, "not-taken", "yes", "none", "none", "done"], "ar");
    expect(await result.getAttribute("data-level")).toBe("urgent");
    expect(await result.textContent()).toMatch(/خرجت قسطرة البطن/);
    expect(await page.locator("html").getAttribute("dir")).toBe("rtl");
    await screenshot(page, "portal-check-in-result-urgent-ar");
    const emergency = await runCheckIn(page, ["yes"], "ar");
    expect(await emergency.getAttribute("data-level")).toBe("emergency");
    await screenshot(page, "portal-check-in-result-emergency-ar");
    await page.context().close();
  });

  it("keeps a check-in made offline on the phone and delivers it once when the network returns", async () => {
    const page = await phonePage(browser);
    await signInAs(page, demo.patient.email, demo.patient.password);
    await page.goto("/en/check-in");
    await page.waitForSelector("[data-question]");
    await page.context().setOffline(true);
    // Answered offline: the level is worked out on the phone (lib/clinical) and shown at once.
    const steps: Step[] = [...no4, "not-taken", "no", "none", "under-12", "none", "none", "done"];
    for (const step of steps) {
      const q = await page.locator("[data-question]").getAttribute("data-question");
      await page.locator(`[data-question="${q}"] [data-answer="${step}"]`).click();
      await page.waitForFunction((x) => !!document.querySelector('[data-testid="check-in-result"]') || document.querySelector("[data-question]")?.getAttribute("data-question") !== x, q);
    }
    const result = page.locator('[data-testid="check-in-result"]');
    expect(await result.getAttribute("data-level")).toBe("urgent");
    await expect.poll(() => result.getAttribute("data-delivery")).toBe("waiting");
    expect(await page.getByTestId("delivery").textContent()).toMatch(/Not sent yet/);
    await screenshot(page, "portal-check-in-offline-waiting-en");

    // The phone's outbox holds only the patient id, the key, the answers and when they were given (ASVS 14.3.3).
    const outbox = await page.evaluate(() => JSON.parse(localStorage.getItem("caddis.checkInOutbox.v1") ?? "[]"));
    expect(outbox).toHaveLength(1);
    expect(Object.keys(outbox[0]).sort()).toEqual(["answeredAt", "answers", "idempotencyKey", "patientId"]);
    const key: string = outbox[0].idempotencyKey;
    const count = async () => (await database().query<{ n: number }>("select count(*)::int as n from check_ins where idempotency_key = $1", [key])).rows[0].n;
    expect(await count()).toBe(0);

    await page.context().setOffline(false);
    await expect.poll(() => result.getAttribute("data-delivery"), { timeout: 45_000 }).toBe("sent");
    expect(await count()).toBe(1);
    expect(await page.evaluate(() => localStorage.getItem("caddis.checkInOutbox.v1"))).toBeNull();

    // A resend of the same key (a retry on load from another tab that still had it) is not a second check-in.
    await page.evaluate((item) => localStorage.setItem("caddis.checkInOutbox.v1", JSON.stringify([item])), outbox[0]);
    await page.goto("/en/today");
    await expect.poll(() => page.evaluate(() => localStorage.getItem("caddis.checkInOutbox.v1")), { timeout: 30_000 }).toBeNull();
    expect(await count()).toBe(1);
    const { rows } = await database().query<{ level: string }>("select level from check_ins where idempotency_key = $1", [key]);
    expect(rows[0].level).toBe("urgent");
    await page.context().close();
  });

  it("sends a check-in left waiting when the page is opened again (retry on load)", async () => {
    const page = await phonePage(browser);
    await signInAs(page, demo.patient.email, demo.patient.password);
    const { rows } = await database().query<{ id: string }>("select id from patients where health_record_number = 'EM-100-001'");
    const key = "6f2b3c1e-8d4a-4f5b-9c7d-2e1f0a9b8c7d";
    await page.evaluate(
      ([patientId, k]) => localStorage.setItem("caddis.checkInOutbox.v1", JSON.stringify([{ patientId, idempotencyKey: k, answers: { draining: "yes", pain: "mild" } }])),
      [rows[0].id, key],
    );
    await page.goto("/en/diary");
    await expect.poll(async () => (await database().query("select 1 from check_ins where idempotency_key = $1", [key])).rowCount, { timeout: 30_000 }).toBe(1);
    await page.context().close();
  });

  it("serves the offline page from the service worker when a portal page cannot load", async () => {
    const page = await phonePage(browser);
    await signInAs(page, demo.patient.email, demo.patient.password);
    await page.goto("/en/today");
    await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined));
    // Wait until the worker has cached the offline pages (it claims the page when done).
    await expect.poll(() => page.evaluate(() => caches.keys().then(async (k) => (k.length ? (await caches.open(k[0])).match("/en/offline").then(Boolean) : false))), { timeout: 30_000 }).toBe(true);
    // It caches no page with patient data: only the offline pages and static files.
    const cached = await page.evaluate(async () => {
      const out: string[] = [];
      for (const k of await caches.keys()) for (const r of await (await caches.open(k)).keys()) out.push(new URL(r.url).pathname);
      return out;
    });
    expect(cached.filter((p) => !/^\/(en|es|pl|ro|ar|ur)\/offline$|^\/_next\/static\/|^\/icon|^\/manifest/.test(p))).toEqual([]);
    await page.context().setOffline(true);
    await page.goto("/en/diary").catch(() => undefined);
    await page.waitForSelector('[data-testid="offline-page"]', { timeout: 15_000 });
    expect(await page.locator('[data-testid="offline-page"] a[href="tel:999"]').count()).toBe(1);
    await screenshot(page, "portal-offline-en");
    await page.context().close();
  });
});
