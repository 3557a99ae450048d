// Every demo role signs in and reaches its own home; no role opens another role's pages,
// even with the header that once let requests skip Next.js middleware (CVE-2025-29927).
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { demo } from "../support/http";
import { baseUrl, launch, newPage, screenshot, signInAs } from "./support/browser";

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

const homes = [
  { who: "admin", home: "/en/admin", heading: "Administration" },
  { who: "wardNurse", home: "/en/caseload", heading: "Caseload" },
  { who: "communityNurse", home: "/en/caseload", heading: "Caseload" },
  { who: "patient", home: "/en/today", heading: "Today" },
  { who: "carer", home: "/en/today", heading: "Today" },
] as const;

const otherPages: Record<string, string[]> = {
  admin: ["/en/caseload", "/en/today"],
  wardNurse: ["/en/admin", "/en/today"],
  communityNurse: ["/en/admin", "/en/today"],
  patient: ["/en/caseload", "/en/admin"],
  carer: ["/en/caseload", "/en/admin"],
};

describe("sign-in and role homes in Chromium", () => {
  it("shows the sign-in page in English and Arabic (right to left), with screenshots", async () => {
    const page = await newPage(browser);
    await page.goto("/en/sign-in");
    await expect.poll(() => page.locator("html").getAttribute("dir")).toBe("ltr");
    await screenshot(page, "sign-in-en");
    await page.goto("/ar/sign-in");
    expect(await page.locator("html").getAttribute("dir")).toBe("rtl");
    expect(await page.locator("html").getAttribute("lang")).toBe("ar");
    await screenshot(page, "sign-in-ar");
    await page.context().close();
  });

  for (const { who, home, heading } of homes) {
    it(`${who} signs in, lands on ${home}, and cannot open another role's pages`, async () => {
      const page = await newPage(browser);
      await signInAs(page, demo[who].email, demo[who].password);
      expect(new URL(page.url()).pathname).toBe(home);
      await expect.poll(() => page.locator("h1").first().textContent()).toBe(heading);
      for (const other of otherPages[who]) {
        const res = await page.goto(other);
        expect(res?.status(), `${who} opening ${other}`).toBe(403);
        expect(await page.getByTestId("forbidden").count()).toBe(1);
      }
      await page.context().close();
    });
  }

  it("sends a visitor without a session to sign-in, whatever headers they add", async () => {
    for (const path of ["/en/caseload", "/en/admin", "/en/today"]) {
      const res = await fetch(`${baseUrl}${path}`, {
        redirect: "manual",
        headers: { "x-middleware-subrequest": "middleware:middleware:middleware:middleware:middleware" },
      });
      expect([302, 303, 307, 308]).toContain(res.status);
      expect(res.headers.get("location")).toMatch(/\/en\/sign-in$/);
    }
  });

  it("refuses a page even when the proxy is skipped: a fake session cookie gets no content", async () => {
    const res = await fetch(`${baseUrl}/en/caseload`, {
      redirect: "manual",
      headers: { cookie: "caddis.session_token=forged.value", "x-middleware-subrequest": "proxy:proxy:proxy:proxy:proxy" },
    });
    expect([302, 303, 307, 308]).toContain(res.status);
    expect(res.headers.get("location")).toMatch(/\/en\/sign-in$/);
  });

  it("signs out with a POST from the sign-out page", async () => {
    const page = await newPage(browser);
    await signInAs(page, demo.patient.email, demo.patient.password);
    await page.goto("/en/sign-out");
    await page.getByRole("button", { name: "Sign out" }).click();
    await page.waitForURL(/\/en\/sign-in$/);
    const res = await page.goto("/en/today");
    expect(new URL(page.url()).pathname).toBe("/en/sign-in");
    expect(res?.ok()).toBe(true);
    await page.context().close();
  });
});
