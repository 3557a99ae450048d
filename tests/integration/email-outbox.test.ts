// The outbox (docs/email.md): one message per event, written in the caller's transaction, never
// lost when the SMTP server is down, delivered exactly once when it is back, and nothing lost
// when a worker is killed mid-send. Mail is read back through maildev's REST API.
import { spawn, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { and, eq, like } from "drizzle-orm";
import { SMTPServer } from "smtp-server";
import { afterAll, describe, expect, it } from "vitest";
import { db } from "@/db";
import { outboundMessages } from "@/db/schema";
import { messageIdFor } from "@/lib/email/message-id";
import { queueMessage } from "@/lib/email/outbox";
import { drainOutbox, retryDelayMs } from "@/lib/jobs/outbox-worker";
import { POST as createSupplyRoute } from "@/app/api/patients/[patientId]/supply-requests/route";
import { suppliesFor } from "@/lib/clinical";
import { call, sessionFor } from "../support/http";
import { emailsTo, freePort, insertEpisode, mailPatient, privateMailDev } from "../support/mail";

const root = path.resolve(__dirname, "../..");
const quiet = () => {};
const createSupply = createSupplyRoute as unknown as Parameters<typeof call>[0];
const tagOf = () => Math.random().toString(36).slice(2, 10);

async function queueTestMessages(prefix: string, n: number, domain = "outbox-test.example") {
  const ids: string[] = [];
  await db.transaction(async (tx) => {
    for (let i = 0; i < n; i++) {
      const r = await queueMessage(tx, {
        idempotencyKey: `${prefix}${i}`,
        kind: "test",
        to: `${prefix.replace(/[^a-z0-9]/gi, "")}.${i}@${domain}`,
        subject: `Outbox test ${prefix}${i}`,
        html: `<p>Message ${i}</p>`,
        text: `Message ${i}`,
      });
      ids.push(r.id);
    }
  });
  return ids;
}

const rowsWithPrefix = (prefix: string) =>
  db.select().from(outboundMessages).where(like(outboundMessages.idempotencyKey, `${prefix}%`)).orderBy(outboundMessages.idempotencyKey);

const cleanups: (() => Promise<void>)[] = [];
afterAll(async () => {
  for (const c of cleanups.reverse()) await c().catch(() => {});
});

describe("queueMessage", () => {
  it("queueing the same event twice yields one message", async () => {
    const key = `test:${tagOf()}:same-event`;
    const input = { idempotencyKey: key, kind: "test", to: "same.event@outbox-test.example", subject: "Once", html: "<p>x</p>", text: "x" };
    const first = await db.transaction((tx) => queueMessage(tx, input));
    const second = await db.transaction((tx) => queueMessage(tx, { ...input, subject: "Twice" }));
    expect(first.created).toBe(true);
    expect(second).toMatchObject({ id: first.id, created: false });
    const rows = await db.select().from(outboundMessages).where(eq(outboundMessages.idempotencyKey, key));
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ subject: "Once", status: "queued", attempts: 0, messageId: messageIdFor(key) });
    await db.delete(outboundMessages).where(eq(outboundMessages.idempotencyKey, key));
  });

  it("writes nothing when the caller's transaction rolls back", async () => {
    const key = `test:${tagOf()}:rolled-back`;
    await expect(
      db.transaction(async (tx) => {
        await queueMessage(tx, { idempotencyKey: key, kind: "test", to: "rolled.back@outbox-test.example", subject: "No", html: "", text: "" });
        throw new Error("the change failed");
      }),
    ).rejects.toThrow("the change failed");
    expect(await db.select().from(outboundMessages).where(eq(outboundMessages.idempotencyKey, key))).toHaveLength(0);
  });

  it("keeps a message with no recipient as failed (no_recipient) so it is seen, and strips line breaks from the subject", async () => {
    const key = `test:${tagOf()}:nobody`;
    const r = await db.transaction((tx) => queueMessage(tx, { idempotencyKey: key, kind: "test", to: null, subject: "A\r\nBcc: x@y", html: "", text: "" }));
    const [row] = await db.select().from(outboundMessages).where(eq(outboundMessages.id, r.id));
    expect(row).toMatchObject({ status: "failed", lastError: "no_recipient", toAddress: "", subject: "A Bcc: x@y" });
    await db.delete(outboundMessages).where(eq(outboundMessages.id, r.id));
  });

  it("backs off exponentially with a cap", () => {
    const mid = () => 0.5; // no jitter
    expect([1, 2, 3, 4, 8].map((n) => retryDelayMs(n, 60_000, 3_600_000, mid))).toEqual([60_000, 120_000, 240_000, 480_000, 3_600_000]);
    expect(retryDelayMs(1, 1000, 10_000, () => 0)).toBe(800);
    expect(retryDelayMs(1, 1000, 10_000, () => 1)).toBe(1200);
  });
});

describe("delivery through SMTP", () => {
  it("delivers to the fake inbox with the Message-ID derived from the key", async () => {
    const prefix = `test:${tagOf()}:deliver:`;
    await queueTestMessages(prefix, 2);
    const r = await drainOutbox({ keyPrefix: prefix, log: quiet });
    expect(r.sent).toBe(2);
    const rows = await rowsWithPrefix(prefix);
    for (const row of rows) {
      expect(row).toMatchObject({ status: "sent", attempts: 1, claimToken: null, leaseUntil: null });
      expect(row.sentAt).toBeInstanceOf(Date);
      const [mail] = await emailsTo(row.toAddress);
      expect(mail.subject).toBe(row.subject);
      expect(mail.headers["message-id"]).toBe(row.messageId);
    }
    // Nothing is due any more: a second pass sends nothing.
    expect((await drainOutbox({ keyPrefix: prefix, log: quiet })).sent).toBe(0);
  });

  it("with the SMTP server stopped, messages stay queued and the app keeps working; once it is back, each is delivered exactly once", async () => {
    const smtp = await privateMailDev();
    cleanups.push(() => smtp.dispose());
    await smtp.start();
    await smtp.stop();
    const prefix = `test:${tagOf()}:outage:`;
    const opts = { smtpUrl: smtp.smtpUrl, keyPrefix: prefix, retryBaseMs: 300, retryMaxMs: 300, maxAttempts: 50, log: quiet };
    await queueTestMessages(prefix, 5);

    const cookie = await sessionFor("communityNurse");
    const down = await drainOutbox(opts);
    expect(down).toMatchObject({ sent: 0, failed: 0 });
    expect(down.retry).toBeGreaterThanOrEqual(5);
    for (const row of await rowsWithPrefix(prefix)) {
      expect(row.status).toBe("queued");
      expect(row.attempts).toBeGreaterThanOrEqual(1);
      expect(row.lastError).toMatch(/ECONNREFUSED|connect/i);
    }
    // The app keeps working while mail is down: a nurse's supply request is accepted and kept,
    // and more changes queue more messages.
    const fx = await mailPatient();
    cleanups.push(() => fx.cleanup());
    await insertEpisode(fx.patientId);
    const lines = suppliesFor({ changeIntervalDays: 84 }, 28).lines;
    const res = await call(createSupply, `/api/patients/${fx.patientId}/supply-requests`, {
      cookie,
      params: { patientId: fx.patientId },
      body: { periodDays: 28, include: { legBag: true, valve: false, nightBag: true, gel: true }, items: lines.map((l) => ({ item: l.item, quantity: l.quantity })) },
    });
    expect(res.status).toBe(201);
    expect((await res.json()).supplyRequest.message.status).toBe("queued");
    await queueTestMessages(`${prefix}later-`, 1);
    await new Promise((r) => setTimeout(r, 400));
    const still = await drainOutbox(opts);
    expect(still).toMatchObject({ sent: 0, failed: 0 });
    expect(still.retry).toBeGreaterThanOrEqual(6);
    expect((await rowsWithPrefix(prefix)).every((r) => r.status === "queued")).toBe(true);

    await smtp.start();
    for (let i = 0; i < 50; i++) {
      await new Promise((r) => setTimeout(r, 100));
      await drainOutbox(opts);
      if ((await rowsWithPrefix(prefix)).every((r) => r.status === "sent")) break;
    }
    // More passes must not send anything again.
    await drainOutbox(opts);
    await drainOutbox(opts);
    const rows = await rowsWithPrefix(prefix);
    expect(rows).toHaveLength(6);
    for (const row of rows) {
      expect(row.status).toBe("sent");
      const copies = await emailsTo(row.toAddress, smtp.inboxUrl);
      expect(copies, row.toAddress).toHaveLength(1);
      expect(copies[0].headers["message-id"]).toBe(row.messageId);
    }
  });

  it("after the last try a message is marked failed with the error", async () => {
    const port = await freePort(); // nothing listens here
    const prefix = `test:${tagOf()}:give-up:`;
    await queueTestMessages(prefix, 1);
    const opts = { smtpUrl: `smtp://127.0.0.1:${port}`, keyPrefix: prefix, maxAttempts: 3, retryBaseMs: 20, retryMaxMs: 40, log: quiet };
    for (let i = 0; i < 20; i++) {
      await drainOutbox(opts);
      const [row] = await rowsWithPrefix(prefix);
      if (row.status === "failed") break;
      await new Promise((r) => setTimeout(r, 60));
    }
    const [row] = await rowsWithPrefix(prefix);
    expect(row).toMatchObject({ status: "failed", attempts: 3, sentAt: null });
    expect(row.lastError).toMatch(/ECONNREFUSED|connect/i);
    // A failed message is not tried again.
    await drainOutbox(opts);
    expect((await rowsWithPrefix(prefix))[0].attempts).toBe(3);
  });
});

/** An SMTP server that records each message when its DATA arrives and may hold its answer. */
async function holdingSmtp() {
  const port = await freePort();
  const received: { to: string; messageId: string }[] = [];
  let hold = true;
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS", "AUTH"],
    logger: false,
    closeTimeout: 500,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on("data", (c: Buffer) => chunks.push(c));
      stream.on("end", () => {
        const raw = Buffer.concat(chunks).toString("utf8");
        const messageId = /^Message-ID:\s*(\S+)/im.exec(raw)?.[1] ?? "";
        for (const rcpt of session.envelope.rcptTo) received.push({ to: rcpt.address, messageId });
        if (!hold) callback();
        // Held: the answer never comes while the worker waits (and is killed).
      });
    },
  });
  await new Promise<void>((resolve) => server.listen(port, "127.0.0.1", resolve));
  return {
    url: `smtp://127.0.0.1:${port}`,
    received,
    release: () => {
      hold = false;
    },
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

function startWorkerProcess(env: Record<string, string>): ChildProcess {
  // node itself (not the tsx wrapper), so SIGKILL hits the worker and not a parent that relays signals.
  const child = spawn(process.execPath, ["--import", "tsx", "scripts/worker.ts", "--outbox-only"], {
    cwd: root,
    env: { ...process.env, NODE_ENV: "test", ...env },
    stdio: ["ignore", "pipe", "pipe"],
  });
  const log = fs.createWriteStream(path.join(root, "test-results", `worker-${child.pid}.log`));
  child.stdout?.pipe(log);
  child.stderr?.pipe(log);
  return child;
}

describe("a worker killed mid-send", () => {
  it("loses nothing: after a restart every message is delivered, and a copy sent twice carries the same Message-ID", { timeout: 120_000 }, async () => {
    fs.mkdirSync(path.join(root, "test-results"), { recursive: true });
    const smtp = await holdingSmtp();
    cleanups.push(() => smtp.close());
    const prefix = `test:${tagOf()}:killed:`;
    await queueTestMessages(prefix, 4);
    const env = {
      SMTP_URL: smtp.url,
      MAIL_WORKER_KEY_PREFIX: prefix,
      MAIL_LEASE_SECONDS: "2",
      MAIL_POLL_SECONDS: "0.2",
      MAIL_RETRY_BASE_SECONDS: "0.1",
      MAIL_RETRY_MAX_SECONDS: "0.5",
    };

    const first = startWorkerProcess(env);
    const exited = new Promise((r) => first.once("exit", r));
    // Wait until the server holds a message the worker is waiting to hear back about.
    for (let i = 0; i < 300 && smtp.received.length === 0; i++) await new Promise((r) => setTimeout(r, 100));
    expect(smtp.received.length).toBeGreaterThan(0);
    first.kill("SIGKILL");
    await exited;
    expect(() => process.kill(first.pid!, 0)).toThrow();
    const inFlight = (await rowsWithPrefix(prefix)).filter((r) => r.status === "sending");
    expect(inFlight.length).toBeGreaterThan(0);

    smtp.release();
    const second = startWorkerProcess(env);
    try {
      for (let i = 0; i < 600; i++) {
        const rows = await rowsWithPrefix(prefix);
        if (rows.every((r) => r.status === "sent")) break;
        await new Promise((r) => setTimeout(r, 100));
      }
    } finally {
      second.kill("SIGTERM");
    }
    const rows = await rowsWithPrefix(prefix);
    expect(rows.map((r) => r.status)).toEqual(["sent", "sent", "sent", "sent"]);
    for (const row of rows) {
      const copies = smtp.received.filter((m) => m.to === row.toAddress);
      expect(copies.length, row.toAddress).toBeGreaterThanOrEqual(1);
      // Every copy of one message carries that message's own Message-ID.
      expect(new Set(copies.map((c) => c.messageId))).toEqual(new Set([row.messageId]));
    }
    // The copy the server took before the kill was sent again: at least once, never silently lost,
    // and the duplicate is recognisable by its Message-ID (the at-least-once window, docs/email.md).
    expect(smtp.received.length).toBeGreaterThan(rows.length);
    // The message the worker was killed on was taken over once its lease ran out.
    for (const row of rows.filter((r) => inFlight.some((f) => f.id === r.id))) expect(row.attempts).toBe(2);
    const [again] = await db
      .select()
      .from(outboundMessages)
      .where(and(like(outboundMessages.idempotencyKey, `${prefix}%`), eq(outboundMessages.status, "sending")));
    expect(again).toBeUndefined();
  });
});
