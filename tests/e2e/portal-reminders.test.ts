// Issue 17 on a 390 × 844 phone: a patient turns on a leg-bag reminder by text message on More →
// Reminders, and the text arrives at the fake SMS service (through the outbox worker of the app
// server and the SMS service's SDK). Push delivery to a browser cannot be proved in headless
// Chromium; tests/integration/outbox-channels.test.ts decrypts a real push at a fake endpoint.
// The page in Arabic, right to left, with a field error.
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { queueDueReminders } from "@/lib/portal/reminders";
import { inQuietHours } from "@/lib/shared/reminder-schedule";
import { demo } from "../support/http";
import { launch, newPage, screenshot, signInAs } from "./support/browser";
import { closeDatabase, phonePage, runCheckIn, type Step } from "./support/portal";

const SMS_URL = process.env.SMS_API_URL ?? "http://127.0.0.1:4590";
const TZ = process.env.CADDIS_TIME_ZONE ?? "Europe/London";

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
  await closeDatabase();
});

/** The local time and weekday in the deployment's zone of an instant. */
function local(at: Date) {
  const parts = new Intl.DateTimeFormat("en-GB", { timeZone: TZ, hour: "2-digit", minute: "2-digit", hourCycle: "h23", weekday: "short" }).formatToParts(at);
  const get = (t: string) => parts.find((p) => p.type === t)!.value;
  return { time: `${get("hour")}:${get("minute")}`, day: ["Sun", "Mon", "Tue", "Wed", "Thu", "Fri", "Sat"].indexOf(get("weekday")) };
}

describe("reminders the patient chooses", () => {
  it("en: a patient turns on a leg-bag reminder by text, and the text arrives", async () => {
    const page = await phonePage(browser);
    await signInAs(page, demo.patient.email, demo.patient.password, "en");
    await page.goto("/en/more");
    await page.getByRole("link", { name: "Reminders" }).click();
    await page.waitForURL(/\/en\/more\/reminders$/);
    await page.getByRole("heading", { name: "Reminders", level: 1 }).waitFor();

    // Two minutes from now (rounded up to the minute), on today's weekday.
    const due = new Date(Math.ceil((Date.now() + 120_000) / 60_000) * 60_000);
    const { time, day } = local(due);
    const number = `+4477009${String(Math.floor(Math.random() * 100_000)).padStart(5, "0")}`;
    const bag = page.locator('[data-reminder="bag"]');
    await bag.getByLabel("Remind me").check();
    await bag.getByLabel("Day").selectOption(String(day));
    await bag.getByLabel("Time").fill(time);
    await bag.getByLabel("How").selectOption("sms");
    // A wrong number is refused with words next to the box, and nothing is saved.
    await page.getByLabel("Mobile number").fill("07700 900123");
    await page.getByLabel(/I agree to get text messages/).check();
    if (inQuietHours(Number(time.slice(0, 2)) * 60 + Number(time.slice(3)), "22:00", "07:00")) {
      // Run at night: no quiet hours for this test, or the text would wait until the morning.
      await page.getByLabel("From").fill("00:00");
      await page.getByLabel("Until").fill("00:00");
    }
    await page.getByRole("button", { name: "Save reminders" }).click();
    await page.getByText("Write the number with + and the country code").first().waitFor();
    await page.getByLabel("Mobile number").fill(number.replace(/^(\+44)(\d{4})/, "$1 $2 "));
    await page.getByRole("button", { name: "Save reminders" }).click();
    await page.getByText("Your reminders are saved.").waitFor();
    expect(await page.getByLabel("Mobile number").inputValue()).toBe(number);
    await screenshot(page, "reminders-en-390");

    // The scheduler's run at the reminder's time (pg-boss runs it every 5 minutes in the app).
    const r = await queueDueReminders({ now: new Date(due.getTime() + 60_000) });
    expect(r.queued).toBeGreaterThanOrEqual(1);
    const to = number.slice(1);
    let texts: { text: string }[] = [];
    for (let i = 0; i < 60 && texts.length === 0; i++) {
      texts = (await (await fetch(`${SMS_URL}/api/messages?to=${to}`)).json()) as { text: string }[];
      if (!texts.length) await new Promise((res) => setTimeout(res, 500));
    }
    expect(texts.map((m) => m.text)).toEqual(["Leg bag: It is time to change your leg bag. Wash your hands first."]);
    // A second run sends nothing more.
    await queueDueReminders({ now: new Date(due.getTime() + 120_000) });
    await new Promise((res) => setTimeout(res, 1500));
    expect(((await (await fetch(`${SMS_URL}/api/messages?to=${to}`)).json()) as unknown[]).length).toBe(1);
    await page.goto(SMS_URL);
    await page.getByText(`+${to}`).first().waitFor();
    await screenshot(page, "reminders-fake-sms-390");
    await page.context().close();
  });

  it("ar: the page reads right to left, and a missing consent is worded next to its box", async () => {
    const page = await phonePage(browser);
    await signInAs(page, demo.patientAr.email, demo.patientAr.password, "ar");
    await page.goto("/ar/more/reminders");
    await page.getByRole("heading", { name: "التذكيرات", level: 1 }).waitFor();
    expect(await page.evaluate(() => document.documentElement.dir)).toBe("rtl");
    const drinks = page.locator('[data-reminder="drinks"]');
    await drinks.getByLabel("ذكّرني").check();
    await drinks.getByLabel("الطريقة").selectOption("sms");
    await page.getByLabel("رقم الجوال").fill("+447700900555");
    await page.getByRole("button", { name: "احفظ التذكيرات" }).click();
    await page.getByText("لتلقي الرسائل النصية، ضع علامة على أنك موافق.").first().waitFor();
    // The number box stays left to right.
    expect(await page.getByLabel("رقم الجوال").evaluate((el) => getComputedStyle(el).direction)).toBe("ltr");
    await screenshot(page, "reminders-ar-390");
    await page.context().close();
  });

  it("ar on a desktop screen: the phone hint keeps the number in order", async () => {
    const page = await newPage(browser, { viewport: { width: 1280, height: 900 } });
    await signInAs(page, demo.patientAr.email, demo.patientAr.password, "ar");
    await page.goto("/ar/more/reminders");
    await page.getByRole("heading", { name: "التذكيرات", level: 1 }).waitFor();
    // The example number is isolated left to right inside the Arabic hint (U+2066 … U+2069).
    expect(await page.getByText("ابدأ بعلامة +").first().textContent()).toContain("\u2066+44 7700 900123\u2069");
    await screenshot(page, "reminders-ar-desktop");
    await page.context().close();
  });

  it("a carer chooses to be told by text; the patient's urgent check-in reaches her phone number", async () => {
    const carer = await phonePage(browser);
    await signInAs(carer, demo.carer.email, demo.carer.password);
    // Her number and consent, on the same page (no reminders for a carer).
    await carer.goto("/en/more/reminders");
    expect(await carer.locator("[data-reminder]").count()).toBe(0);
    const number = `+4477008${String(Math.floor(Math.random() * 100_000)).padStart(5, "0")}`;
    await carer.getByLabel("Mobile number").fill(number);
    await carer.getByLabel(/I agree to get text messages/).check();
    await carer.getByRole("button", { name: "Save reminders" }).click();
    await carer.getByText("Your reminders are saved.").waitFor();
    await carer.goto("/en/more");
    const toggle = carer.getByTestId("carer-alert-toggle");
    if (!(await toggle.isChecked())) {
      await toggle.check();
      await carer.getByTestId("carer-alert-saved").waitFor();
    }
    await carer.getByTestId("carer-alert-channel").selectOption("sms");
    await carer.getByTestId("carer-alert-saved").waitFor();
    await screenshot(carer, "carer-alert-by-text-en-390");

    const patient = await phonePage(browser);
    await signInAs(patient, demo.patient.email, demo.patient.password);
    // common practice, no source — a catheter that does not drain is urgent.
    const no4: Step[] = ["no", "no", "no", "no"];
    const result = await runCheckIn(patient, [...no4, "not-taken", "no", "none", "under-12", "none", "none", "done"]);
    expect(await result.getAttribute("data-level")).toBe("urgent");
    const to = number.slice(1);
    let texts: { text: string }[] = [];
    for (let i = 0; i < 90 && texts.length === 0; i++) {
      texts = (await (await fetch(`${SMS_URL}/api/messages?to=${to}`)).json()) as { text: string }[];
      if (!texts.length) await new Promise((res) => setTimeout(res, 500));
    }
    expect(texts).toHaveLength(1);
    expect(texts[0].text).toMatch(/^Arthur reported an urgent problem\./);
    // Back to e-mail, as the demo carer had it, for the files after this one.
    await carer.getByTestId("carer-alert-channel").selectOption("email");
    await carer.getByTestId("carer-alert-saved").waitFor();
    await carer.context().close();
    await patient.context().close();
  });
});
