"use client";
import { useTranslations } from "next-intl";
import { useEffect, useState } from "react";
import { checkInOutbox } from "@/components/check-in/outbox";
import { diaryOutbox } from "@/components/diary/outbox";
import { OUTBOX_EVENT } from "@/lib/browser/outbox";

const RETRY_MS = 30_000;
const all = [checkInOutbox, diaryOutbox] as const;

/** How many entries are waiting on this phone, kept up to date (other tabs included). */
export function useWaitingCount(): number {
  const [count, setCount] = useState(0);
  useEffect(() => {
    const update = () => setCount(all.reduce((n, o) => n + o.list().length, 0));
    update();
    for (const e of [OUTBOX_EVENT, "online", "offline", "storage"]) window.addEventListener(e, update);
    return () => {
      for (const e of [OUTBOX_EVENT, "online", "offline", "storage"]) window.removeEventListener(e, update);
    };
  }, []);
  return count;
}

/**
 * On every portal page: sends what is waiting on load, when the phone comes back online or to the
 * page, and every 30 s; says "Waiting to send (n)" while anything is left.
 */
export function OutboxSync() {
  const t = useTranslations("Portal");
  const count = useWaitingCount();
  useEffect(() => {
    const flush = () => {
      for (const o of all) if (o.list().length) void o.flush();
    };
    flush();
    const onVisible = () => document.visibilityState === "visible" && flush();
    window.addEventListener("online", flush);
    document.addEventListener("visibilitychange", onVisible);
    const timer = window.setInterval(flush, RETRY_MS);
    return () => {
      window.removeEventListener("online", flush);
      document.removeEventListener("visibilitychange", onVisible);
      window.clearInterval(timer);
    };
  }, []);
  if (!count) return null;
  return (
    <p role="status" className="mb-4 rounded-lg border-2 border-level-urgent bg-level-urgent-soft p-3 font-bold text-level-urgent-ink" data-testid="waiting-to-send" data-listen="skip">
      {t("waitingToSend", { count })}
    </p>
  );
}
