// The public device card: server-rendered only (no client JavaScript of its own). Device facts in
// the patient's language and in English, the allergies that matter for a catheter and its gel in
// a bordered warning box, and the care team's phone as a big tel: button. Nothing names the patient.
// Phone numbers and Latin units are isolated left-to-right so Arabic and Urdu do not reorder them.
import { getFormatter, getTranslations } from "next-intl/server";
import { WarningMark } from "@/components/ui/warning-mark";
import { ErrorAlert } from "@/components/ui/notice";
import { buttonClass } from "@/components/ui/button";
import type { DeviceCard } from "@/lib/shared/dto";
import { charriereToMm } from "@/lib/clinical";
import { directionOf, isLocale, type Locale } from "@/lib/i18n/routing";
import { deploymentTimeZone } from "@/lib/shared/time-zone";
import { allergySummary } from "@/lib/clinical/allergies";
import type { CatheterType, GelKind, LengthCategory, Material, Route } from "@/lib/clinical";

/** The patient's language first, then English (once, when that is the patient's). */
/**
 * A left-to-right isolate (U+2066 … U+2069) keeps a phone number in its own order inside RTL
 * text, and no-break spaces keep it on one line (a wrapped number reads out of order).
 */
const isolate = (s: string) => `\u2066${s.replace(/ /g, "\u00a0")}\u2069`;

export function cardLocales(patientLocale: string): Locale[] {
  const first = isLocale(patientLocale) ? patientLocale : "en";
  return first === "en" ? ["en"] : [first, "en"];
}

async function CardInLanguage({ card, locale, first }: { card: DeviceCard; locale: Locale; first: boolean }) {
  const t = await getTranslations({ locale, namespace: "DeviceCard" });
  const p = await getTranslations({ locale, namespace: "PassportPdf" });
  const v = await getTranslations({ locale, namespace: "Vocabulary" });
  const tw = await getTranslations({ locale, namespace: "Twoc" });
  const format = await getFormatter({ locale });
  const timeZone = deploymentTimeZone();
  const d = card.device;
  const day = (iso: string) => format.dateTime(new Date(iso), { weekday: "short", day: "numeric", month: "short", year: "numeric", timeZone });
  const calendarDay = (ymd: string) =>
    format.dateTime(new Date(`${ymd}T12:00:00Z`), { weekday: "short", day: "numeric", month: "short", year: "numeric", timeZone: "UTC" });
  const { present, notRecorded } = allergySummary(card.allergies);
  const allergies = present.map((a) => v(`allergen.${a}`));
  const unknown = notRecorded.length ? p("allergyNotRecorded", { allergens: notRecorded.map((a) => v(`allergen.${a}`)).join(" · ") }) : null;
  const H = first ? "h2" : "h3";
  return (
    <section lang={locale} dir={directionOf(locale)} className="flex flex-col gap-4" data-testid={`card-${locale}`}>
      <H className="text-xl font-bold">{d || !card.removal ? t("sectionTitle") : tw("card.title")}</H>
      {allergies.length || unknown ? (
        // A known allergy is a stop (red, heavy border); only "not recorded" is a warning (amber).
        <div
          role="note"
          className={`flex items-start gap-3 rounded-lg p-3 ${allergies.length ? "border-4 border-level-emergency bg-level-emergency-soft text-level-emergency-ink" : "border-2 border-level-urgent bg-level-urgent-soft text-level-urgent-ink"}`}
          data-testid={allergies.length ? "card-allergies" : undefined}
        >
          <WarningMark className="mt-1 h-6 w-6 shrink-0" />
          <div>
            <p className="font-bold">{t("allergiesTitle")}</p>
            {allergies.length ? <p className="text-xl font-bold">{allergies.join(" · ")}</p> : null}
            {unknown ? (
              <p className={allergies.length ? "font-bold" : "text-xl font-bold"} data-testid="card-allergies-not-recorded">
                {unknown}
              </p>
            ) : null}
            {allergies.length ? <p>{p("allergyCheck")}</p> : null}
          </div>
        </div>
      ) : (
        <p className="rounded-lg border-2 border-stone-faint p-3">{t("noDeviceAllergies")}</p>
      )}
      {d ? (
        <>
          <div className="grid grid-cols-2 gap-3">
            <div className="rounded-lg bg-brand-soft p-3">
              <p className="text-ink-soft">{v("device.size")}</p>
              <p className="tabular text-3xl font-bold" data-testid="card-size">
                <bdi dir="ltr">{v("device.sizeCh", { ch: d.sizeCh })}</bdi>
              </p>
              <p className="tabular">{t("mm", { mm: charriereToMm(d.sizeCh) })}</p>
            </div>
            <div className="rounded-lg bg-brand-soft p-3">
              <p className="text-ink-soft">{v("device.balloon")}</p>
              <p className="tabular text-3xl font-bold" data-testid="card-balloon">
                {t("mlValue", { ml: d.balloonMl })}
              </p>
              <p>{t("sterileWater")}</p>
            </div>
          </div>
          <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-2">
            <dt className="text-ink-soft">{p("insertedOn")}</dt>
            <dd className="tabular font-bold">{day(d.insertedAt)}</dd>
            <dt className="text-ink-soft">{p("nextChange")}</dt>
            <dd className="tabular font-bold" data-testid="card-next-change">{calendarDay(d.plannedChangeOn)}</dd>
            <dt className="text-ink-soft">{v("device.route")}</dt>
            <dd>{v(`route.${d.route as Route}`)}</dd>
            <dt className="text-ink-soft">{v("device.type")}</dt>
            <dd>{v(`catheterType.${d.catheterType as CatheterType}`)}</dd>
            <dt className="text-ink-soft">{v("device.material")}</dt>
            <dd>{v(`material.${d.material as Material}`)}</dd>
            <dt className="text-ink-soft">{v("device.length")}</dt>
            <dd>{v(`lengthCategory.${d.lengthCategory as LengthCategory}`)}</dd>
            <dt className="text-ink-soft">{t("gel")}</dt>
            <dd>{v(`gelKind.${d.gelKind as GelKind}`)}</dd>
            <dt className="text-ink-soft">{t("drainage")}</dt>
            <dd data-testid="card-drainage">{card.drainage ? t(`drainageKind.${card.drainage}`) : t("notRecorded")}</dd>
            <dt className="text-ink-soft">{v("device.lot")}</dt>
            <dd className="tabular" data-testid="card-lot">{d.lot ? <bdi dir="ltr">{d.lot}</bdi> : t("notRecorded")}</dd>
            <dt className="text-ink-soft">{v("device.expiry")}</dt>
            <dd className="tabular">{d.expiry ? calendarDay(d.expiry) : t("notRecorded")}</dd>
          </dl>
          {/* Before recatheterising: was the last insertion difficult? */}
          <div
            role="note"
            className={`rounded-lg p-3 ${d.difficult ? "border-4 border-level-urgent bg-level-urgent-soft text-level-urgent-ink" : "border-2 border-stone-faint"}`}
            data-testid="card-insertion"
          >
            <p className="font-bold">{d.difficult ? t("difficultInsertion") : t("easyInsertion")}</p>
            {d.difficulties ? <p>{d.difficulties}</p> : null}
          </div>
        </>
      ) : (
        <p className="font-bold" data-testid="card-removed">
          {card.removal
            ? tw(card.removal.trial === "passed" ? "card.removedPassed" : card.removal.trial === "under-way" ? "card.removedTrial" : "card.removed", { date: day(card.removal.removedAt) })
            : t("noDevice")}
        </p>
      )}
      <p className="text-base text-ink-soft">{t("safety")}</p>
    </section>
  );
}

export async function DeviceCardView({ card, locale, visitHref }: { card: DeviceCard; locale: string; visitHref: string }) {
  const t = await getTranslations({ locale: isLocale(locale) ? locale : "en", namespace: "DeviceCard" });
  // The reader's language first (on /en the English half), then the patient's.
  const locales = cardLocales(card.patientLocale).sort((a, b) => Number(b === locale) - Number(a === locale));
  const phone = card.careTeam?.phone ?? null;
  const ooh = card.careTeam?.outOfHoursPhone ?? null;
  return (
    <div className="flex flex-col gap-6">
      <div>
        <h1 className="text-3xl font-bold">{t("title")}</h1>
        <p className="text-ink-soft">{t("intro")}</p>
      </div>
      {locales.map((l, i) => (
        <div key={l} className={i ? "border-t-2 border-stone-faint pt-6" : ""}>
          <CardInLanguage card={card} locale={l} first={i === 0} />
        </div>
      ))}
      <div className="flex flex-col gap-3">
        <h2 className="text-xl font-bold">{t("careTeam")}</h2>
        {card.careTeam ? <p className="font-bold" data-testid="card-team">{card.careTeam.name}</p> : null}
        {phone ? (
          <a href={`tel:${phone.replace(/[^\d+]/g, "")}`} className={buttonClass("primary", "min-h-14 text-xl")} data-testid="card-phone">
            {t("call", { phone: isolate(phone) })}
          </a>
        ) : (
          <p>{t("noPhone")}</p>
        )}
        {ooh ? (
          <a href={`tel:${ooh.replace(/[^\d+]/g, "")}`} className={buttonClass("secondary", "min-h-14 text-lg")} data-testid="card-out-of-hours">
            {t("callOutOfHours", { phone: isolate(ooh) })}
            {card.careTeam?.outOfHoursServiceName ? ` · ${card.careTeam.outOfHoursServiceName}` : ""}
          </a>
        ) : null}
      </div>
      <div className="flex flex-col gap-2 rounded-card border-2 border-brand p-4">
        <h2 className="text-lg font-bold">{t("clinicianTitle")}</h2>
        <p>{t("clinicianBody")}</p>
        <a href={visitHref} className={buttonClass("secondary")} data-testid="card-sign-in">
          {t("clinicianButton")}
        </a>
      </div>
    </div>
  );
}

/** The one page for a revoked, unknown or mistyped passport: it never says which. */
export async function InvalidPassport({ locale }: { locale: string }) {
  const locales: Locale[] = isLocale(locale) && locale !== "en" ? [locale, "en"] : ["en"];
  return (
    <div className="flex flex-col gap-4" data-testid="card-invalid">
      {await Promise.all(
        locales.map(async (l, i) => {
          const t = await getTranslations({ locale: l, namespace: "DeviceCard" });
          const H = i === 0 ? "h1" : "h2";
          return (
            <section key={l} lang={l} dir={directionOf(l)} className={i ? "border-t-2 border-stone-faint pt-4" : ""}>
              <H className="text-2xl font-bold">{t("invalidTitle")}</H>
              <p>{t("invalidBody")}</p>
            </section>
          );
        }),
      )}
    </div>
  );
}

/** A typed code with a typing mistake (its check symbol does not match): check it and type again. */
export async function MistypedCode({ locale }: { locale: string }) {
  const locales: Locale[] = isLocale(locale) && locale !== "en" ? [locale, "en"] : ["en"];
  const texts = await Promise.all(locales.map(async (l) => ({ l, text: (await getTranslations({ locale: l, namespace: "DeviceCard" }))("checkCode") })));
  return (
    <ErrorAlert message={<span lang={texts[0].l} dir={directionOf(texts[0].l)}>{texts[0].text}</span>} testId="card-typo">
      {texts.slice(1).map(({ l, text }) => (
        <p key={l} lang={l} dir={directionOf(l)} className="font-bold">
          {text}
        </p>
      ))}
    </ErrorAlert>
  );
}
