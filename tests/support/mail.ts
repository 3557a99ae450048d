// Reading mail back through maildev's REST API, private fake SMTP servers a test may stop and
// start, and patients of their own with a GP practice whose inbox address is unique to the test.
import { randomBytes } from "node:crypto";
import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import { eq, inArray } from "drizzle-orm";
import { db } from "@/db";
import {
  careTeam,
  catheterEpisodes,
  episodeEvents,
  organisations,
  patients,
  type NewCatheterEpisode,
} from "@/db/schema";
import { env } from "@/lib/config/env";
import { demoCatheterRow } from "./fixtures";

export type InboxEmail = {
  id: string;
  subject: string;
  to: { address: string }[];
  headers: Record<string, string>;
  attachments?: { filename: string; contentType: string; size: number; generatedFileName?: string }[];
  html?: string;
  text?: string;
};

/** The shared maildev every engineer's tests write to: always filter by a unique recipient. */
export const sharedInboxUrl = env.MAIL_INBOX_URL;

export async function emailsTo(address: string, inboxUrl = sharedInboxUrl): Promise<InboxEmail[]> {
  const res = await fetch(`${inboxUrl}/api/email`);
  if (!res.ok) throw new Error(`maildev answered ${res.status}`);
  const all = (await res.json()) as InboxEmail[];
  const want = address.toLowerCase();
  return all.filter((e) => e.to?.some((t) => t.address.toLowerCase() === want));
}

export async function waitForEmails(address: string, count: number, { inboxUrl = sharedInboxUrl, timeoutMs = 15_000 } = {}) {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const found = await emailsTo(address, inboxUrl);
    if (found.length >= count || Date.now() > until) return found;
    await new Promise((r) => setTimeout(r, 200));
  }
}

export async function attachmentOf(email: InboxEmail, filename: string, inboxUrl = sharedInboxUrl): Promise<Buffer> {
  const a = email.attachments?.find((x) => x.filename === filename);
  if (!a) throw new Error(`no attachment ${filename}`);
  const res = await fetch(`${inboxUrl}/api/email/${email.id}/attachment/${encodeURIComponent(a.generatedFileName ?? a.filename)}`);
  if (!res.ok) throw new Error(`attachment download answered ${res.status}`);
  return Buffer.from(await res.arrayBuffer());
}

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.once("error", reject);
    srv.listen(0, "127.0.0.1", () => {
      const { port } = srv.address() as net.AddressInfo;
      srv.close(() => resolve(port));
    });
  });
}

/** A maildev of the test's own, on free ports, that the test may stop and start again. */
export async function privateMailDev() {
  const { MailDev } = await import("maildev");
  const smtpPort = await freePort();
  const webPort = await freePort();
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "caddis-maildev-"));
  const make = () =>
    new MailDev({ smtp: smtpPort, web: webPort, ip: "127.0.0.1", webIp: "127.0.0.1", silent: true, mailDirectory: dir } as never);
  let server = make();
  return {
    smtpUrl: `smtp://127.0.0.1:${smtpPort}`,
    inboxUrl: `http://127.0.0.1:${webPort}`,
    async start() {
      if (!server.isRunning()) {
        server = make();
        await server.start();
      }
    },
    async stop() {
      if (server.isRunning()) await server.stop();
    },
    async dispose() {
      await this.stop();
      fs.rmSync(dir, { recursive: true, force: true });
    },
  };
}

export type MailFixture = {
  tag: string;
  patientId: string;
  gpId: string;
  gpInbox: string;
  teamId: string;
  teamInbox: string;
  hrn: string;
  cleanup: () => Promise<void>;
};

/**
 * A patient of their own in the Harbourside team (so the demo community nurse reaches them) and
 * in a team of the test's own, with a GP practice of the test's own; unique inbox addresses.
 */
export async function mailPatient(
  { gpLocale = "en", teamLocale = "en", gpInbox = true, givenName = "Test", familyName = "Patient" }: { gpLocale?: string; teamLocale?: string; gpInbox?: boolean; givenName?: string; familyName?: string } = {},
): Promise<MailFixture> {
  const tag = randomBytes(5).toString("hex");
  const gpAddress = `gp.${tag}@mail-test.example`;
  const teamAddress = `team.${tag}@mail-test.example`;
  const [gp] = await db
    .insert(organisations)
    .values({ name: `Test Surgery ${tag}`, kind: "gp_practice", phone: "01632 960 777", inboxEmail: gpInbox ? gpAddress : null, locale: gpLocale })
    .returning({ id: organisations.id });
  const [team] = await db
    .insert(organisations)
    .values({ name: `Test Team ${tag}`, kind: "community_team", phone: "01632 960 778", outOfHoursPhone: "01632 960 779", inboxEmail: teamAddress, locale: teamLocale })
    .returning({ id: organisations.id });
  const [harbourside] = await db.select({ id: organisations.id }).from(organisations).where(eq(organisations.name, "Harbourside Community Nursing Team"));
  const hrn = `MT-${tag}`;
  const [p] = await db
    .insert(patients)
    .values({ givenName, familyName, healthRecordNumber: hrn, dateOfBirth: "1948-05-17", sex: "male", allergyLatex: "yes", allergyChlorhexidine: "no", allergyLidocaine: "no", gpPracticeId: gp.id })
    .returning({ id: patients.id });
  await db.insert(careTeam).values([
    { patientId: p.id, organisationId: team.id, lead: true },
    { patientId: p.id, organisationId: harbourside.id },
  ]);
  return {
    tag,
    patientId: p.id,
    gpId: gp.id,
    gpInbox: gpAddress,
    teamId: team.id,
    teamInbox: teamAddress,
    hrn,
    cleanup: async () => {
      await db.delete(patients).where(eq(patients.id, p.id));
      await db.delete(organisations).where(inArray(organisations.id, [gp.id, team.id]));
    },
  };
}

/** A catheter and its insertion (or change) event, as the episode forms would write them. */
export async function insertEpisode(
  patientId: string,
  {
    kind = "insertion",
    previousEpisodeId = null,
    reason = null,
    difficulties = null,
    ...device
  }: Partial<NewCatheterEpisode> & { kind?: "insertion" | "planned_change" | "unplanned_change"; reason?: "blockage" | null } = {},
) {
  const insertedAt = new Date();
  const [harbourside] = await db.select({ id: organisations.id }).from(organisations).where(eq(organisations.name, "Harbourside Community Nursing Team"));
  const [episode] = await db
    .insert(catheterEpisodes)
    .values(
      demoCatheterRow({
        patientId,
        organisationId: harbourside.id,
        insertedAt,
        previousEpisodeId,
        makerBalloonMl: null,
        maxDwellDays: null,
        lot: "LOT4471",
        expiry: "2029-03-31",
        difficulties,
        ...device,
      }),
    )
    .returning();
  const [event] = await db
    .insert(episodeEvents)
    .values({
      episodeId: episode.id,
      patientId,
      kind,
      reason,
      occurredAt: insertedAt,
      recordedByName: "Grace Mensah",
      organisationId: harbourside.id,
    })
    .returning();
  return { episode, event };
}
