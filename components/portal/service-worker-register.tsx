"use client";
import { useEffect } from "react";
import { locales } from "@/lib/i18n/routing";

/**
 * Registers public/sw.js, which keeps only the offline page and static files (never patient
 * data). The locales go in its address: lib/i18n/routing stays the one list of them.
 */
export function ServiceWorkerRegister() {
  useEffect(() => {
    if (!("serviceWorker" in navigator)) return;
    navigator.serviceWorker.register(`/sw.js?locales=${locales.join(",")}`, { scope: "/" }).catch(() => {
      /* the portal works without it */
    });
  }, []);
  return null;
}
