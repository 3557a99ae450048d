import { useTranslations } from "next-intl";
import { PhoneIcon } from "./nav-icons";

export type Contacts = {
  emergencyNumber: string | null;
  team: { name: string; phone: string | null; outOfHoursPhone: string | null }[];
};

export function telHref(phone: string) {
  return `tel:${phone.replace(/[^+0-9]/g, "")}`;
}

/**
 * A phone number kept left to right inside right-to-left text (Unicode isolates), so that
 * "01632 960 210" is not shown as "210 960 01632" in Arabic or Urdu.
 */
export function ltr(text: string) {
  // In large text the number may wrap between its groups ("01632 960" / "101"), never inside one.
  return `\u2066${text}\u2069`;
}

/** A name in its own direction (first strong character) inside the other language's text. */
export function isolate(text: string) {
  return `\u2068${text}\u2069`;
}

/**
 * The numbers to call as big tel: buttons. In large text the words wrap and the number (one
 * piece, never split) goes under the phone mark rather than break. The emergency number comes from the deployment's
 * settings; when it is missing we say so rather than guess one.
 */
export function CallButtons({ contacts, emergencyFirst = true, showEmergency = true }: { contacts: Contacts; emergencyFirst?: boolean; showEmergency?: boolean }) {
  const t = useTranslations("Portal.call");
  const emergency = !showEmergency ? null : contacts.emergencyNumber ? (
    <a
      key="emergency"
      href={telHref(contacts.emergencyNumber)}
      className="flex min-h-14 flex-wrap items-center gap-x-3 gap-y-1 rounded-lg bg-level-emergency px-4 py-2 text-lg font-bold text-white"
      data-testid="call-emergency"
    >
      <PhoneIcon className="h-7 w-7 shrink-0" />
      <span className="flex-1 basis-48">{t("emergency", { number: ltr(contacts.emergencyNumber) })}</span>
    </a>
  ) : (
    <p key="emergency" className="rounded-lg border-2 border-level-emergency bg-level-emergency-soft p-3 font-bold text-level-emergency-ink" data-testid="emergency-not-configured">
      {t("emergencyMissing")}
    </p>
  );
  const team = contacts.team.flatMap((o) => [
    o.phone ? (
      <a key={`${o.name}-day`} href={telHref(o.phone)} className="flex min-h-14 flex-wrap items-center gap-x-3 gap-y-1 rounded-lg border-2 border-brand bg-paper-raised px-4 py-2 font-bold text-brand" data-testid="call-team">
        <PhoneIcon className="h-7 w-7 shrink-0" />
        <span className="flex-1 basis-48">{t("team", { team: isolate(o.name), number: ltr(o.phone) })}</span>
      </a>
    ) : null,
    o.outOfHoursPhone ? (
      <a key={`${o.name}-ooh`} href={telHref(o.outOfHoursPhone)} className="flex min-h-14 flex-wrap items-center gap-x-3 gap-y-1 rounded-lg border-2 border-brand bg-paper-raised px-4 py-2 font-bold text-brand">
        <PhoneIcon className="h-7 w-7 shrink-0" />
        <span className="flex-1 basis-48">{t("outOfHours", { number: ltr(o.outOfHoursPhone) })}</span>
      </a>
    ) : null,
  ]);
  const noTeam = contacts.team.every((o) => !o.phone && !o.outOfHoursPhone) ? <p key="no-team">{t("teamMissing")}</p> : null;
  return <div className="flex flex-col gap-3">{emergencyFirst ? [emergency, ...team, noTeam] : [...team, noTeam, emergency]}</div>;
}

/** Every guidance page and result: general information, not a diagnosis, and who to call. */
export function SafetyNotice({ contacts, withNumbers = true }: { contacts: Contacts; withNumbers?: boolean }) {
  const t = useTranslations("Portal.safety");
  return (
    <aside aria-labelledby="safety-title" className="flex flex-col gap-3 rounded-card border-2 border-stone-line bg-paper-sunk p-4" data-testid="safety-notice">
      <h2 id="safety-title" className="text-xl font-bold">
        {t("title")}
      </h2>
      <p>{t("body")}</p>
      {withNumbers ? <CallButtons contacts={contacts} /> : null}
    </aside>
  );
}
