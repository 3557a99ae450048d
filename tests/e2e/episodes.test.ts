// Recording a catheter in Chromium as a nurse would: the packaging barcode typed by a scanner
// into the scan field, the latex stop for a latex-allergic patient, its override, the save and
// the record; the camera reading a GS1 DataMatrix; and screenshots of every form.
import { randomUUID } from "node:crypto";
import { and, eq, inArray, isNull } from "drizzle-orm";
import AxeBuilder from "@axe-core/playwright";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db, pool } from "@/db";
import { careTeam, catheterEpisodes, episodeEvents, organisations, patients, settings } from "@/db/schema";
import { dayIn, deploymentTimeZone } from "@/lib/shared/time-zone";
import { demoCatheterRow } from "../support/fixtures";
import { demo } from "../support/http";
import { launch, newPage, screenshot, signInAs } from "./support/browser";
import { writeGs1128Video, writeLabelVideo, writeQrVideo } from "./support/fake-camera";

// Source: clinical-checks.md §7 (GS1 General Specifications): 0109506000134352 17281100 10AB12
// GS 21XYZ → GTIN 09506000134352, expiry 2028-11-30, lot AB12, serial XYZ; the check digit is valid.
const LABEL_BEFORE_GS = "0109506000134352" + "17281100" + "10AB12";
const LABEL_AFTER_GS = "21XYZ";
const BRACKETED = "(01)09506000134352(17)281100(10)AB12(21)XYZ";

let browser: Browser;
let harbourside: string;
const created: string[] = [];

async function makePatient(opts: { latex?: boolean; familyName?: string } = {}) {
  const [p] = await db
    .insert(patients)
    .values({
      givenName: "Edwin",
      familyName: opts.familyName ?? `Marsh-${randomUUID().slice(0, 6)}`,
      healthRecordNumber: `E2E-${randomUUID()}`,
      dateOfBirth: "1948-02-14",
      sex: "male",
      allergyLatex: opts.latex ? "yes" : "no",
      allergyChlorhexidine: "no",
      allergyLidocaine: "no",
    })
    .returning({ id: patients.id });
  created.push(p.id);
  await db.insert(careTeam).values({ patientId: p.id, organisationId: harbourside });
  return p.id;
}

/** A patient with a catheter in place, or (trial) one removed for a trial without catheter. */
async function makePatientWithCatheter(opts: { latex?: boolean; trial?: boolean } = {}) {
  const patientId = await makePatient(opts);
  const insertedAt = new Date(Date.now() - 30 * 86_400_000);
  await db.insert(catheterEpisodes).values(
    demoCatheterRow({
      patientId,
      organisationId: harbourside,
      insertedAt,
      removedAt: opts.trial ? new Date(Date.now() - 4 * 3600_000) : null,
      removalReason: opts.trial ? "trial-without-catheter" : null,
      awaitingTwoc: Boolean(opts.trial),
    }),
  );
  return patientId;
}

async function nurse(options: Parameters<typeof newPage>[1] = {}, b = browser) {
  const page = await newPage(b, options);
  await signInAs(page, demo.communityNurse.email, demo.communityNurse.password);
  return page;
}

async function fillInsertion(page: Page) {
  await page.getByRole("radio", { name: "Urethral" }).check();
  await page.getByRole("radio", { name: "Two-way" }).check();
  await page.getByLabel("Length", { exact: true }).selectOption("standard");
  await page.getByLabel("Size", { exact: true }).fill("14");
  await page.getByLabel("Balloon: sterile water put in").fill("10");
  await page.getByLabel("Balloon volume stated by the maker").fill("10");
  await page.getByLabel("Maker", { exact: true }).fill("Northfen Medical (demo)");
  await page.getByLabel("Reason for the catheter (indication)").fill("Chronic urinary retention");
  await page.getByLabel("Lubricant or anaesthetic gel").selectOption("plain");
  await page.getByLabel("Gel volume").fill("11");
  await page.getByLabel("Residual urine drained").fill("420");
  await page.getByLabel("Urine description").fill("Clear, straw-coloured");
  await page.getByLabel("Patient's reaction").fill("Comfortable");
}

beforeAll(async () => {
  browser = await launch();
  const [org] = await db.select({ id: organisations.id }).from(organisations).where(eq(organisations.name, "Harbourside Community Nursing Team"));
  harbourside = org.id;
});
afterAll(async () => {
  await browser?.close();
  // Other tests read the demo caseloads: leave no test patient behind.
  if (created.length) await db.delete(patients).where(inArray(patients.id, created));
  await pool.end();
});

describe("recording an insertion in Chromium", () => {
  it("fills the device from a scanned GS1 string, stops on latex for a latex allergy, saves with an override, and the record shows it", async () => {
    const patientId = await makePatient({ latex: true });
    const page = await nurse();
    await page.goto(`/en/patients/${patientId}/record/insertion`);
    await expect.poll(() => page.getByTestId("record-title").textContent()).toBe("Record an insertion");
    await expect.poll(() => page.getByTestId("allergy-box").textContent()).toContain("Latex");

    // A USB scanner types the element string; the group separator arrives as Ctrl+] and the scan ends with Enter.
    const scan = page.getByTestId("scan-input");
    await scan.click();
    await page.keyboard.type(LABEL_BEFORE_GS);
    await page.keyboard.press("Control+BracketRight");
    await page.keyboard.type(LABEL_AFTER_GS);
    await page.keyboard.press("Enter");
    await expect.poll(() => page.getByTestId("field-gtin").inputValue()).toBe("09506000134352");
    expect(await page.getByTestId("field-lot").inputValue()).toBe("AB12");
    expect(await page.getByTestId("field-expiry").inputValue()).toBe("2028-11-30");
    expect(await page.getByTestId("field-serial").inputValue()).toBe("XYZ");
    expect(await page.getByTestId("scan-filled").textContent()).toContain("product number, lot, expiry, serial number");
    expect(await page.getByTestId("scan-errors").count()).toBe(0);
    // Still on the form: Enter from the scanner did not submit it.
    expect(new URL(page.url()).pathname).toBe(`/en/patients/${patientId}/record/insertion`);

    await fillInsertion(page);
    await page.getByLabel("Material").selectOption("hydrogel-coated-latex");
    const stop = page.getByTestId("finding-latex-allergy");
    await expect.poll(() => stop.getAttribute("data-severity")).toBe("stop");
    expect(await stop.textContent()).toContain("Latex allergy: this catheter contains latex");
    expect(await stop.textContent()).toContain("Stop");
    expect(await page.getByTestId("findings-panel").textContent()).toContain(
      "Local policy, the maker's instructions and clinical judgement come first.",
    );
    await screenshot(page, "episode-insertion-latex-stop-en");

    // Saving without an override reason is refused in the browser, and nothing reaches the database.
    await page.getByTestId("save").click();
    await expect.poll(() => page.getByTestId("form-error").textContent()).toContain("A stop finding needs the reason");
    expect(new URL(page.url()).pathname).toBe(`/en/patients/${patientId}/record/insertion`);
    expect(await db.select().from(catheterEpisodes).where(eq(catheterEpisodes.patientId, patientId))).toHaveLength(0);

    const reason = "Latex allergy doubtful: confirmed with the patient and his GP letter";
    await page.getByTestId("override-latex-allergy").fill(reason);
    await page.getByTestId("save").click();
    await page.waitForURL((u) => u.pathname === `/en/patients/${patientId}`, { timeout: 30_000 });

    const [episode] = await db
      .select()
      .from(catheterEpisodes)
      .where(and(eq(catheterEpisodes.patientId, patientId), isNull(catheterEpisodes.removedAt)));
    expect(episode).toMatchObject({
      material: "hydrogel-coated-latex",
      sizeCh: 14,
      balloonMl: 10,
      gtin: "09506000134352",
      lot: "AB12",
      expiry: "2028-11-30",
      serial: "XYZ",
      residualUrineMl: 420,
      insertedByName: "Grace Mensah",
    });
    expect(episode.udi).toBe(`${LABEL_BEFORE_GS}\u001d${LABEL_AFTER_GS}`);
    expect(episode.overrides).toEqual([{ code: "latex-allergy", reason }]);
    const [event] = await db.select().from(episodeEvents).where(eq(episodeEvents.episodeId, episode.id));
    expect(event.kind).toBe("insertion");

    // The patient record shows the new catheter and the override reason.
    const body = await page.locator("main").textContent();
    expect(body).toContain("AB12");
    expect(body).toContain(reason);
    await screenshot(page, "episode-insertion-saved-record-en");
    await page.context().close();
  });

  it("shows a wrong check digit as a clear error and fills no product number", async () => {
    const patientId = await makePatient();
    const page = await nurse();
    await page.goto(`/en/patients/${patientId}/record/insertion`);
    // Source: clinical-checks.md §7: 09506000134353 has a wrong check digit.
    await page.getByTestId("scan-input").fill("(01)09506000134353(17)281100(10)AB12");
    await page.getByTestId("scan-read").click();
    await expect.poll(() => page.getByTestId("scan-errors").textContent()).toContain("check digit is wrong");
    expect(await page.getByTestId("field-gtin").inputValue()).toBe("");
    expect(await page.getByTestId("field-lot").inputValue()).toBe("AB12");
    await page.context().close();
  });
});

describe("the change form's planned change follows the new catheter", () => {
  it("the maker's maximum dwell follows the new material (from the deployment's defaults) until the nurse types one", async () => {
    // The catheter in place: all-silicone with the maker's 84 days.
    const patientId = await makePatientWithCatheter();
    const page = await nurse();
    await page.goto(`/en/patients/${patientId}/record/change`);
    const dwell = page.getByTestId("field-max-dwell");
    const material = page.locator('select[name="material"]');
    await expect.poll(() => dwell.inputValue()).toBe("84");

    // A different material: its default, not the previous catheter's figure. Values are the
    // material defaults of lib/clinical MATERIAL_SPECS (common practice, no source).
    await material.selectOption("ptfe-coated-latex");
    await expect.poll(() => dwell.inputValue()).toBe("28");
    await expect.poll(() => page.getByTestId("plan-preview").textContent()).toContain("after 28 days");
    expect(await page.getByTestId("plan-preview").textContent()).toContain("default for the material");
    await material.selectOption("latex");
    await expect.poll(() => dwell.inputValue()).toBe("7");
    await screenshot(page, "episode-change-dwell-follows-material-en");

    // A figure the nurse types for this catheter stays, whatever the material.
    await dwell.fill("21");
    await material.selectOption("ptfe-coated-latex");
    await page.waitForTimeout(200);
    expect(await dwell.inputValue()).toBe("21");
    expect(await page.getByTestId("plan-preview").textContent()).toContain("after 21 days");

    // Saved as the nurse left it: the new catheter's figure and the change date it gives.
    await page.locator(`input[name="changeKind"][value="planned"]`).check();
    await page.getByTestId("save").click();
    await page.waitForURL((u) => u.pathname === `/en/patients/${patientId}`, { timeout: 30_000 });
    const [now] = await db
      .select()
      .from(catheterEpisodes)
      .where(and(eq(catheterEpisodes.patientId, patientId), isNull(catheterEpisodes.removedAt)));
    expect(now).toMatchObject({ material: "ptfe-coated-latex", maxDwellDays: 21 });
    const insertedOn = dayIn(now.insertedAt, deploymentTimeZone());
    expect((Date.parse(now.plannedChangeOn) - Date.parse(insertedOn)) / 86_400_000).toBe(21);
    await page.context().close();
  });

  it("takes the default from the admin's settings when one is set for the material", async () => {
    const patientId = await makePatientWithCatheter();
    await db.insert(settings).values({ key: "defaultMaxDwellDays", value: { "ptfe-coated-latex": 21 } }).onConflictDoUpdate({ target: settings.key, set: { value: { "ptfe-coated-latex": 21 } } });
    try {
      const page = await nurse();
      await page.goto(`/en/patients/${patientId}/record/change`);
      await page.locator('select[name="material"]').selectOption("ptfe-coated-latex");
      await expect.poll(() => page.getByTestId("field-max-dwell").inputValue()).toBe("21");
      expect(await page.locator("form").textContent()).toContain("21 days");
      await page.context().close();
    } finally {
      await db.delete(settings).where(eq(settings.key, "defaultMaxDwellDays"));
    }
  });
});

describe("scanner input variants and accessibility", () => {
  it("accepts the group separator typed as ASCII 29 itself, and shows it as a visible mark", async () => {
    const patientId = await makePatient();
    const page = await nurse();
    await page.goto(`/en/patients/${patientId}/record/insertion`);
    await page.getByTestId("scan-input").click();
    await page.keyboard.insertText(`${LABEL_BEFORE_GS}\u001d${LABEL_AFTER_GS}`);
    expect(await page.getByTestId("scan-input").inputValue()).toBe(`${LABEL_BEFORE_GS}\u241d${LABEL_AFTER_GS}`);
    await page.keyboard.press("Enter");
    await expect.poll(() => page.getByTestId("field-serial").inputValue()).toBe("XYZ");
    expect(await page.getByTestId("field-lot").inputValue()).toBe("AB12");
    await page.context().close();
  });

  it("the insertion form with a stop finding passes axe (WCAG 2.2 AA rules), in en and ar", async () => {
    const patientId = await makePatient({ latex: true });
    const page = await nurse();
    for (const locale of ["en", "ar"]) {
      await page.goto(`/${locale}/patients/${patientId}/record/insertion`);
      await page.locator('input[value="urethral"]').check();
      await page.locator('input[value="two-way"]').check();
      await page.locator('select[name="lengthCategory"]').selectOption("standard");
      await page.locator('input[name="sizeCh"]').fill("14");
      await page.locator('input[name="balloonMl"]').fill("10");
      await page.locator('select[name="material"]').selectOption("latex");
      await page.locator('select[name="gelKind"]').selectOption("none");
      await expect.poll(() => page.getByTestId("finding-latex-allergy").count()).toBe(1);
      await page.getByTestId("save").click();
      await page.getByTestId("form-error").waitFor();
      // Field errors and the missing override reason are shown at once.
      expect(await page.getByTestId("finding-latex-allergy").textContent()).toMatch(/10/);
      await screenshot(page, `episode-insertion-invalid-${locale}`);
      const result = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21aa", "wcag22aa"]).analyze();
      const problems = result.violations.map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(" ")).join(", ")}`);
      expect(problems, locale).toEqual([]);
    }
    await page.context().close();
  });
});

describe("the camera reads the packaging", () => {
  let cameraBrowser: Browser;
  beforeAll(async () => {
    const video = await writeLabelVideo(BRACKETED);
    cameraBrowser = await launch([
      "--use-fake-ui-for-media-stream",
      "--use-fake-device-for-media-stream",
      `--use-file-for-fake-video-capture=${video}`,
    ]);
  });
  afterAll(async () => {
    await cameraBrowser?.close();
  });

  it("reads a GS1 DataMatrix from the camera into the device fields", async () => {
    const patientId = await makePatient();
    const page = await nurse({}, cameraBrowser);
    await page.goto(`/en/patients/${patientId}/record/insertion`);
    await page.getByTestId("camera-open").click();
    await expect.poll(() => page.getByTestId("field-gtin").inputValue(), { timeout: 30_000, interval: 500 }).toBe("09506000134352");
    expect(await page.getByTestId("field-lot").inputValue()).toBe("AB12");
    expect(await page.getByTestId("field-expiry").inputValue()).toBe("2028-11-30");
    expect(await page.getByTestId("field-serial").inputValue()).toBe("XYZ");
    // The reader stops and closes once it has read the label.
    await expect.poll(() => page.getByTestId("camera-reader").count()).toBe(0);
    await page.context().close();
  });
});

describe("the camera reads GS1-128 and Digital Link labels, and a rescan replaces every field", () => {
  // A lot followed by a serial: the label that lost its separator when read by the camera.
  const LINEAR = "(01)09506000134352(17)281100(10)HX-2217(21)S0042";
  const LINK = "https://packs.example.org/labels/01/09506000134352/10/HX%2F2218/21/S0043?17=281100";
  const withCamera = async (video: string) =>
    launch(["--use-fake-ui-for-media-stream", "--use-fake-device-for-media-stream", `--use-file-for-fake-video-capture=${video}`]);

  it("GS1-128 by camera: lot and serial stay apart; a label without a serial then clears it", async () => {
    const b = await withCamera(await writeGs1128Video(LINEAR));
    try {
      const patientId = await makePatient();
      const page = await nurse({}, b);
      await page.goto(`/en/patients/${patientId}/record/insertion`);
      await page.getByTestId("camera-open").click();
      await expect.poll(() => page.getByTestId("field-lot").inputValue(), { timeout: 30_000, interval: 500 }).toBe("HX-2217");
      expect(await page.getByTestId("field-serial").inputValue()).toBe("S0042");
      expect(await page.getByTestId("field-gtin").inputValue()).toBe("09506000134352");
      expect(await page.getByTestId("field-expiry").inputValue()).toBe("2028-11-30");
      expect(await page.getByTestId("scan-errors").count()).toBe(0);
      await page.getByTestId("scan-field").scrollIntoViewIfNeeded();
      await screenshot(page, "scan-gs1-128-camera-en-1280");
      // Another packet, whose label has no serial: the serial of the first one must not stay.
      await page.getByTestId("scan-input").fill("(01)09506000134352(17)290131(10)HX-3001");
      await page.getByTestId("scan-input").press("Enter");
      await expect.poll(() => page.getByTestId("field-lot").inputValue()).toBe("HX-3001");
      expect(await page.getByTestId("field-serial").inputValue()).toBe("");
      expect(await page.getByTestId("field-expiry").inputValue()).toBe("2029-01-31");
      expect(await page.getByTestId("scan-absent").textContent()).toContain("serial number");
      await screenshot(page, "scan-rescan-clears-serial-en-1280");
      await page.context().close();
    } finally {
      await b.close();
    }
  });

  it("a GS1 Digital Link QR by camera fills the same fields, percent-encoding decoded", async () => {
    const b = await withCamera(await writeQrVideo(LINK));
    try {
      const patientId = await makePatient();
      const page = await nurse({ viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true }, b);
      await page.goto(`/en/patients/${patientId}/record/insertion`);
      await page.getByTestId("camera-open").click();
      await expect.poll(() => page.getByTestId("field-lot").inputValue(), { timeout: 30_000, interval: 500 }).toBe("HX/2218");
      expect(await page.getByTestId("field-serial").inputValue()).toBe("S0043");
      expect(await page.getByTestId("field-gtin").inputValue()).toBe("09506000134352");
      expect(await page.getByTestId("field-expiry").inputValue()).toBe("2028-11-30");
      await page.getByTestId("scan-field").scrollIntoViewIfNeeded();
      await screenshot(page, "scan-digital-link-camera-en-390");
      await page.context().close();
    } finally {
      await b.close();
    }
  });
});

describe("screenshots of every form, en and ar, wide and phone", () => {
  const viewports = [
    { name: "wide", viewport: { width: 1280, height: 900 } },
    { name: "phone", viewport: { width: 390, height: 844 }, isMobile: true, hasTouch: true },
  ] as const;

  it("insertion, change, removal and TWOC, with findings showing", { timeout: 240_000 }, async () => {
    const latexPatient = await makePatientWithCatheter({ latex: true });
    const emptyPatient = await makePatient({ latex: true });
    const trialPatient = await makePatientWithCatheter({ trial: true });
    for (const v of viewports) {
      const page = await nurse({ viewport: v.viewport, isMobile: "isMobile" in v ? v.isMobile : false, hasTouch: "hasTouch" in v ? v.hasTouch : false });
      for (const locale of ["en", "ar"] as const) {
        const forms = [
          { kind: "insertion", patientId: emptyPatient, latex: true },
          { kind: "change", patientId: latexPatient, latex: true },
          { kind: "removal", patientId: latexPatient, latex: false },
          { kind: "twoc", patientId: trialPatient, latex: false },
        ];
        for (const f of forms) {
          const res = await page.goto(`/${locale}/patients/${f.patientId}/record/${f.kind}`);
          expect(res?.status()).toBe(200);
          expect(await page.locator("html").getAttribute("dir")).toBe(locale === "ar" ? "rtl" : "ltr");
          await page.getByTestId(`${f.kind}-form`).waitFor();
          if (f.latex) {
            if (f.kind === "insertion") {
              await page.getByTestId("scan-input").fill(BRACKETED);
              await page.getByTestId("scan-read").click();
              await page.locator('input[name="sizeCh"]').fill("18");
              await page.locator('input[name="balloonMl"]').fill("10");
              await page.locator('input[value="urethral"]').check();
              await page.locator('input[value="two-way"]').check();
              await page.locator('select[name="lengthCategory"]').selectOption("standard");
              await page.locator('select[name="gelKind"]').selectOption("plain");
            }
            await page.locator('select[name="material"]').selectOption("silicone-coated-latex");
            await expect.poll(() => page.getByTestId("finding-latex-allergy").getAttribute("data-severity")).toBe("stop");
          }
          // No horizontal scrolling on a phone (WCAG 1.4.10 reflow).
          const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
          expect(overflow, `${f.kind} ${locale} ${v.name} scrolls sideways`).toBeLessThanOrEqual(0);
          await screenshot(page, `episode-${f.kind}-${locale}-${v.name}`);
        }
      }
      await page.context().close();
    }
  });
});
