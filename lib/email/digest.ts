import "server-only";
// The care team's weekly digest (pg-boss schedule, Monday 07:00 by default): changes and reviews
// due in the next 7 days and those overdue, from the stored planned dates with lib/clinical's
// caseload states, plus any message about their patients that could not be delivered.
import { db, type Executor } from "@/db";
import { listDigestOrganisations, listDueEpisodes, listFailedMessages } from "@/db/queries/digest";
import { addDays, parseIsoDate, stateFor } from "@/lib/clinical";
import { getPlanDefaults, getRegion } from "@/lib/config/settings";
import { env } from "@/lib/config/env";
import { dayIn } from "@/lib/shared/time-zone";
import { emailDates, emailLocale, emailTranslator } from "./i18n";
import { NO_RECIPIENT, queueMessage, type QueuedMessage } from "./outbox";
import { renderEmail, type Block, type EmailContent } from "./render";

/** Today's calendar date in the deployment's time zone. */
export function localToday(now = new Date(), timeZone = env.CADDIS_TIME_ZONE): string {
  return dayIn(now, timeZone);
}

export type DigestLine = { patientId: string; name: string; healthRecordNumber: string; what: "change" | "review"; date: string; daysUntil: number };

export async function digestLines({ organisationId, today }: { organisationId: string; today: string }, tx: Executor = db) {
  const { dueSoonDays } = await getPlanDefaults(tx);
  const rows = await listDueEpisodes({ organisationId, until: addDays(today, dueSoonDays) }, tx);
  const todayN = parseIsoDate("today", today);
  const overdue: DigestLine[] = [];
  const due: DigestLine[] = [];
  for (const r of rows) {
    for (const [what, date] of [["change", r.plannedChangeOn], ["review", r.reviewDueOn]] as const) {
      const daysUntil = parseIsoDate("date", date) - todayN;
      const state = stateFor(daysUntil, dueSoonDays);
      if (state === "ok") continue;
      (state === "overdue" ? overdue : due).push({ patientId: r.patientId, name: r.name, healthRecordNumber: r.healthRecordNumber, what, date, daysUntil });
    }
  }
  const byDate = (a: DigestLine, b: DigestLine) => a.daysUntil - b.daysUntil || a.name.localeCompare(b.name);
  return { overdue: overdue.sort(byDate), due: due.sort(byDate), dueSoonDays };
}

function digestContent(
  org: { name: string },
  today: string,
  lines: Awaited<ReturnType<typeof digestLines>>,
  failed: Awaited<ReturnType<typeof listFailedMessages>>,
  locale: string,
  region: string | null,
): EmailContent {
  const t = emailTranslator(locale);
  const d = emailDates(locale, region);
  const head = [t("digest.colPatient"), t("gp.healthRecordNumber"), t("digest.colWhat"), t("digest.colDate"), t("digest.colWhen")];
  const row = (l: DigestLine) => [
    l.name,
    l.healthRecordNumber,
    l.what === "change" ? t("device.plannedChange") : t("device.reviewDue"),
    d.short(l.date),
    l.daysUntil < 0 ? t("digest.overdueBy", { days: -l.daysUntil }) : t("digest.dueIn", { days: l.daysUntil }),
  ];
  const blocks: Block[] = [{ type: "heading", text: t("digest.overdueHeading") }];
  blocks.push(lines.overdue.length ? { type: "table", head, rows: lines.overdue.map(row) } : { type: "paragraph", text: t("digest.none") });
  blocks.push({ type: "heading", text: t("digest.dueHeading", { days: lines.dueSoonDays }) });
  blocks.push(lines.due.length ? { type: "table", head, rows: lines.due.map(row) } : { type: "paragraph", text: t("digest.none") });
  if (failed.length) {
    blocks.push({ type: "heading", text: t("digest.failedHeading") });
    blocks.push({ type: "notice", tone: "warn", label: t("common.noticeWarn"), text: t("digest.failedIntro") });
    blocks.push({
      type: "table",
      head: [t("digest.colPatient"), t("gp.healthRecordNumber"), t("digest.colMessage"), t("digest.colError")],
      rows: failed.map((f) => [f.name, f.healthRecordNumber, f.subject, f.lastError === NO_RECIPIENT ? t("common.noRecipient") : (f.lastError ?? "")]),
    });
  }
  blocks.push({ type: "action", href: `${new URL(env.APP_URL).origin}/${locale}/caseload`, label: t("digest.open") });
  return {
    locale,
    subject: t("digest.subject", { team: org.name, overdue: lines.overdue.length, due: lines.due.length }),
    title: t("digest.title", { date: d.day(today) }),
    intro: t("digest.intro", { team: org.name }),
    blocks,
    footer: [t("digest.footerWhy", { team: org.name }), t("common.footerNoReply"), t("common.footerSafety")],
  };
}

/** Queues one organisation's digest; key `digest:<orgId>:<date><suffix>` (one a day unless forced). */
export async function queueDigestFor(
  tx: Executor,
  { organisation, today, keySuffix = "" }: { organisation: { id: string; name: string; inboxEmail: string | null; locale: string }; today: string; keySuffix?: string },
): Promise<QueuedMessage> {
  const locale = emailLocale(organisation.locale);
  const lines = await digestLines({ organisationId: organisation.id, today }, tx);
  const failed = await listFailedMessages({ organisationId: organisation.id, since: new Date(Date.now() - 30 * 86_400_000) }, tx);
  return queueMessage(tx, {
    idempotencyKey: `digest:${organisation.id}:${today}${keySuffix}`,
    kind: "digest",
    to: organisation.inboxEmail,
    ...renderEmail(digestContent(organisation, today, lines, failed, locale, await getRegion(tx))),
    organisationId: organisation.id,
    locale,
    sourceId: today,
  });
}

/** The scheduled job: a digest for every care-team organisation with an inbox. */
export async function queueWeeklyDigests({
  today = localToday(),
  organisationIds,
  keySuffix,
}: { today?: string; organisationIds?: string[]; keySuffix?: string } = {}) {
  const orgs = await listDigestOrganisations({ organisationIds });
  let queued = 0;
  for (const organisation of orgs) {
    const r = await db.transaction((tx) => queueDigestFor(tx, { organisation, today, keySuffix }));
    if (r.created) queued++;
  }
  return { organisations: orgs.length, queued };
}
