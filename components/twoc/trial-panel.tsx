"use client";
// The trial without catheter under way, on the record's Device tab: when the catheter came out,
// a clock running since, the time the patient is expected to have passed urine by (the
// deployment's window) and the outcome form one tap away. Red once the window has passed.
import { useTranslations } from "next-intl";
import { useFormat } from "@/components/i18n/format";
import { useEffect, useState } from "react";
import { StateBadge } from "@/components/caseload/state-badge";
import { buttonClass } from "@/components/ui/button";
import { trialClock } from "@/lib/clinical";
import { Link } from "@/lib/i18n/navigation";

export function TrialPanel({ patientId, removedAt, windowHours, closed }: { patientId: string; removedAt: string; windowHours: number; closed: boolean }) {
  const t = useTranslations("Twoc");
  const format = useFormat();
  const [now, setNow] = useState(() => new Date());
  useEffect(() => {
    const id = setInterval(() => setNow(new Date()), 30_000);
    return () => clearInterval(id);
  }, []);
  const removed = new Date(removedAt);
  const clock = trialClock(removed, now, windowHours);
  const since = Math.max(0, Math.floor((now.getTime() - removed.getTime()) / 60_000));
  const at = (d: Date) => format.dateTime(d, { dateStyle: "medium", timeStyle: "short" });
  return (
    <section
      aria-labelledby="trial-heading"
      data-testid="trial-panel"
      data-overdue={clock.overdue ? "true" : "false"}
      className={`flex flex-col gap-4 rounded-card border-2 p-5 ${clock.overdue ? "border-finding-stop bg-finding-stop-soft" : "border-finding-warn bg-finding-warn-soft"}`}
    >
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h3 id="trial-heading" className="text-xl font-bold">
          {t("panel.title")}
        </h3>
        <StateBadge state={clock.overdue ? "overdue" : "due-soon"} />
      </div>
      <dl className="grid gap-x-6 gap-y-2 sm:grid-cols-[minmax(12rem,auto)_1fr]">
        <dt className="font-bold">{t("panel.removedAt")}</dt>
        <dd className="tabular">{at(removed)}</dd>
        <dt className="font-bold">{t("panel.since")}</dt>
        <dd className="tabular" data-testid="trial-since">
          {t("duration", { hours: Math.floor(since / 60), minutes: since % 60 })}
        </dd>
        <dt className="font-bold">{t("panel.voidBy")}</dt>
        <dd className="tabular" data-testid="trial-void-by">
          {at(clock.voidBy)} ·{" "}
          {clock.overdue ? (
            <strong>{t("overdueShort")}</strong>
          ) : (
            t("left", { hours: Math.floor(clock.minutesLeft / 60), minutes: clock.minutesLeft % 60 })
          )}
        </dd>
      </dl>
      {clock.overdue ? <p className="font-bold">{t("panel.overdue")}</p> : null}
      {closed ? null : (
        <Link href={`/patients/${patientId}/record/twoc`} className={`${buttonClass("primary")} self-start`} data-testid="trial-record-outcome">
          {t("panel.record")}
        </Link>
      )}
      <p className="text-sm">{t("panel.window", { hours: windowHours })}</p>
    </section>
  );
}
