import "server-only";
// Dates and numbers for server components (lib/shared/formats): the request's language with the
// deployment's region from Settings, read once per request.
import { getLocale, getTimeZone } from "next-intl/server";
import { cache } from "react";
import { getRegion } from "@/lib/config/settings";
import { makeFormat } from "@/lib/shared/formats";

/** The deployment's region for formatting, once per request. */
export const requestRegion = cache(() => getRegion());

export async function getFormat(options: { locale?: string } = {}) {
  const [locale, timeZone, region] = await Promise.all([options.locale ?? getLocale(), getTimeZone(), requestRegion()]);
  return makeFormat({ locale, region, timeZone });
}
