"use client";
import { useEffect } from "react";

/** Registers public/sw.js, which keeps only the offline page and static files (never patient data). */
export function ServiceWorkerRegister() {
  useEffect(() => {
    if (!("serviceWorker" in navigator)) return;
    navigator.serviceWorker.register("/sw.js", { scope: "/" }).catch(() => {
      /* the portal works without it */
    });
  }, []);
  return null;
}
