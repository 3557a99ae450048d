import "server-only";
// The public device card, its short-code form and its "no longer valid", "typing mistake" and
// 429 answers, as plain HTML documents: no framework runtime, no script, no web font, one small
// stylesheet (print included). A paramedic on a doorstep with a poor connection gets the whole
// card in one answer of a few kilobytes, and it works with scripts turned off.
// Why not a React page: every app-router page ships the framework's runtime (about 200 KiB of
// JavaScript), which this page needs none of. The route handlers in app/[locale]/p call these.
// Nothing here names the patient. Phone numbers and Latin units are isolated left-to-right so
// Arabic and Urdu do not reorder them.
import type { DeviceCard } from "@/db/queries/passport-card";
import { allergySummary, charriereToMm, type CatheterType, type GelKind, type LengthCategory, type Material, type Route } from "@/lib/clinical";
import { formatterFor, translatorFor } from "@/lib/i18n/catalogues";
import { directionOf, isLocale, type Locale } from "@/lib/i18n/routing";
import { deploymentTimeZone } from "@/lib/shared/time-zone";
import { withSecretUrlHeaders } from "@/lib/http/secret-headers";
import { html, SafeHtml as Safe } from "@/lib/shared/html";

/**
 * A left-to-right isolate (U+2066 … U+2069) keeps a phone number in its own order inside RTL
 * text, and no-break spaces keep it on one line (a wrapped number reads out of order).
 */
const isolate = (s: string) => `\u2066${s.replace(/ /g, "\u00a0")}\u2069`;
const telHref = (phone: string) => `tel:${phone.replace(/[^\d+]/g, "")}`;

/**
 * The card's two languages, the patient's and English (once, when they are the same), the page's
 * language first when it is one of them: on /en the English half leads, on the patient's own
 * language that half does.
 */
export function cardLocales(patientLocale: string, pageLocale: string): Locale[] {
  const patient = isLocale(patientLocale) ? patientLocale : "en";
  const both: Locale[] = patient === "en" ? ["en"] : [patient, "en"];
  return both.includes(pageLocale as Locale) ? [pageLocale as Locale, ...both.filter((l) => l !== pageLocale)] : both;
}

/** The page's own language, then English. */
const pageLocales = (locale: string): Locale[] => (isLocale(locale) && locale !== "en" ? [locale, "en"] : ["en"]);

// Colours are the design's (tailwind.config.ts); system fonts only, so no font file is fetched.
const STYLE = `*{box-sizing:border-box}body{margin:0;font-family:system-ui,-apple-system,"Segoe UI",Roboto,"Noto Sans","Noto Sans Arabic","Noto Nastaliq Urdu",sans-serif;font-size:1.125rem;line-height:1.5;color:#1c1f21;background:#faf7f0;overflow-wrap:break-word}
header{display:flex;align-items:center;gap:.5rem;padding:1rem 1.25rem;font-size:1.5rem;font-weight:700;color:#0b5563}header svg{width:2.25rem;height:2.25rem}
main{max-width:36rem;margin:0 auto;padding:0 1.25rem 3rem;display:flex;flex-direction:column;gap:1.5rem}
footer{padding:1rem 1.25rem;text-align:center;font-size:.875rem;color:#4f565b}
h1{font-size:1.875rem;line-height:1.2;margin:0}h2,h3{font-size:1.25rem;margin:0}p{margin:0}
.soft{color:#4f565b}.col{display:flex;flex-direction:column;gap:1rem}.tight{gap:.25rem}.lang+.lang{border-top:2px solid #d9d3c6;padding-top:1.5rem}
.note{display:flex;gap:.75rem;align-items:flex-start;border-radius:.5rem;padding:.75rem}.note svg{width:1.5rem;height:1.5rem;flex-shrink:0;margin-top:.25rem}
.stop{border:4px solid #a4231b;background:#fbe6e3;color:#7a1710}.warn{border:2px solid #8a4b00;background:#fdf0d9;color:#6b3a00}.plain{border:2px solid #d9d3c6}
.b{font-weight:700}.xl{font-size:1.25rem;font-weight:700}
.tiles{display:grid;grid-template-columns:1fr 1fr;gap:.75rem}.tile{background:#dcebec;border-radius:.5rem;padding:.75rem}
.big{font-size:1.875rem;font-weight:700}.num{font-variant-numeric:tabular-nums;white-space:nowrap}
dl{display:grid;grid-template-columns:auto 1fr;gap:.5rem 1rem;margin:0}dt{color:#4f565b}dd{margin:0}
.btn{display:flex;align-items:center;justify-content:center;min-height:3.5rem;border-radius:.5rem;padding:.5rem 1rem;font:inherit;font-weight:700;text-align:center;text-decoration:none;cursor:pointer}
.primary{background:#0b5563;color:#fff;border:0;font-size:1.25rem}.secondary{background:#fff;color:#0b5563;border:2px solid #0b5563}
.box{display:flex;flex-direction:column;gap:.5rem;border:2px solid #0b5563;border-radius:1rem;padding:1rem}
.alert{border:2px solid #a4231b;background:#fbe6e3;color:#7a1710;border-radius:.5rem;padding:.75rem;font-weight:700}
label{font-weight:700}input{min-height:3.5rem;font:inherit;font-size:1.5rem;letter-spacing:.05em;border:2px solid #8c8678;border-radius:.5rem;padding:0 .75rem;background:#fff;color:#1c1f21}
a:focus-visible,input:focus-visible,button:focus-visible{outline:3px solid #1f4e99;outline-offset:2px}
@media (max-width:22em){.tiles{grid-template-columns:1fr}dl{grid-template-columns:1fr}}
@media print{body{background:#fff;font-size:11pt}header,main{padding:0}.box,form{display:none}.btn{justify-content:flex-start;min-height:0;padding:0;background:none;color:#000;border:0}}`;

const MARK = `<svg viewBox="0 0 32 32" aria-hidden="true"><rect x="9" y="3" width="14" height="26" rx="7" fill="#0b5563"/><rect x="12" y="6" width="8" height="20" rx="4" fill="#faf7f0"/><path d="M12 11h8M12 16h8M12 21h8" stroke="#0b5563" stroke-width="2"/></svg>`;
const WARNING = `<svg viewBox="0 0 16 16" aria-hidden="true"><path d="M8 1.5 15 14.5H1z" fill="currentColor"/><path d="M8 6v4" stroke="#fff" stroke-width="1.8" stroke-linecap="round"/><circle cx="8" cy="12.3" r="1" fill="#fff"/></svg>`;

/** A whole document in the card's frame: the Caddis mark, the content, the passport footer. */
export function cardDocument({ locale, title, body }: { locale: string; title: string; body: Safe }): string {
  const l = isLocale(locale) ? locale : "en";
  const t = translatorFor(l, "DeviceCard");
  return `<!doctype html>${html`<html lang="${l}" dir="${directionOf(l)}"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><meta name="robots" content="noindex, nofollow"><meta name="referrer" content="no-referrer"><title>${title}</title><style>${new Safe(STYLE)}</style></head><body><header>${new Safe(MARK)}<span>Caddis</span></header><main>${body}</main><footer>${t("footer")}</footer></body></html>`.value}`;
}

function cardInLanguage(card: DeviceCard, locale: Locale, first: boolean, region: string | null): Safe {
  const t = translatorFor(locale, "DeviceCard");
  const p = translatorFor(locale, "PassportPdf");
  const v = translatorFor(locale, "Vocabulary");
  const format = formatterFor(locale, region);
  const d = card.device;
  const day = (iso: string) => format.dateTime(new Date(iso), { weekday: "short", day: "numeric", month: "short", year: "numeric", timeZone: deploymentTimeZone() });
  const calendarDay = (ymd: string) => format.dateTime(new Date(`${ymd}T12:00:00Z`), { weekday: "short", day: "numeric", month: "short", year: "numeric", timeZone: "UTC" });
  const { present, notRecorded } = allergySummary(card.allergies);
  const allergies = present.map((a) => v(`allergen.${a}`));
  const unknown = notRecorded.length ? p("allergyNotRecorded", { allergens: notRecorded.map((a) => v(`allergen.${a}`)).join(" · ") }) : null;
  const tw = translatorFor(locale, "Twoc");
  const H = new Safe(first ? "h2" : "h3");
  // A known allergy is a stop (red, heavy border); only "not recorded" is a warning (amber).
  const allergyBox =
    allergies.length || unknown
      ? html`<div role="note" class="note ${allergies.length ? "stop" : "warn"}"${new Safe(allergies.length ? ' data-testid="card-allergies"' : "")}>${new Safe(WARNING)}<div><p class="b">${t("allergiesTitle")}</p>${
          allergies.length ? html`<p class="xl">${allergies.join(" · ")}</p>` : ""
        }${unknown ? html`<p class="${allergies.length ? "b" : "xl"}" data-testid="card-allergies-not-recorded">${unknown}</p>` : ""}${allergies.length ? html`<p>${p("allergyCheck")}</p>` : ""}</div></div>`
      : html`<p class="note plain">${t("noDeviceAllergies")}</p>`;
  const device = d
    ? html`<div class="tiles"><div class="tile"><p class="soft">${v("device.size")}</p><p class="big num" data-testid="card-size"><bdi dir="ltr">${v("device.sizeCh", { ch: d.sizeCh })}</bdi></p><p class="num">${t("mm", { mm: charriereToMm(d.sizeCh) })}</p></div><div class="tile"><p class="soft">${v("device.balloon")}</p><p class="big num" data-testid="card-balloon">${t("mlValue", { ml: d.balloonMl })}</p><p>${t("sterileWater")}</p></div></div><dl><dt>${p("insertedOn")}</dt><dd class="b num">${day(d.insertedAt)}</dd><dt>${p("nextChange")}</dt><dd class="b num" data-testid="card-next-change">${calendarDay(d.plannedChangeOn)}</dd><dt>${v("device.route")}</dt><dd>${v(`route.${d.route as Route}`)}</dd><dt>${v("device.type")}</dt><dd>${v(`catheterType.${d.catheterType as CatheterType}`)}</dd><dt>${v("device.material")}</dt><dd>${v(`material.${d.material as Material}`)}</dd><dt>${v("device.length")}</dt><dd>${v(`lengthCategory.${d.lengthCategory as LengthCategory}`)}</dd><dt>${t("gel")}</dt><dd>${v(`gelKind.${d.gelKind as GelKind}`)}</dd><dt>${t("drainage")}</dt><dd data-testid="card-drainage">${card.drainage ? t(`drainageKind.${card.drainage}`) : t("notRecorded")}</dd><dt>${v("device.lot")}</dt><dd class="num" data-testid="card-lot">${d.lot ? html`<bdi dir="ltr">${d.lot}</bdi>` : t("notRecorded")}</dd><dt>${v("device.expiry")}</dt><dd class="num">${d.expiry ? calendarDay(d.expiry) : t("notRecorded")}</dd></dl><div role="note" class="note ${d.difficult ? "warn" : "plain"}" data-testid="card-insertion"><div><p class="b">${d.difficult ? t("difficultInsertion") : t("easyInsertion")}</p>${d.difficulties ? html`<p>${d.difficulties}</p>` : ""}</div></div>`
    : html`<p class="b" data-testid="card-removed">${
        card.removal
          ? tw(card.removal.trial === "passed" ? "card.removedPassed" : card.removal.trial === "under-way" ? "card.removedTrial" : "card.removed", { date: day(card.removal.removedAt) })
          : t("noDevice")
      }</p>`;
  return html`<section lang="${locale}" dir="${directionOf(locale)}" class="col lang" data-testid="card-${locale}"><${H}>${d || !card.removal ? t("sectionTitle") : tw("card.title")}</${H}>${allergyBox}${device}<p class="soft">${t("safety")}</p></section>`;
}

/** The device card: device facts in the patient's language and English, the care team's phone. */
export function deviceCardDocument({ card, locale, visitHref, region }: { card: DeviceCard; locale: string; visitHref: string; region: string | null }): string {
  const t = translatorFor(locale, "DeviceCard");
  const phone = card.careTeam?.phone ?? null;
  const ooh = card.careTeam?.outOfHoursPhone ?? null;
  const body = html`<div><h1>${t("title")}</h1><p class="soft">${t("intro")}</p></div>${cardLocales(card.patientLocale, locale).map((l, i) => cardInLanguage(card, l, i === 0, region))}<div class="col"><h2>${t("careTeam")}</h2>${card.careTeam ? html`<p class="b" data-testid="card-team">${card.careTeam.name}</p>` : ""}${
    phone ? html`<a href="${telHref(phone)}" class="btn primary" data-testid="card-phone">${t("call", { phone: isolate(phone) })}</a>` : html`<p>${t("noPhone")}</p>`
  }${ooh ? html`<a href="${telHref(ooh)}" class="btn secondary" data-testid="card-out-of-hours">${t("callOutOfHours", { phone: isolate(ooh) })}${card.careTeam?.outOfHoursServiceName ? ` · ${card.careTeam.outOfHoursServiceName}` : ""}</a>` : ""}</div><div class="box"><h2>${t("clinicianTitle")}</h2><p>${t("clinicianBody")}</p><a href="${visitHref}" class="btn secondary" data-testid="card-sign-in">${t("clinicianButton")}</a></div>`;
  return cardDocument({ locale, title: t("title"), body });
}

/** One answer for a revoked, unknown or mistyped passport: it never says which. */
function invalidBlock(locale: string): Safe {
  return html`<div class="col" data-testid="card-invalid">${pageLocales(locale).map((l, i) => {
    const t = translatorFor(l, "DeviceCard");
    const H = new Safe(i === 0 ? "h1" : "h2");
    return html`<section lang="${l}" dir="${directionOf(l)}" class="lang"><${H}>${t("invalidTitle")}</${H}><p>${t("invalidBody")}</p></section>`;
  })}</div>`;
}

/** A typed code with a typing mistake (its check symbol does not match): check it and type again. */
function typoBlock(locale: string): Safe {
  return html`<div role="alert" class="alert" data-testid="card-typo">${pageLocales(locale).map((l) => html`<p lang="${l}" dir="${directionOf(l)}">${translatorFor(l, "DeviceCard")("checkCode")}</p>`)}</div>`;
}

export function invalidCardDocument(locale: string): string {
  return cardDocument({ locale, title: translatorFor(locale, "DeviceCard")("invalidTitle"), body: invalidBlock(locale) });
}

export function typoCardDocument(locale: string): string {
  return cardDocument({ locale, title: translatorFor(locale, "DeviceCard")("codeTitle"), body: typoBlock(locale) });
}

/**
 * Typing the passport code: a plain GET form, so it works without JavaScript. With a notice
 * above it when the typed code was unknown, revoked or mistyped.
 */
export function shortCodeDocument({ locale, typed, notice }: { locale: string; typed: string; notice: "invalid" | "typo" | null }): string {
  const t = translatorFor(locale, "DeviceCard");
  const l = isLocale(locale) ? locale : "en";
  const body = html`${notice === "invalid" ? invalidBlock(l) : notice === "typo" ? typoBlock(l) : ""}<form method="get" action="/${l}/p/code" class="col">${
    notice ? "" : html`<h1>${t("codeTitle")}</h1>`
  }<div class="col tight"><label for="code">${t("codeLabel")}</label><p id="code-hint" class="soft">${t("codeHint")}</p><input id="code" name="code" value="${typed}" autocomplete="off" autocapitalize="characters" spellcheck="false" maxlength="40" dir="ltr" aria-describedby="code-hint" class="num" data-testid="code-input"></div><button type="submit" class="btn primary">${t("codeSubmit")}</button></form>`;
  return cardDocument({ locale, title: t("codeTitle"), body });
}

/** The 429 page, in the visitor's language and English, with status 429 and Retry-After. */
export function limitedPage(locale: string, retryAfterSeconds: number): Response {
  const body = html`${pageLocales(locale).map((l, i) => {
    const t = translatorFor(l, "DeviceCard");
    const H = new Safe(i === 0 ? "h1" : "h2");
    return html`<section lang="${l}" dir="${directionOf(l)}" class="col lang"><${H}>${t("limitedTitle")}</${H}><p>${t("limitedBody")}</p></section>`;
  })}`;
  return new Response(cardDocument({ locale, title: translatorFor(locale, "DeviceCard")("limitedTitle"), body }), {
    status: 429,
    headers: { "content-type": "text/html; charset=utf-8", "retry-after": String(retryAfterSeconds) },
  });
}

/**
 * The card's own policy: these documents carry no script, so none may run; styles are inline.
 * (Pages get a per-request nonce from proxy.ts; the card's paths skip the proxy altogether.)
 */
export const CARD_CSP = [
  "default-src 'none'",
  "script-src 'none'",
  "style-src 'unsafe-inline'",
  "img-src 'self' data:",
  "form-action 'self'",
  "base-uri 'none'",
  "object-src 'none'",
  "frame-ancestors 'none'",
].join("; ");

/**
 * Every answer on the card's paths, 429s included: the card's policy and the secret-URL headers
 * (no-referrer, no-store, noindex). Set here because proxy.ts does not run on these paths: the
 * card's every request skips the middleware (its matcher in proxy.ts).
 */
export function cardAnswer(pathname: string, response: Response): Response {
  response.headers.set("Content-Security-Policy", CARD_CSP);
  return withSecretUrlHeaders(pathname, response);
}

/** A card document as the answer. */
export function htmlResponse(document: string, status = 200): Response {
  return new Response(document, { status, headers: { "content-type": "text/html; charset=utf-8" } });
}
