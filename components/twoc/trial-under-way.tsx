"use client";
// A caseload row's trial without catheter under way: the time left before the patient is
// expected to have passed urine, in red with a mark once that time has passed with no outcome.
import { useTranslations } from "next-intl";
import { StateIcon } from "@/components/caseload/state-badge";
import type { CaseloadRow } from "@/lib/shared/dto";

export function TrialUnderWay({ row, now = new Date() }: { row: Pick<CaseloadRow, "trialRemovedAt" | "trialVoidBy" | "trialOverdue">; now?: Date }) {
  const t = useTranslations("Twoc");
  if (!row.trialRemovedAt || !row.trialVoidBy) return null;
  const left = Math.max(0, Math.ceil((Date.parse(row.trialVoidBy) - now.getTime()) / 60_000));
  const overdue = row.trialOverdue || left === 0;
  return (
    <div
      data-testid="trial-under-way"
      data-overdue={overdue ? "true" : "false"}
      className={`mt-1 inline-flex flex-wrap items-center gap-1 rounded-md border-2 px-2 py-0.5 text-sm font-bold ${overdue ? "border-finding-stop bg-finding-stop-soft text-level-emergency-ink" : "border-finding-warn bg-finding-warn-soft text-level-urgent-ink"}`}
    >
      <StateIcon state={overdue ? "overdue" : "due-soon"} />
      <span>{t("underWay")}</span>
      <span className="tabular">· {overdue ? t("overdueShort") : t("left", { hours: Math.floor(left / 60), minutes: left % 60 })}</span>
    </div>
  );
}
