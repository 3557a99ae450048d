// The GP summary: the e-mail reaches the practice inbox with its PDF and the right facts; what a
// patient or clinician typed is escaped; one summary per event; no inbox → kept as failed.
import { spawn } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { db } from "@/db";
import { catheterEpisodes, episodeEvents, outboundMessages, passports } from "@/db/schema";
import { gpSummaryKey, queueGpSummary } from "@/lib/email/gp-summary";
import { drainOutbox } from "@/lib/jobs/outbox-worker";
import { attachmentOf, insertEpisode, mailPatient, waitForEmails, type MailFixture } from "../support/mail";

const quiet = () => {};
const out = path.resolve(__dirname, "../../test-results");
let fx: MailFixture;

beforeAll(async () => {
  fx = await mailPatient({ givenName: "Edmund", familyName: "Løvgren-Test" });
  fs.mkdirSync(out, { recursive: true });
});
afterAll(async () => {
  await fx?.cleanup();
});

async function pdfText(buffer: Buffer) {
  const { PDFParse } = await import("pdf-parse");
  const parser = new PDFParse({ data: new Uint8Array(buffer) });
  try {
    return (await parser.getText()).text;
  } finally {
    await parser.destroy();
  }
}

describe("GP summary", () => {
  it("a change reaches the GP inbox, HTML and text, with the PDF attached and the right facts", async () => {
    const first = await insertEpisode(fx.patientId, { sizeCh: 16, insertedAt: new Date(Date.now() - 60 * 86_400_000) });
    await db.update(catheterEpisodes).set({ removedAt: new Date(), removalReason: "blockage" }).where(eq(catheterEpisodes.id, first.episode.id));
    const { event } = await insertEpisode(fx.patientId, {
      kind: "unplanned_change",
      reason: "blockage",
      previousEpisodeId: first.episode.id,
      sizeCh: 14,
      balloonMl: 10,
      plannedChangeOn: "2027-02-22",
      reviewDueOn: "2026-12-29",
      findings: [
        { severity: "stop", code: "latex-allergy", message: "Latex allergy: this catheter contains latex.", source: "mhra-mda-2012-075" },
        { severity: "info", code: "lot-missing", message: "No lot recorded.", source: "common-practice" },
      ],
      overrides: [{ code: "latex-allergy", reason: "Checked with the patient: contact rash only, silicone-coated" }],
    });
    await db.update(episodeEvents).set({ details: { refused: [{ code: "device-expired", detail: "lot EXP1, expired 2026-10-31" }] } }).where(eq(episodeEvents.id, event.id));

    const queued = await db.transaction((tx) => queueGpSummary(tx, { patientId: fx.patientId, eventId: event.id, cause: "change", actorName: "Grace Mensah" }));
    expect(queued.created).toBe(true);
    const key = gpSummaryKey({ cause: "change", eventId: event.id });
    expect((await drainOutbox({ keyPrefix: key, log: quiet })).sent).toBe(1);

    const [mail] = await waitForEmails(fx.gpInbox, 1);
    expect(mail.subject).toBe(`Caddis: catheter changed, patient ${fx.hrn}`);
    const decoded = mail.html!.replace(/&#39;/g, "'").replace(/&quot;/g, '"').replace(/&amp;/g, "&");
    for (const body of [decoded, mail.text!]) {
      expect(body).toContain("Edmund Løvgren-Test");
      expect(body).toContain("14 Ch (4.7 mm)"); // Source: ISO 20696:2018 5.5.2, 14 Ch → 4.7 mm
      expect(body).toContain("10 ml sterile water");
      expect(body).toContain("Grace Mensah, Harbourside Community Nursing Team");
      expect(body).toContain("Monday, 22 February 2027"); // planned change (the demo's region is GB: day month year)
      expect(body).toContain("Tuesday, 29 December 2026"); // review of need
      expect(body).toContain("Latex allergy and a latex-containing catheter");
      expect(body).toContain("Checked with the patient: contact rash only, silicone-coated");
      expect(body).toContain("The device was past its expiry date: the device was not used (lot EXP1, expired 2026-10-31).");
      expect(body).toContain("16 Ch"); // the catheter taken out
      expect(body).toContain("Blockage");
      expect(body).toContain("01632 960 779"); // the care team's out-of-hours line
      expect(body).toContain("local policy, the maker's instructions and clinical judgement come first");
    }
    expect(mail.html).not.toContain("No lot recorded"); // info findings are not GP news
    const [row] = await db.select().from(outboundMessages).where(eq(outboundMessages.idempotencyKey, key));
    expect(mail.headers["message-id"]).toBe(row.messageId);

    // The first summary of this patient: number 1 in the name, so later versions are told apart.
    const filename = `caddis-gp-summary-${fx.hrn}-${event.occurredAt.toISOString().slice(0, 10)}-no1.pdf`;
    expect(mail.attachments?.map((a) => [a.filename, a.contentType])).toEqual([[filename, "application/pdf"]]);
    const pdf = await attachmentOf(mail, filename);
    expect(pdf.subarray(0, 5).toString()).toBe("%PDF-");
    fs.writeFileSync(path.join(out, "gp-summary.pdf"), pdf);
    const text = (await pdfText(pdf)).replace(/\s+/g, " ");
    expect(text).toContain("Catheter changed");
    expect(text).toContain("14 Ch (4.7 mm)");
    expect(text).toContain("Grace Mensah");
    expect(text).toContain("22 February 2027");
    expect(text).toContain("Løvgren");
  });

  it("escapes what was typed: no HTML injection in the e-mail", async () => {
    const previous = await db.select().from(catheterEpisodes).where(eq(catheterEpisodes.patientId, fx.patientId));
    for (const e of previous) if (!e.removedAt) await db.update(catheterEpisodes).set({ removedAt: new Date() }).where(eq(catheterEpisodes.id, e.id));
    const evil = `<script>alert(1)</script><b>x</b>"><img src=x onerror=alert(2)>`;
    const { event } = await insertEpisode(fx.patientId, { difficulties: evil, indication: `Retention <i>acute</i> & "chronic"` });
    await db.transaction((tx) => queueGpSummary(tx, { patientId: fx.patientId, eventId: event.id, cause: "insertion", actorName: `Nurse <b>Bold</b>` }));
    await drainOutbox({ keyPrefix: gpSummaryKey({ cause: "insertion", eventId: event.id }), log: quiet });
    const mails = await waitForEmails(fx.gpInbox, 2);
    const mail = mails.find((m) => m.subject.includes("inserted"))!;
    expect(mail.html).not.toMatch(/<script/i);
    expect(mail.html).not.toContain("<b>x</b>");
    expect(mail.html).not.toContain("<img");
    expect(mail.html).not.toContain("<b>Bold</b>");
    expect(mail.html).toContain("&lt;script&gt;alert(1)&lt;/script&gt;&lt;b&gt;x&lt;/b&gt;&quot;&gt;&lt;img src=x onerror=alert(2)&gt;");
    expect(mail.html).toContain("Retention &lt;i&gt;acute&lt;/i&gt; &amp; &quot;chronic&quot;");
    // The plain-text part keeps the words as they were typed.
    expect(mail.text).toContain(evil);
  });

  it("queueing the same event twice yields one summary", async () => {
    const [e] = await db.select().from(episodeEvents).where(eq(episodeEvents.patientId, fx.patientId)).orderBy(episodeEvents.createdAt).limit(1);
    const again = await db.transaction(async (tx) => {
      const a = await queueGpSummary(tx, { patientId: fx.patientId, eventId: e.id, cause: "insertion", actorName: "Grace Mensah" });
      const b = await queueGpSummary(tx, { patientId: fx.patientId, eventId: e.id, cause: "insertion", actorName: "Grace Mensah" });
      return [a, b];
    });
    expect(again[1]).toMatchObject({ id: again[0].id, created: false });
    const rows = await db.select().from(outboundMessages).where(eq(outboundMessages.idempotencyKey, gpSummaryKey({ cause: "insertion", eventId: e.id })));
    expect(rows).toHaveLength(1);
  });

  it("passport issue, removal and a trial without catheter each send their own summary", async () => {
    const current = (await db.select().from(catheterEpisodes).where(eq(catheterEpisodes.patientId, fx.patientId))).find((e) => !e.removedAt)!;
    const [pp] = await db
      .insert(passports)
      .values({ patientId: fx.patientId, tokenHash: `t-${fx.tag}`, shortCodeHash: `s-${fx.tag}`, languages: ["en", "pl"] })
      .returning();
    await db.transaction((tx) => queueGpSummary(tx, { patientId: fx.patientId, passportId: pp.id, cause: "passport", actorName: "Tomasz Reid" }));
    await db.update(catheterEpisodes).set({ removedAt: new Date(), removalReason: "Trial without catheter" }).where(eq(catheterEpisodes.id, current.id));
    const [twoc] = await db
      .insert(episodeEvents)
      .values({ episodeId: current.id, patientId: fx.patientId, kind: "twoc_outcome", twocOutcome: "passed", notes: "Voided 250 ml twice", occurredAt: new Date(), recordedByName: "Grace Mensah" })
      .returning();
    await db.transaction((tx) => queueGpSummary(tx, { patientId: fx.patientId, eventId: twoc.id, cause: "twoc", actorName: "Grace Mensah" }));
    await drainOutbox({ keyPrefix: "gp-summary:passport:" + pp.id, log: quiet });
    await drainOutbox({ keyPrefix: "gp-summary:twoc:" + twoc.id, log: quiet });
    const mails = await waitForEmails(fx.gpInbox, 4);
    const passportMail = mails.find((m) => m.subject.includes("passport"))!;
    // Languages as names, not codes.
    expect(passportMail.text).toContain("English, Polish");
    expect(passportMail.text).toContain("Tomasz Reid");
    const twocMail = mails.find((m) => m.subject.includes("trial without catheter"))!;
    expect(twocMail.text).toContain("Passed: passing urine without a catheter");
    expect(twocMail.text).toContain("Voided 250 ml twice");
    expect(twocMail.text).toContain("No catheter is in place now.");
    expect(twocMail.attachments).toHaveLength(1);

    // A removal, delivered by the standalone worker (scripts/worker.ts), which renders the PDF too.
    const { episode: third } = await insertEpisode(fx.patientId, { sizeCh: 12 });
    await db.update(catheterEpisodes).set({ removedAt: new Date(), removalReason: "No longer needed: voiding well" }).where(eq(catheterEpisodes.id, third.id));
    const [removal] = await db
      .insert(episodeEvents)
      .values({ episodeId: third.id, patientId: fx.patientId, kind: "removal", occurredAt: new Date(), recordedByName: "Grace Mensah" })
      .returning();
    await db.transaction((tx) => queueGpSummary(tx, { patientId: fx.patientId, eventId: removal.id, cause: "removal", actorName: "Grace Mensah" }));
    const worker = spawn(process.execPath, ["--import", "tsx", "scripts/worker.ts", "--outbox-only"], {
      cwd: path.resolve(__dirname, "../.."),
      env: { ...process.env, NODE_ENV: "test", MAIL_WORKER_KEY_PREFIX: `gp-summary:removal:${removal.id}`, MAIL_POLL_SECONDS: "0.2" },
      stdio: ["ignore", "pipe", "pipe"],
    });
    const log = fs.createWriteStream(path.join(out, `worker-pdf-${worker.pid}.log`));
    worker.stdout?.pipe(log);
    worker.stderr?.pipe(log);
    try {
      const all = await waitForEmails(fx.gpInbox, 5, { timeoutMs: 30_000 });
      const removalMail = all.find((m) => m.subject.includes("removed"))!;
      expect(removalMail.text).toContain("No longer needed: voiding well");
      expect(removalMail.text).toContain("12 Ch");
      expect(removalMail.text).toContain("No catheter is in place now.");
      const [a] = removalMail.attachments!;
      expect((await attachmentOf(removalMail, a.filename)).subarray(0, 5).toString()).toBe("%PDF-");
    } finally {
      worker.kill("SIGTERM");
    }
  }, 60_000);

  it("in the practice's language, and kept as failed when the practice has no inbox", async () => {
    const es = await mailPatient({ gpLocale: "es" });
    const none = await mailPatient({ gpInbox: false });
    try {
      const { event } = await insertEpisode(es.patientId);
      await db.transaction((tx) => queueGpSummary(tx, { patientId: es.patientId, eventId: event.id, cause: "insertion", actorName: "Grace Mensah" }));
      await drainOutbox({ keyPrefix: gpSummaryKey({ cause: "insertion", eventId: event.id }), log: quiet });
      const [mail] = await waitForEmails(es.gpInbox, 1);
      expect(mail.subject).toMatch(/sonda/i);
      expect(mail.html).toContain('lang="es"');

      const n = await insertEpisode(none.patientId);
      const r = await db.transaction((tx) => queueGpSummary(tx, { patientId: none.patientId, eventId: n.event.id, cause: "insertion", actorName: "Grace Mensah" }));
      const [row] = await db.select().from(outboundMessages).where(eq(outboundMessages.id, r.id));
      expect(row).toMatchObject({ status: "failed", lastError: "no_recipient", kind: "gp-summary" });
    } finally {
      await es.cleanup();
      await none.cleanup();
    }
  });
});
