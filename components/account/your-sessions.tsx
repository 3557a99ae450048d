import { getTranslations } from "next-intl/server";
import { getFormat } from "@/lib/i18n/format";
import type { Viewer } from "@/lib/auth/session";
import { listSessionsFor } from "@/lib/auth/sessions";
import { Link } from "@/lib/i18n/navigation";
import { EndSessionButton } from "./end-session-button";

/** The "your sessions" page, for staff and for the portal: back link, heading, the list. */
export async function YourSessions({ viewer, backHref, backLabel, large = false }: { viewer: Viewer; backHref: string; backLabel: string; large?: boolean }) {
  const t = await getTranslations("Sessions");
  return (
    <div className={`flex flex-col ${large ? "gap-5" : "max-w-3xl gap-6"}`}>
      <Link href={backHref} className="text-brand underline underline-offset-4">
        {backLabel}
      </Link>
      <div className="flex flex-col gap-2">
        <h1 className="text-3xl font-bold">{t("title")}</h1>
        <p className={large ? "" : "text-ink-soft"}>{t("intro")}</p>
      </div>
      <SessionsList viewer={viewer} large={large} />
    </div>
  );
}

/** Each device signed in to the account, this one first, with a way to end it. */
async function SessionsList({ viewer, large }: { viewer: Viewer; large: boolean }) {
  const t = await getTranslations("Sessions");
  const format = await getFormat();
  const sessions = await listSessionsFor(viewer);
  const when = (iso: string) => format.dateTime(new Date(iso), { weekday: "short", day: "numeric", month: "short", hour: "numeric", minute: "2-digit" });
  const others = sessions.filter((s) => !s.current).length;
  return (
    <div className="flex flex-col gap-4">
      <ul className="flex flex-col gap-3" aria-label={t("listLabel")}>
        {sessions.map((s) => {
          const device = s.browser && s.os ? t("device", { browser: s.browser, os: s.os }) : (s.browser ?? s.os ?? t("unknownDevice"));
          return (
            <li key={s.id} data-testid="session" className={`flex flex-col gap-2 rounded-lg border-2 bg-paper-raised p-4 ${s.current ? "border-brand" : "border-stone-faint"}`}>
              <div className="flex flex-wrap items-baseline gap-x-3 gap-y-1">
                <strong className={large ? "text-xl" : "text-lg"}>{device}</strong>
                <span className="text-ink-soft">{t(`kind.${s.kind}`)}</span>
                {s.current ? <span className="rounded-full bg-brand-soft px-2 py-0.5 text-sm font-bold text-brand">{t("thisDevice")}</span> : null}
              </div>
              <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1">
                <dt className="text-ink-soft">{t("lastSeen")}</dt>
                <dd className="tabular">{when(s.lastSeenAt)}</dd>
                <dt className="text-ink-soft">{t("signedIn")}</dt>
                <dd className="tabular">{when(s.signedInAt)}</dd>
                <dt className="text-ink-soft">{t("address")}</dt>
                <dd className="tabular" dir="ltr">{s.approximateAddress ?? t("unknownAddress")}</dd>
              </dl>
              <div>
                <EndSessionButton sessionId={s.id} current={s.current} label={s.current ? t("signOutHere") : t("end")} />
              </div>
            </li>
          );
        })}
      </ul>
      {others > 0 ? (
        <div className="flex flex-col gap-2">
          <p>{t("endOthersExplain", { count: others })}</p>
          <div>
            <EndSessionButton label={t("endOthers")} />
          </div>
        </div>
      ) : (
        <p className="text-ink-soft">{t("onlyThis")}</p>
      )}
      <p className="text-sm text-ink-soft">{t("addressNote")}</p>
    </div>
  );
}
