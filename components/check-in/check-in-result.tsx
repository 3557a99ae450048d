"use client";
import { useTranslations } from "next-intl";
import { useEffect, useMemo, useRef, useState } from "react";
import { CallButtons, SafetyNotice, type Contacts } from "@/components/portal/call-buttons";
import { WithTerms, type Glossary } from "@/components/glossary/glossary-term";
import { LevelBadge } from "@/components/portal/level-badge";
import { Picture, type PictureKey } from "@/components/pictures/pictures";

/** Drawings that show an advice line (the first one in the result that has one). */
const ADVICE_PICTURES: Partial<Record<string, PictureKey>> = { "check-tube": "kinkedTube", "bag-low": "bagBelowBladder", drink: "drinking" };
import { scoreAnswers, type SubmittedAnswers } from "@/lib/shared/check-in-flow";
import { compareTriageLevels, TRIAGE_LEVELS, type Route, type TriageLevel } from "@/lib/clinical";
import { Link } from "@/lib/i18n/navigation";
import type { OutboxEventDetail } from "@/lib/browser/outbox";
import { checkInOutbox, enqueueCheckIn, OUTBOX_EVENT } from "./outbox";

type Delivery = "sending" | "sent" | "waiting" | "refused";

/**
 * The result: the level (word, mark and colour), what to do now, who to call, and why. It is
 * worked out on the phone with lib/clinical so it shows at once, online or not; the check-in is
 * put in the phone's outbox first and sent from there, so it is never lost.
 */
export function CheckInResult({
  patientId,
  route,
  afterCatheter,
  answers,
  idempotencyKey,
  contacts,
  glossary,
}: {
  patientId: string;
  route: Route | null;
  afterCatheter: boolean;
  answers: SubmittedAnswers;
  idempotencyKey: string;
  contacts: Contacts;
  glossary?: Glossary | null;
}) {
  const t = useTranslations("CheckIn");
  const tp = useTranslations("Pictures");
  const local = useMemo(() => scoreAnswers(answers, route, afterCatheter), [answers, route, afterCatheter]);
  const [delivery, setDelivery] = useState<Delivery>("sending");
  const [serverLevel, setServerLevel] = useState<TriageLevel | null>(null);
  const headingRef = useRef<HTMLHeadingElement>(null);

  useEffect(() => {
    headingRef.current?.focus();
    const onSent = (e: Event) => {
      const d = (e as CustomEvent<OutboxEventDetail>).detail;
      if (d.queue !== checkInOutbox.name || !("key" in d) || d.key !== idempotencyKey) return;
      setDelivery(d.ok ? "sent" : "refused");
      const level = (d.body as { checkIn?: { level?: string } } | null)?.checkIn?.level;
      if (d.ok && level && (TRIAGE_LEVELS as readonly string[]).includes(level)) setServerLevel(level as TriageLevel);
    };
    window.addEventListener(OUTBOX_EVENT, onSent);
    enqueueCheckIn({ patientId, idempotencyKey, answers });
    void checkInOutbox.flush().then(() => setDelivery((d) => (d === "sending" ? "waiting" : d)));
    return () => window.removeEventListener(OUTBOX_EVENT, onSent);
  }, [patientId, idempotencyKey, answers]);

  if (!local) return null;
  const { result } = local;
  // Should the server's rules ever answer higher than the phone's, the higher level is shown.
  const level = serverLevel && compareTriageLevels(serverLevel, result.level) > 0 ? serverLevel : result.level;
  const callFirstEmergency = level === "emergency";

  return (
    <section aria-labelledby="result-title" className="flex flex-col gap-5" data-testid="check-in-result" data-level={level} data-delivery={delivery}>
      <h1 id="result-title" ref={headingRef} tabIndex={-1} className="text-3xl font-bold outline-none">
        {t("result.title")}
      </h1>
      <LevelBadge level={level} />
      <DeliveryNote delivery={delivery} />

      <div className="flex flex-col gap-3">
        <h2 className="text-2xl font-bold">{t("result.whatToDo")}</h2>
        <ul className="flex list-disc flex-col gap-2 ps-6 text-lg">
          {result.advice.map((a) => (
            <li key={a.key}>
              <WithTerms text={t.has(`advice.${a.key}` as never) ? t(`advice.${a.key}` as never) : a.text} glossary={glossary} />
            </li>
          ))}
        </ul>
      </div>

      <div className="flex flex-col gap-3">
        <h2 className="text-2xl font-bold">{t("result.whoToCall")}</h2>
        <CallButtons contacts={contacts} emergencyFirst={callFirstEmergency} />
      </div>

      {result.reasons.length ? (
        <div className="flex flex-col gap-3">
          <h2 className="text-2xl font-bold">{t("result.why")}</h2>
          <ul className="flex list-disc flex-col gap-2 ps-6 text-lg">
            {result.reasons.map((r) => (
              <li key={r.ruleId}>
                <WithTerms text={t.has(`reason.${r.key}` as never) ? t(`reason.${r.key}` as never) : r.text} glossary={glossary} />
              </li>
            ))}
          </ul>
        </div>
      ) : (
        <p>{t("result.noProblems")}</p>
      )}
      {/* The drawings come after who to call: in an emergency nothing stands before the numbers. */}
      {level !== "emergency"
        ? result.advice
            .flatMap((a) => (ADVICE_PICTURES[a.key] ? [ADVICE_PICTURES[a.key]!] : []))
            .slice(0, 2)
            .map((name) => <Picture key={name} name={name} alt={tp(name)} />)
        : null}

      <Link href="/today" className="flex min-h-14 items-center justify-center rounded-lg bg-brand px-4 text-xl font-bold text-white">
        {t("result.done")}
      </Link>
      {/* The numbers are under "Who to call" above. */}
      <SafetyNotice contacts={contacts} withNumbers={false} />
    </section>
  );
}

function DeliveryNote({ delivery }: { delivery: Delivery }) {
  const t = useTranslations("CheckIn.delivery");
  const style =
    delivery === "waiting" || delivery === "refused"
      ? "border-level-urgent bg-level-urgent-soft text-level-urgent-ink"
      : "border-stone-line bg-paper-raised text-ink";
  return (
    <p role="status" className={`rounded-lg border-2 p-3 font-bold ${style}`} data-testid="delivery">
      {t(delivery)}
    </p>
  );
}
