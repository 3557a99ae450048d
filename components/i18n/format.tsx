"use client";
// Dates and numbers in the browser: the page's language with the deployment's region (Settings),
// through lib/shared/formats like the server. The region reaches the browser from the layout.
import { useLocale, useNow, useTimeZone } from "next-intl";
import { createContext, useContext, useMemo, type ReactNode } from "react";
import { makeFormat, type Format } from "@/lib/shared/formats";
import { deploymentTimeZone } from "@/lib/shared/time-zone";

const RegionContext = createContext<string | null>(null);

export function FormatRegion({ region, children }: { region: string | null; children: ReactNode }) {
  return <RegionContext.Provider value={region}>{children}</RegionContext.Provider>;
}

export function useFormat(): Format {
  const locale = useLocale();
  const timeZone = useTimeZone() ?? deploymentTimeZone();
  const now = useNow();
  const region = useContext(RegionContext);
  const day = now.toISOString().slice(0, 10);
  // eslint-disable-next-line react-hooks/exhaustive-deps -- a new formatter per day is enough
  return useMemo(() => makeFormat({ locale, region, timeZone, now }), [locale, region, timeZone, day]);
}
