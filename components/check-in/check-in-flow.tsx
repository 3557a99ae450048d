"use client";
import { parsePlainDecimal } from "@/lib/shared/numbers";
import { useTranslations } from "next-intl";
import { WithTerms, type Glossary } from "@/components/glossary/glossary-term";
import { useEffect, useMemo, useRef, useState } from "react";
import {
  HOURS_BAND_VALUE,
  isAsked,
  keepAsked,
  questionsFor,
  reachesEmergency,
  TEMPERATURE_RANGE,
  type HoursBand,
  type OtherSymptom,
  type Question,
  type SubmittedAnswers,
} from "@/lib/shared/check-in-flow";
import type { Route } from "@/lib/clinical";
import type { Contacts } from "@/components/portal/call-buttons";
import { CheckInResult } from "./check-in-result";
import { newKey } from "./outbox";
import { FieldError } from "@/components/ui/field";
import { Picture, type PictureKey } from "@/components/pictures/pictures";

/** The drawing beside a question, where one helps to answer it. */
const QUESTION_PICTURES: Partial<Record<string, PictureKey>> = { draining: "bagBelowBladder", hoursWithoutUrine: "kinkedTube", blood: "urineColours" };

const answerButton =
  "flex min-h-16 w-full items-center justify-center rounded-lg border-2 border-brand bg-paper-raised px-4 py-3 text-center text-xl font-bold text-brand hover:bg-brand-soft";
// The answer given before, when the person comes back to a screen: filled, with a tick (not colour alone).
const chosenClass = (on: boolean) =>
  on
    ? "flex min-h-16 w-full items-center justify-center gap-2 rounded-lg border-2 border-brand-strong bg-brand px-4 py-3 text-center text-xl font-bold text-white before:content-['✓']"
    : answerButton;

function isChosen(question: Question, option: string, answers: SubmittedAnswers): boolean {
  if (question.id === "hoursWithoutUrine") return answers.hoursWithoutUrine !== undefined && HOURS_BAND_VALUE[option as HoursBand] === answers.hoursWithoutUrine;
  return (answers as Record<string, unknown>)[question.id] === option;
}

/** "How am I?": one question per screen, big answers, red flags first, emergency straight to the result. */
export function CheckInFlow({
  patientId,
  route,
  afterCatheter = false,
  contacts,
  patientName,
  glossary,
}: {
  patientId: string;
  route: Route | null;
  /** No catheter in place since one came out: the check-in asks how urine passes instead. */
  afterCatheter?: boolean;
  contacts: Contacts;
  patientName: string | null;
  /** Plain words to tap in the questions and the result (components/glossary). */
  glossary?: Glossary | null;
}) {
  const t = useTranslations("CheckIn");
  const tp = useTranslations("Pictures");
  const questions = useMemo(() => questionsFor(route, afterCatheter), [route, afterCatheter]);
  const [answers, setAnswers] = useState<SubmittedAnswers>({});
  const [history, setHistory] = useState<number[]>([]);
  const [index, setIndex] = useState(0);
  const [done, setDone] = useState(false);
  // One key per check-in, made when it starts: a resend or a double tap is the same check-in.
  const [idempotencyKey] = useState(() => (typeof window === "undefined" ? "" : newKey()));
  const headingRef = useRef<HTMLHeadingElement>(null);

  useEffect(() => {
    headingRef.current?.focus();
  }, [index, done]);

  if (done) return <CheckInResult patientId={patientId} route={route} afterCatheter={afterCatheter} answers={answers} idempotencyKey={idempotencyKey} contacts={contacts} glossary={glossary} />;

  const question = questions[index];
  const visible = questions.filter((q) => isAsked(q, answers));
  const position = visible.findIndex((q) => q.id === question.id) + 1;

  function answer(patch: SubmittedAnswers) {
    const next = keepAsked(questions, { ...answers, ...patch });
    setAnswers(next);
    setHistory([...history, index]);
    if (reachesEmergency(next, route, afterCatheter)) return setDone(true);
    let i = index + 1;
    while (i < questions.length && !isAsked(questions[i], next)) i++;
    if (i >= questions.length) return setDone(true);
    setIndex(i);
  }

  // Going back keeps every answer: the screen shows what was chosen until it is changed.
  function back() {
    const previous = history.at(-1);
    if (previous === undefined) return;
    setHistory(history.slice(0, -1));
    setIndex(previous);
  }

  const subject = patientName ? "carer" : "self";
  return (
    <section aria-labelledby="question" className="flex flex-col gap-5" data-question={question.id}>
      <p className="text-lg text-ink-soft" aria-live="polite">
        {t("progress", { n: position, total: visible.length })}
      </p>
      {patientName ? <p className="font-bold">{t("aboutPatient", { name: patientName })}</p> : null}
      <h1 id="question" ref={headingRef} tabIndex={-1} className="text-3xl font-bold leading-snug outline-none">
        {/* After the catheter, pain is asked without "where the catheter goes in". */}
        <WithTerms text={afterCatheter && question.id === "pain" ? t(`questions.painAfter.${subject}`) : t(`questions.${question.id}.${subject}`)} glossary={glossary} />
      </h1>
      {t.has(`questions.${question.id}.hint` as never) ? (
        <p>
          <WithTerms text={t(`questions.${question.id}.hint` as never)} glossary={glossary} />
        </p>
      ) : null}
      {QUESTION_PICTURES[question.id] ? <Picture name={QUESTION_PICTURES[question.id]!} alt={tp(QUESTION_PICTURES[question.id]!)} /> : null}
      <QuestionAnswers key={question.id} question={question} answers={answers} onAnswer={answer} onDraft={(patch) => setAnswers(keepAsked(questions, { ...answers, ...patch }))} />
      {history.length ? (
        <button type="button" onClick={back} className="min-h-12 self-start rounded-lg px-3 font-bold text-brand underline underline-offset-4">
          {t("back")}
        </button>
      ) : null}
    </section>
  );
}

function QuestionAnswers({
  question,
  answers,
  onAnswer,
  onDraft,
}: {
  question: Question;
  answers: SubmittedAnswers;
  onAnswer: (p: SubmittedAnswers) => void;
  /** A choice made on this screen before moving on (kept if the person goes back first). */
  onDraft: (p: SubmittedAnswers) => void;
}) {
  const t = useTranslations("CheckIn");
  switch (question.kind) {
    case "yes-no":
      return (
        <div className="flex flex-col gap-3">
          <button type="button" className={chosenClass(answers[question.id] === true)} aria-pressed={answers[question.id] === true || undefined} data-answer="yes" onClick={() => onAnswer({ [question.id]: true })}>
            {t("yes")}
          </button>
          <button type="button" className={chosenClass(answers[question.id] === false)} aria-pressed={answers[question.id] === false || undefined} data-answer="no" onClick={() => onAnswer({ [question.id]: false })}>
            {t("no")}
          </button>
        </div>
      );
    case "choice":
      return (
        <div className="flex flex-col gap-3">
          {question.options.map((o) => (
            <button
              key={o}
              type="button"
              className={chosenClass(isChosen(question, o, answers))}
              aria-pressed={isChosen(question, o, answers) || undefined}
              data-answer={o}
              onClick={() =>
                onAnswer(
                  question.id === "hoursWithoutUrine"
                    ? { hoursWithoutUrine: HOURS_BAND_VALUE[o as HoursBand] }
                    : ({ [question.id]: o } as SubmittedAnswers),
                )
              }
            >
              {t(`questions.${question.id}.options.${o}` as never)}
            </button>
          ))}
        </div>
      );
    case "temperature":
      return <TemperatureAnswer initial={answers.temperatureC} onAnswer={onAnswer} />;
    case "many":
      return <ManyAnswer options={question.options} answers={answers} onAnswer={onAnswer} onDraft={onDraft} />;
  }
}

function TemperatureAnswer({ initial, onAnswer }: { initial?: number; onAnswer: (p: SubmittedAnswers) => void }) {
  const t = useTranslations("CheckIn");
  const [value, setValue] = useState(initial === undefined ? "" : String(initial));
  const [error, setError] = useState<string | null>(null);
  return (
    <div className="flex flex-col gap-4">
      <form
        className="flex flex-col gap-3"
        noValidate
        onSubmit={(e) => {
          e.preventDefault();
          // Plain decimals only ("37.5" or "37,5"): "3e1" is not a temperature.
          const n = parsePlainDecimal(value);
          if (n === undefined) return setError(t("temperature.needNumber"));
          if (n > 90 && n < 115) return setError(t("temperature.fahrenheit"));
          if (n < TEMPERATURE_RANGE.min || n > TEMPERATURE_RANGE.max) return setError(t("temperature.range", TEMPERATURE_RANGE));
          onAnswer({ temperatureC: Math.round(n * 10) / 10 });
        }}
      >
        <label htmlFor="temperature" className="text-xl font-bold">
          {t("temperature.label")}
        </label>
        <div className="flex items-center gap-2">
          <input
            id="temperature"
            inputMode="decimal"
            autoComplete="off"
            value={value}
            onChange={(e) => setValue(e.target.value)}
            aria-invalid={error ? true : undefined}
            aria-describedby={error ? "temperature-error" : undefined}
            className="min-h-16 w-36 rounded-lg border-2 border-stone-line bg-paper-raised px-3 text-center text-2xl tabular"
          />
          <span className="text-xl font-bold">°C</span>
        </div>
        <FieldError id="temperature-error" errors={error ? [error] : undefined} className="text-base" />
        <button type="submit" className="flex min-h-16 w-full items-center justify-center rounded-lg bg-brand px-4 text-xl font-bold text-white">
          {t("temperature.save")}
        </button>
      </form>
      <button type="button" className={answerButton} data-answer="not-taken" onClick={() => onAnswer({ temperatureC: undefined })}>
        {t("temperature.notTaken")}
      </button>
    </div>
  );
}

function ManyAnswer({
  options,
  answers,
  onAnswer,
  onDraft,
}: {
  options: readonly OtherSymptom[];
  answers: SubmittedAnswers;
  onAnswer: (p: SubmittedAnswers) => void;
  onDraft: (p: SubmittedAnswers) => void;
}) {
  const t = useTranslations("CheckIn");
  const [picked, setPicked] = useState<Set<OtherSymptom>>(() => new Set(options.filter((o) => answers[o] === true)));
  const toggle = (o: OtherSymptom) => {
    const next = new Set(picked);
    if (next.has(o)) next.delete(o);
    else next.add(o);
    setPicked(next);
    onDraft({ [o]: next.has(o) } as SubmittedAnswers);
  };
  const submit = (set: Set<OtherSymptom>) => onAnswer(Object.fromEntries(options.map((o) => [o, set.has(o)])) as SubmittedAnswers);
  return (
    <div className="flex flex-col gap-3">
      {options.map((o) => {
        const on = picked.has(o);
        return (
          <button
            key={o}
            type="button"
            aria-pressed={on}
            data-answer={o}
            onClick={() => toggle(o)}
            className={`flex min-h-16 w-full items-center gap-3 rounded-lg border-2 px-4 py-3 text-start text-xl font-bold ${
              on ? "border-brand-strong bg-brand text-white" : "border-brand bg-paper-raised text-brand"
            }`}
          >
            <span aria-hidden="true" className={`flex h-8 w-8 shrink-0 items-center justify-center rounded border-2 ${on ? "border-white" : "border-brand"}`}>
              {on ? "✓" : ""}
            </span>
            <span>{t(`questions.other.options.${o}`)}</span>
          </button>
        );
      })}
      <button
        type="button"
        data-answer="done"
        onClick={() => submit(picked)}
        className="mt-2 flex min-h-16 w-full items-center justify-center rounded-lg bg-brand px-4 text-xl font-bold text-white"
      >
        {picked.size ? t("questions.other.done") : t("questions.other.none")}
      </button>
    </div>
  );
}
