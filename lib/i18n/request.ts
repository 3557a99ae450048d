import "server-only";
import { hasLocale } from "next-intl";
import { deploymentTimeZone } from "@/lib/shared/time-zone";
import { getRequestConfig } from "next-intl/server";
import { messagesFor } from "./catalogues";
import { routing } from "./routing";

export default getRequestConfig(async ({ requestLocale }) => {
  const requested = await requestLocale;
  const locale = hasLocale(routing.locales, requested) ? requested : routing.defaultLocale;
  return {
    locale,
    messages: messagesFor(locale),
    timeZone: deploymentTimeZone(),
  };
});
