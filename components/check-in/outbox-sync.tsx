"use client";
import { useEffect } from "react";
import { flushCheckIns, pendingCheckIns } from "./outbox";

const RETRY_MS = 30_000;

/** On every portal page: sends waiting check-ins on load, when the phone comes back online, and every 30 s. */
export function CheckInOutboxSync() {
  useEffect(() => {
    const flush = () => {
      if (pendingCheckIns().length) void flushCheckIns();
    };
    flush();
    window.addEventListener("online", flush);
    const timer = window.setInterval(flush, RETRY_MS);
    return () => {
      window.removeEventListener("online", flush);
      window.clearInterval(timer);
    };
  }, []);
  return null;
}
