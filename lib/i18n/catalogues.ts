import "server-only";
// The one loader of the message catalogues for server code: e-mails, PDFs, CSV, the card's 429
// page and each request's messages (lib/i18n/request.ts). A locale Caddis does not have falls
// back to English. Dates and numbers are formatted in the deployment's time zone and region.
import { createTranslator, type NamespaceKeys, type NestedKeyOf } from "next-intl";
import { makeFormat } from "@/lib/shared/formats";
import { deploymentTimeZone } from "@/lib/shared/time-zone";
import ar from "@/messages/ar.json";
import en from "@/messages/en.json";
import es from "@/messages/es.json";
import pl from "@/messages/pl.json";
import ro from "@/messages/ro.json";
import ur from "@/messages/ur.json";
import { isLocale, routing, type Locale } from "./routing";

export type Messages = typeof en;

const catalogues = { en, es, pl, ro, ar, ur } as Record<Locale, Messages>;

/** The locale to write in: the one asked for when Caddis has it, else English. */
export function catalogueLocale(value: string | null | undefined): Locale {
  return value && isLocale(value) ? value : routing.defaultLocale;
}

export function messagesFor(locale: string): Messages {
  return catalogues[catalogueLocale(locale)];
}

const translators = new Map<string, unknown>();

/**
 * next-intl's translator for one namespace, outside a React request. Kept per locale and
 * namespace: a translator keeps each message it has parsed, so the device card (a few dozen
 * messages in two languages on every view) parses them once per process, not per request. A
 * message asked for without values is the same text every time, so it is also kept as text
 * (formatting it again cost the card about a third of its rendering).
 */
export function translatorFor<N extends NamespaceKeys<Messages, NestedKeyOf<Messages>>>(locale: string, namespace: N) {
  const l = catalogueLocale(locale);
  const key = `${l}:${namespace}`;
  let t = translators.get(key) as ReturnType<typeof createTranslator<Messages, N>> | undefined;
  if (!t) {
    t = keepPlainTexts(createTranslator({ locale: l, messages: catalogues[l], namespace }) as unknown as Translate) as unknown as NonNullable<typeof t>;
    translators.set(key, t);
  }
  return t;
}

type Translate = (key: string, ...rest: unknown[]) => string;

/** The translator, with each message asked for without values formatted once. */
function keepPlainTexts(t: Translate): Translate {
  const texts = new Map<string, string>();
  const kept: Translate = (key, ...rest) => {
    if (rest.length) return t(key, ...rest);
    let text = texts.get(key);
    if (text === undefined) texts.set(key, (text = t(key)));
    return text;
  };
  // t.rich, t.markup, t.raw and t.has as they were.
  return Object.assign(kept, t);
}

/** Dates and numbers (lib/shared/formats) in a locale and the deployment's region (Settings `region`). */
export function formatterFor(locale: string, region: string | null) {
  return makeFormat({ locale: catalogueLocale(locale), region, timeZone: deploymentTimeZone() });
}
