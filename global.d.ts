import type { locales } from "@/lib/i18n/routing";
import type messages from "./messages/en.json";

// Types every message key from the English catalogue: a missing key fails the type check.
declare module "next-intl" {
  interface AppConfig {
    Locale: (typeof locales)[number];
    Messages: typeof messages;
  }
}
