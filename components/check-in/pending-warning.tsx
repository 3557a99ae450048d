"use client";
import { useTranslations } from "next-intl";
import { useWaitingCount } from "@/components/portal/outbox-sync";

/** Signing out clears the phone's outboxes: say so while anything is still waiting. */
export function PendingCheckInWarning() {
  const t = useTranslations("More");
  const count = useWaitingCount();
  if (!count) return null;
  return (
    <p role="status" className="rounded-lg border-2 border-level-urgent bg-level-urgent-soft p-3 font-bold text-level-urgent-ink">
      {t("pending", { count })}
    </p>
  );
}
