// Who looked at my record: every access to the patient's record in plain words — who (name, role,
// organisation), when, how (care team, device card by QR or code, visit access with the reason)
// and what they did — by month and optionally only people outside the care team. The patient's
// own page: a carer is refused (403), as the access-log route refuses her.
import { forbidden } from "next/navigation";
import { getTranslations } from "next-intl/server";
import { getFormat } from "@/lib/i18n/format";
import { Card } from "@/components/ui/card";
import { buttonClass } from "@/components/ui/button";
import { listAccessLog } from "@/db/queries/audit-log";
import { requirePageRole } from "@/lib/auth/permissions";
import { Link } from "@/lib/i18n/navigation";
import { accessLine } from "@/lib/portal/access-words";
import { portalPatient } from "@/lib/portal";
import { accessLogQuerySchema } from "@/lib/validations/audit";
import { todayIso } from "@/lib/shared/time-zone";

const PAGE_SIZE = 30;
/** Months offered in the filter (common practice, no source): a year back is what people ask about. */
const MONTHS_OFFERED = 12;

export async function generateMetadata() {
  const t = await getTranslations("PortalReach.access");
  return { title: t("title") };
}

function recentMonths(n: number): string[] {
  const [y, m] = todayIso().split("-").map(Number);
  return Array.from({ length: n }, (_, i) => {
    const d = new Date(Date.UTC(y, m - 1 - i, 1));
    return `${d.getUTCFullYear()}-${String(d.getUTCMonth() + 1).padStart(2, "0")}`;
  });
}

export default async function WhoLookedPage({ params, searchParams }: { params: Promise<{ locale: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const { locale } = await params;
  const viewer = await requirePageRole(locale, "patient", "carer");
  if (viewer.role !== "patient") forbidden();
  const patient = await portalPatient(viewer, undefined);
  const t = await getTranslations("PortalReach.access");
  const tl = await getTranslations("PatientAccessLog");
  const v = await getTranslations("Vocabulary");
  const format = await getFormat();
  if (!patient) {
    return (
      <div className="flex flex-col gap-5">
        <h1 className="text-3xl font-bold">{t("title")}</h1>
        <p>{t("noPatient")}</p>
      </div>
    );
  }
  const sp = await searchParams;
  const first = (x: string | string[] | undefined) => (Array.isArray(x) ? x[0] : x);
  const parsed = accessLogQuerySchema.safeParse({ page: first(sp.page), pageSize: PAGE_SIZE, who: first(sp.who), month: first(sp.month) });
  const q = parsed.success ? parsed.data : { page: 1, who: "all" as const, month: undefined };
  const log = await listAccessLog({ patientId: patient.id, page: q.page, pageSize: PAGE_SIZE, filter: q.who, month: q.month ?? null });
  const lines = log.entries.map(accessLine);
  const pages = Math.max(1, Math.ceil(log.total / PAGE_SIZE));
  const when = (d: string) => format.dateTime(new Date(d), { weekday: "long", day: "numeric", month: "long", year: "numeric", hour: "2-digit", minute: "2-digit", hourCycle: "h23" });
  const time = (d: string) => format.dateTime(new Date(d), { hour: "2-digit", minute: "2-digit", hourCycle: "h23" });
  const monthName = (m: string) => format.dateTime(new Date(`${m}-15T12:00:00Z`), { month: "long", year: "numeric", timeZone: "UTC" });
  const what = (key: string, code: string) => (tl.has(`actions.${key}` as "actions.patient_create") ? tl(`actions.${key}` as "actions.patient_create") : code);
  const href = (page: number) => {
    const s = new URLSearchParams();
    if (q.who !== "all") s.set("who", q.who);
    if (q.month) s.set("month", q.month);
    if (page > 1) s.set("page", String(page));
    return `/more/access${s.size ? `?${s}` : ""}`;
  };

  return (
    <div className="flex flex-col gap-5">
      <h1 className="text-3xl font-bold">{t("title")}</h1>
      <p>{t("intro")}</p>
      <form method="get" className="flex flex-col gap-3 rounded-lg border border-stone-faint bg-paper-raised p-4" data-testid="access-filters">
        <label className="flex flex-col gap-1 font-bold">
          {t("month")}
          <select name="month" defaultValue={q.month ?? ""} className="min-h-12 rounded-lg border-2 border-stone-line bg-paper px-3 font-normal">
            <option value="">{t("allMonths")}</option>
            {recentMonths(MONTHS_OFFERED).map((m) => (
              <option key={m} value={m}>
                {monthName(m)}
              </option>
            ))}
          </select>
        </label>
        <label className="flex min-h-12 items-center gap-3">
          <input type="checkbox" name="who" value="outside" defaultChecked={q.who === "outside"} className="h-6 w-6" />
          <span>{t("outsideOnly")}</span>
        </label>
        <button type="submit" className={buttonClass("secondary")}>
          {t("show")}
        </button>
      </form>
      <p className="tabular" data-testid="access-count">
        {t("count", { count: log.total })}
      </p>
      <ul className="flex flex-col gap-3" data-testid="patient-access-log">
        {lines.map((l) => (
          <li key={l.id}>
            <Card className="flex flex-col gap-1 [overflow-wrap:break-word]" data-testid="access-line" data-via={l.how}>
              <p className="tabular font-bold">{when(l.at)}</p>
              <p className="font-bold">{l.name ?? (l.role ? t("removedAccount") : t("notSignedIn"))}</p>
              {l.role || l.organisation ? (
                <p data-testid="access-role">{[l.role ? v(`role.${l.role}`) : null, l.organisation].filter(Boolean).join(" · ")}</p>
              ) : null}
              <p data-testid="access-how">{t(`how.${l.how}`)}</p>
              {l.reason ? <p data-testid="access-reason">{t("reason", { reason: l.reason })}</p> : null}
              <p data-testid="access-what">
                {what(l.actionKey, l.action)}
                {l.count > 1 ? <span className="block text-ink-soft">{tl("grouped", { count: l.count, from: time(l.firstAt), to: time(l.at) })}</span> : null}
              </p>
            </Card>
          </li>
        ))}
      </ul>
      {pages > 1 ? (
        <nav aria-label={tl("pagesLabel")} className="flex flex-wrap items-center gap-3">
          {q.page > 1 ? (
            <Link href={href(q.page - 1)} className="inline-flex min-h-11 items-center rounded-lg border-2 border-brand px-4 font-bold text-brand">
              {tl("newer")}
            </Link>
          ) : null}
          <span className="tabular">{tl("pageOf", { page: q.page, pages })}</span>
          {q.page < pages ? (
            <Link href={href(q.page + 1)} className="inline-flex min-h-11 items-center rounded-lg border-2 border-brand px-4 font-bold text-brand">
              {tl("older")}
            </Link>
          ) : null}
        </nav>
      ) : null}
    </div>
  );
}
