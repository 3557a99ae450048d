import "server-only";
// Delivers the e-mail outbox. Any number of workers may run at once, in app servers and in
// scripts/worker.ts: each claims one due row at a time (FOR UPDATE SKIP LOCKED) with a lease,
// sends it, and marks it sent, or queued again after an exponential back-off, or failed after
// the last try. Woken at once by the NOTIFY that queueMessage sends on commit, and by a poll for
// retries coming due and leases that ran out. Delivery is at least once: see docs/email.md.
import pg from "pg";
import {
  claimNextMessage,
  markMessageAttemptFailed,
  markMessageSent,
  OUTBOX_CHANNEL,
} from "@/db/queries/outbox";
import { getPushSubscription, removeGoneSubscription } from "@/db/queries/push-subscriptions";
import type { OutboundMessage } from "@/db/schema";
import { renderAttachments } from "@/lib/email/attachments";
import { createPushSender, SubscriptionGone, type PushSender } from "@/lib/push/send";
import { createSmsSender, type SmsSender } from "@/lib/sms/client";
import { createMailTransport, type MailTransport } from "@/lib/email/transport";
import { env } from "@/lib/config/env";

export type OutboxWorkerOptions = {
  smtpUrl?: string;
  from?: string;
  /** Tries before a message is marked failed (default MAIL_MAX_ATTEMPTS, 8). */
  maxAttempts?: number;
  /** First back-off; doubled after each failed try, capped at retryMaxMs. */
  retryBaseMs?: number;
  retryMaxMs?: number;
  /** How long a claim lasts before another worker may take the message over. */
  leaseMs?: number;
  pollMs?: number;
  /** Messages sent in parallel by this worker. */
  concurrency?: number;
  /** LISTEN for queueMessage's NOTIFY (default true). */
  listen?: boolean;
  databaseUrl?: string;
  /** Deliver only messages whose idempotency key starts with this (a dedicated lane). */
  keyPrefix?: string;
  log?: (message: string) => void;
  /** Texts (default: the SMS SDK on SMS_API_URL) and pushes (default: web-push). */
  sms?: SmsSender;
  push?: PushSender;
};

type Resolved = Required<Omit<OutboxWorkerOptions, "smtpUrl" | "keyPrefix" | "sms" | "push">> & { smtpUrl: string; keyPrefix: string | undefined };

function resolve(o: OutboxWorkerOptions): Resolved {
  return {
    smtpUrl: o.smtpUrl ?? env.SMTP_URL,
    from: o.from ?? env.MAIL_FROM,
    maxAttempts: o.maxAttempts ?? env.MAIL_MAX_ATTEMPTS,
    retryBaseMs: o.retryBaseMs ?? env.MAIL_RETRY_BASE_SECONDS * 1000,
    retryMaxMs: o.retryMaxMs ?? env.MAIL_RETRY_MAX_SECONDS * 1000,
    leaseMs: o.leaseMs ?? env.MAIL_LEASE_SECONDS * 1000,
    pollMs: o.pollMs ?? env.MAIL_POLL_SECONDS * 1000,
    concurrency: o.concurrency ?? 2,
    listen: o.listen ?? true,
    databaseUrl: o.databaseUrl ?? env.DATABASE_URL,
    keyPrefix: o.keyPrefix ?? (env.MAIL_WORKER_KEY_PREFIX || undefined),
    log: o.log ?? ((m) => console.log(`[outbox] ${m}`)),
  };
}

/** Back-off before try n+1 after n failed tries: base·2^(n-1), capped, with ±20 % jitter. */
export function retryDelayMs(failedTries: number, baseMs: number, maxMs: number, random = Math.random): number {
  const plain = Math.min(baseMs * 2 ** Math.max(0, failedTries - 1), maxMs);
  return Math.round(plain * (0.8 + 0.4 * random()));
}

function describe(error: unknown): string {
  if (error instanceof Error) {
    const e = error as Error & { code?: string; responseCode?: number; response?: string };
    const parts = [e.code, e.responseCode ? String(e.responseCode) : undefined, e.response ?? e.message].filter(Boolean);
    return parts.join(" ");
  }
  return String(error);
}

export type DeliveryOutcome = "sent" | "retry" | "failed" | "claim-lost";

/** Sends one claimed row on its channel; throws on a failed try. */
async function sendOn(row: OutboundMessage, o: Resolved, options: OutboxWorkerOptions & { transport: MailTransport }) {
  if (row.channel === "sms") {
    await (options.sms ?? createSmsSender()).send({ to: row.toAddress, text: row.text, clientRef: row.id });
    return;
  }
  if (row.channel === "push") {
    const target = await getPushSubscription({ id: row.toAddress });
    if (!target) throw new SubscriptionGone("subscription_gone");
    try {
      await (options.push ?? createPushSender()).send(target, { title: row.subject, body: row.text, url: row.link, tag: row.idempotencyKey });
    } catch (error) {
      if (error instanceof SubscriptionGone) await removeGoneSubscription({ id: target.id });
      throw error;
    }
    return;
  }
  const attachments = await renderAttachments(row.attachments);
  await options.transport.sendMail({
    from: o.from,
    to: row.toAddress,
    subject: row.subject,
    html: row.html,
    text: row.text,
    messageId: row.messageId,
    headers: { "X-Caddis-Outbox-Id": row.id },
    attachments,
  });
}

/** Claims and sends one due message; null when none is due. */
export async function deliverNext(options: OutboxWorkerOptions & { transport: MailTransport }): Promise<DeliveryOutcome | null> {
  const o = resolve(options);
  const row = await claimNextMessage({ leaseMs: o.leaseMs, keyPrefix: o.keyPrefix });
  if (!row) return null;
  const claimToken = row.claimToken!;
  // A lease that ran out after the last try (the worker died, perhaps because of this message).
  if (row.attempts > o.maxAttempts) {
    await markMessageAttemptFailed({ id: row.id, claimToken, error: row.lastError ?? "worker stopped during the last try", final: true, retryInMs: 0 });
    return "failed";
  }
  try {
    await sendOn(row, o, options);
  } catch (error) {
    // A subscription the push service dropped will never take a message: no retry.
    const final = row.attempts >= o.maxAttempts || error instanceof SubscriptionGone;
    const message = describe(error);
    await markMessageAttemptFailed({
      id: row.id,
      claimToken,
      error: message,
      final,
      retryInMs: retryDelayMs(row.attempts, o.retryBaseMs, o.retryMaxMs),
    });
    o.log(`${row.kind} ${row.id}: try ${row.attempts} of ${o.maxAttempts} failed (${message})${final ? "; marked failed" : ""}`);
    return final ? "failed" : "retry";
  }
  if (await markMessageSent({ id: row.id, claimToken })) return "sent";
  // Our lease ran out while sending and another worker took the message: it may arrive twice,
  // with the same Message-ID.
  o.log(`${row.kind} ${row.id}: sent, but the claim had passed to another worker`);
  return "claim-lost";
}

export type DrainResult = Record<DeliveryOutcome, number>;

/** Sends every message due now (several at a time) and returns what happened. */
export async function drainOutbox(options: OutboxWorkerOptions & { transport?: MailTransport } = {}): Promise<DrainResult> {
  const o = resolve(options);
  const transport = options.transport ?? createMailTransport(o.smtpUrl);
  const result: DrainResult = { sent: 0, retry: 0, failed: 0, "claim-lost": 0 };
  try {
    await Promise.all(
      Array.from({ length: o.concurrency }, async () => {
        for (;;) {
          const outcome = await deliverNext({ ...options, transport });
          if (!outcome) return;
          result[outcome]++;
        }
      }),
    );
  } finally {
    if (!options.transport) transport.close();
  }
  return result;
}

export class OutboxWorker {
  private readonly o: Resolved;
  private readonly transport: MailTransport;
  private timer: NodeJS.Timeout | null = null;
  private listener: pg.Client | null = null;
  private running: Promise<void> | null = null;
  private again = false;
  private stopped = false;
  readonly totals: DrainResult = { sent: 0, retry: 0, failed: 0, "claim-lost": 0 };

  constructor(private readonly options: OutboxWorkerOptions = {}) {
    this.o = resolve(options);
    this.transport = createMailTransport(this.o.smtpUrl);
  }

  async start() {
    if (this.o.listen) await this.listen().catch((e) => this.o.log(`LISTEN failed (${describe(e)}); polling only`));
    this.timer = setInterval(() => this.kick(), this.o.pollMs);
    this.timer.unref?.();
    this.kick();
    return this;
  }

  /** Starts a drain, or asks the running one to go round once more. */
  kick(): Promise<void> {
    if (this.stopped) return Promise.resolve();
    if (this.running) {
      this.again = true;
      return this.running;
    }
    this.running = (async () => {
      do {
        this.again = false;
        try {
          const r = await drainOutbox({ ...this.options, transport: this.transport });
          for (const k of Object.keys(r) as DeliveryOutcome[]) this.totals[k] += r[k];
        } catch (e) {
          // The database may be down: the next poll tries again.
          this.o.log(`drain failed: ${describe(e)}`);
        }
      } while (this.again && !this.stopped);
    })().finally(() => {
      this.running = null;
    });
    return this.running;
  }

  private async listen() {
    const client = new pg.Client({ connectionString: this.o.databaseUrl });
    client.on("notification", () => void this.kick());
    const reconnect = () => {
      if (this.stopped || this.listener !== client) return;
      this.listener = null;
      client.end().catch(() => {});
      setTimeout(() => {
        if (!this.stopped) this.listen().catch(() => {});
      }, 5_000).unref?.();
    };
    client.on("error", reconnect);
    client.on("end", reconnect);
    await client.connect();
    await client.query(`LISTEN ${OUTBOX_CHANNEL}`);
    this.listener = client;
  }

  async stop() {
    this.stopped = true;
    if (this.timer) clearInterval(this.timer);
    const l = this.listener;
    this.listener = null;
    await l?.end().catch(() => {});
    await this.running;
    this.transport.close();
  }
}

