"use client";
import { useTranslations } from "next-intl";
import { useEffect, useState } from "react";
import { pendingCheckIns, SENT_EVENT } from "./outbox";

/** Signing out clears the phone's outbox: say so while a check-in is still waiting. */
export function PendingCheckInWarning() {
  const t = useTranslations("More");
  const [count, setCount] = useState(0);
  useEffect(() => {
    const update = () => setCount(pendingCheckIns().length);
    update();
    window.addEventListener(SENT_EVENT, update);
    window.addEventListener("online", update);
    return () => {
      window.removeEventListener(SENT_EVENT, update);
      window.removeEventListener("online", update);
    };
  }, []);
  if (!count) return null;
  return (
    <p role="status" className="rounded-lg border-2 border-level-urgent bg-level-urgent-soft p-3 font-bold text-level-urgent-ink">
      {t("pending", { count })}
    </p>
  );
}
