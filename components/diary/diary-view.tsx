"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useTranslations } from "next-intl";
import { useFormat } from "@/components/i18n/format";
import { useEffect, useMemo, useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { FieldError } from "@/components/ui/field";
import { apiFetch } from "@/lib/browser/api-client";
import { fluidBalance, formatIsoDate, urineOutputRate, type DiaryEntry as ClinicalEntry } from "@/lib/clinical";
import { DRINK_GUIDE, OUTPUT_WINDOW_HOURS } from "@/lib/shared/diary-guidance";
import { Link } from "@/lib/i18n/navigation";
import { BAG_SIZES, customVolumeSchema, DRINK_SIZES } from "@/lib/validations/diary";
import { newKey, OUTBOX_EVENT, type OutboxEventDetail } from "@/lib/browser/outbox";
import { diaryOutbox, type PendingDiaryEntry } from "./outbox";
import { WeekChart } from "./week-chart";

const asEntry = (p: PendingDiaryEntry): Entry => ({ id: p.clientKey, kind: p.kind, volumeMl: p.volumeMl, at: p.at, removable: true, clientKey: p.clientKey, waiting: true });

type Entry = { id: string; kind: "in" | "out"; volumeMl: number; at: string; removable: boolean; clientKey?: string | null; waiting?: boolean; byName?: string | null };

export const diaryKeys = {
  all: ["diary"] as const,
  week: (patientId: string, from: string) => ["diary", patientId, from] as const,
};

function localIso(d: Date) {
  return formatIsoDate(d.getFullYear(), d.getMonth() + 1, d.getDate());
}

/** Midnight (this phone's time) at the start of the day `daysAgo` days back. */
function startOfDay(daysAgo: number) {
  const d = new Date();
  d.setHours(0, 0, 0, 0);
  d.setDate(d.getDate() - daysAgo);
  return d;
}

const quick = "flex min-h-14 items-center justify-center rounded-lg border-2 border-brand bg-paper-raised px-2 text-lg font-bold text-brand hover:bg-brand-soft tabular";

/**
 * Drinks & drainage: quick-add cups and bags, today's balance and output check (lib/clinical's
 * fluidBalance and urineOutputRate, in this phone's time zone), and the last seven days.
 */
export function DiaryView({ patientId, weightKg, fluidLimitMl }: { patientId: string; weightKg: number | null; fluidLimitMl: number | null }) {
  const t = useTranslations("Diary");
  const tr = useTranslations("PortalReach.diary");
  const format = useFormat();
  const client = useQueryClient();
  // A day older than the week so the 24-hour output check can see whether the diary covers it.
  const [from] = useState(() => startOfDay(7).toISOString());
  const key = diaryKeys.week(patientId, from);
  const query = useQuery({
    queryKey: key,
    queryFn: async (): Promise<Entry[]> => {
      const to = new Date(Date.now() + 86_400_000).toISOString();
      return (await apiFetch<{ entries: Entry[] }>(`/api/diary?patientId=${patientId}&from=${encodeURIComponent(from)}&to=${encodeURIComponent(to)}`)).entries;
    },
  });
  const [last, setLast] = useState<Entry | null>(null);
  const [refused, setRefused] = useState(false);
  // Entries still on the phone (offline, or on their way): shown at once with the time they were
  // made, marked as waiting, and sent by the outbox, so the diary never waits for the network.
  const [waiting, setWaiting] = useState<PendingDiaryEntry[]>([]);
  useEffect(() => {
    const update = (e?: Event) => {
      setWaiting(diaryOutbox.list().filter((p) => p.patientId === patientId));
      const d = (e as CustomEvent<OutboxEventDetail> | undefined)?.detail;
      if (d && d.queue === diaryOutbox.name && "key" in d) {
        if (d.ok) void client.invalidateQueries({ queryKey: diaryKeys.all });
        else setRefused(true);
      }
    };
    update();
    window.addEventListener(OUTBOX_EVENT, update);
    window.addEventListener("storage", update);
    return () => {
      window.removeEventListener(OUTBOX_EVENT, update);
      window.removeEventListener("storage", update);
    };
  }, [patientId, client]);

  const add = (kind: "in" | "out", volumeMl: number) => {
    const item: PendingDiaryEntry = { patientId, clientKey: newKey(), kind, volumeMl, at: new Date().toISOString() };
    setRefused(false);
    diaryOutbox.enqueue(item);
    setLast(asEntry(item));
    void diaryOutbox.flush();
  };
  const remove = useMutation({
    mutationFn: async (entry: Entry) => {
      if (entry.waiting && diaryOutbox.list().some((p) => p.clientKey === entry.clientKey)) {
        diaryOutbox.remove(entry.clientKey!);
        return entry;
      }
      const id = entry.waiting ? (query.data ?? []).find((e) => e.clientKey === entry.clientKey)?.id : entry.id;
      if (!id) throw new Error("not sent");
      await apiFetch(`/api/diary/${id}`, { method: "DELETE" });
      return entry;
    },
    onSuccess: (entry) => {
      if (last?.id === entry.id) setLast(null);
      void client.invalidateQueries({ queryKey: diaryKeys.all });
    },
  });

  const entries = useMemo(() => {
    const sent = query.data ?? [];
    const sentKeys = new Set(sent.map((e) => e.clientKey).filter(Boolean));
    return [...sent, ...waiting.filter((p) => !sentKeys.has(p.clientKey)).map(asEntry)].sort((a, b) => a.at.localeCompare(b.at));
  }, [query.data, waiting]);
  const clinical: ClinicalEntry[] = entries.map((e) => ({ kind: e.kind, volumeMl: e.volumeMl, at: e.at }));
  const todayIso = localIso(new Date());
  const today = fluidBalance(clinical, todayIso);
  const week = [6, 5, 4, 3, 2, 1, 0].map((n) => fluidBalance(clinical, localIso(startOfDay(n))));
  const output = weightKg ? urineOutputRate(clinical, weightKg, OUTPUT_WINDOW_HOURS, new Date()) : null;
  const todays = entries.filter((e) => localIso(new Date(e.at)) === todayIso).reverse();
  const ml = (n: number) => t("amount", { ml: format.number(n) });
  const time = (iso: string) => format.dateTime(new Date(iso), { hour: "numeric", minute: "2-digit" });

  return (
    <div className="flex flex-col gap-6">
      <h1 className="text-3xl font-bold">{t("title")}</h1>

      <section aria-labelledby="add-drink" className="flex flex-col gap-3">
        <h2 id="add-drink" className="text-2xl font-bold">
          {t("addDrink")}
        </h2>
        <div className="grid grid-cols-2 gap-3 sm:grid-cols-3">
          {DRINK_SIZES.map((v) => (
            <button key={v} type="button" className={quick} onClick={() => add("in", v)} data-testid={`drink-${v}`}>
              {t("amount", { ml: v })}
            </button>
          ))}
        </div>
        <CustomAmount kind="in" onAdd={(volumeMl) => add("in", volumeMl)} />
      </section>

      <section aria-labelledby="add-bag" className="flex flex-col gap-3">
        <h2 id="add-bag" className="text-2xl font-bold">
          {t("addBag")}
        </h2>
        <div className="grid grid-cols-2 gap-3">
          {BAG_SIZES.map((v) => (
            <button key={v} type="button" className={quick} onClick={() => add("out", v)} data-testid={`bag-${v}`}>
              {t("amount", { ml: v })}
            </button>
          ))}
        </div>
        <CustomAmount kind="out" onAdd={(volumeMl) => add("out", volumeMl)} />
      </section>

      <div role="status" aria-live="polite" className="min-h-6">
        {refused ? (
          <p className="font-bold text-level-emergency-ink">{t("addError")}</p>
        ) : last ? (
          <div className="flex flex-wrap items-center justify-between gap-3 rounded-lg border-2 border-level-selfcare bg-level-selfcare-soft p-3 text-level-selfcare-ink">
            <p className="font-bold" data-testid="diary-added">
              {t(last.kind === "in" ? "addedDrink" : "addedBag", { ml: last.volumeMl, time: time(last.at) })}
            </p>
            <button type="button" onClick={() => remove.mutate(last)} className="min-h-12 rounded-lg border-2 border-level-selfcare-ink px-4 font-bold">
              {t("undo")}
            </button>
          </div>
        ) : null}
      </div>

      <section aria-labelledby="today-title" className="flex flex-col gap-3 rounded-card border border-stone-faint bg-paper-raised p-5">
        <h2 id="today-title" className="text-2xl font-bold">
          {t("today")}
        </h2>
        {query.isError ? <p className="font-bold text-level-emergency-ink">{t("loadError")}</p> : null}
        {query.isPending && !waiting.length ? (
          <p>{t("loading")}</p>
        ) : (
          <>
            <dl className="grid grid-cols-[1fr_auto] gap-x-4 gap-y-1 text-lg tabular">
              <dt>{t("in")}</dt>
              <dd className="text-end font-bold" data-testid="today-in">
                {ml(today.inMl)}
              </dd>
              <dt>{t("out")}</dt>
              <dd className="text-end font-bold" data-testid="today-out">
                {ml(today.outMl)}
              </dd>
              <dt>{t("balance")}</dt>
              <dd className="text-end font-bold">{(today.balanceMl > 0 ? "+" : "") + ml(today.balanceMl)}</dd>
            </dl>
            {fluidLimitMl ? (
              <p className="rounded-lg border-2 border-level-soon bg-level-soon-soft p-3 font-bold text-level-soon-ink" data-testid="fluid-limit">
                {t("limit", { limit: fluidLimitMl, sofar: today.inMl })}
              </p>
            ) : (
              <p data-testid="drink-advice">{t("target", { min: DRINK_GUIDE.minMl / 1000, max: DRINK_GUIDE.maxMl / 1000 })}</p>
            )}
            <OutputNote output={output} weightKnown={weightKg !== null} limit={fluidLimitMl !== null} />
          </>
        )}
      </section>

      {todays.length ? (
        <section aria-labelledby="entries-title" className="flex flex-col gap-3">
          <h2 id="entries-title" className="text-2xl font-bold">
            {t("entries")}
          </h2>
          <ul className="flex flex-col gap-2">
            {todays.map((e) => (
              <li key={e.id} className="flex flex-wrap items-center justify-between gap-3 rounded-lg border border-stone-faint bg-paper-raised p-3">
                <span className="tabular">
                  <span className="font-bold">{time(e.at)}</span> · {t(e.kind === "in" ? "drinkEntry" : "bagEntry", { ml: e.volumeMl })}
                  {e.byName ? (
                    <span className="block text-sm text-ink-soft" data-testid="diary-by">
                      {tr("addedBy", { name: e.byName })}
                    </span>
                  ) : null}
                  {e.waiting ? (
                    <span className="ms-2 inline-block rounded border border-level-urgent px-1 text-sm font-bold text-level-urgent-ink" data-testid="diary-waiting">
                      {t("waiting")}
                    </span>
                  ) : null}
                </span>
                {e.removable ? (
                  <button
                    type="button"
                    disabled={remove.isPending}
                    onClick={() => remove.mutate(e)}
                    className="min-h-12 min-w-12 shrink-0 rounded-lg border-2 border-brand px-3 font-bold text-brand [overflow-wrap:normal]"
                    aria-label={t("removeEntry", { what: t(e.kind === "in" ? "drinkEntry" : "bagEntry", { ml: e.volumeMl }), time: time(e.at) })}
                  >
                    {t("remove")}
                  </button>
                ) : null}
              </li>
            ))}
          </ul>
        </section>
      ) : null}

      <section aria-labelledby="week-heading" className="flex flex-col gap-3">
        <h2 id="week-heading" className="text-2xl font-bold">
          {t("week.title")}
        </h2>
        {query.isSuccess ? <WeekChart days={week} /> : null}
      </section>
    </div>
  );
}

function OutputNote({ output, weightKnown, limit }: { output: ReturnType<typeof urineOutputRate> | null; weightKnown: boolean; limit: boolean }) {
  const t = useTranslations("Diary.output");
  const format = useFormat();
  if (!weightKnown || !output) return <p className="text-ink-soft">{t("noWeight")}</p>;
  if (!output.diaryCoversWindow) return <p className="text-ink-soft">{t("notEnough", { hours: OUTPUT_WINDOW_HOURS })}</p>;
  if (output.low) {
    return (
      <div className="flex flex-col gap-3 rounded-lg border-2 border-level-urgent bg-level-urgent-soft p-3 text-level-urgent-ink" data-testid="low-output">
        <p className="font-bold">{t("low", { hours: OUTPUT_WINDOW_HOURS, total: output.totalOutMl })}</p>
        <p>{limit ? t("lowWithLimit") : t("lowAdvice")}</p>
        <Link href="/check-in" className="flex min-h-12 items-center justify-center rounded-lg bg-brand px-4 font-bold text-white">
          {t("checkIn")}
        </Link>
      </div>
    );
  }
  return <p>{t("ok", { hours: OUTPUT_WINDOW_HOURS, rate: format.number(output.mlPerKgPerHour, { maximumFractionDigits: 1 }) })}</p>;
}

function CustomAmount({ kind, onAdd }: { kind: "in" | "out"; onAdd: (ml: number) => void }) {
  const t = useTranslations("Diary");
  const id = `custom-${kind}`;
  const {
    register,
    handleSubmit,
    reset,
    formState: { errors },
  } = useForm<z.input<typeof customVolumeSchema>, unknown, z.output<typeof customVolumeSchema>>({ resolver: zodResolver(customVolumeSchema) });
  return (
    <form
      noValidate
      className="flex flex-col gap-2"
      onSubmit={handleSubmit((v) => {
        onAdd(v.volumeMl);
        reset({ volumeMl: "" });
      })}
    >
      <label htmlFor={id} className="font-bold">
        {t(kind === "in" ? "customDrink" : "customBag")}
      </label>
      <div className="flex flex-wrap items-center gap-2">
        <input
          id={id}
          inputMode="numeric"
          autoComplete="off"
          aria-invalid={errors.volumeMl ? true : undefined}
          aria-describedby={errors.volumeMl ? `${id}-error` : undefined}
          className="min-h-14 w-32 rounded-lg border-2 border-stone-line bg-paper-raised px-3 text-xl tabular"
          {...register("volumeMl")}
        />
        <span className="text-lg font-bold">{t("unit")}</span>
        <button type="submit" className="min-h-14 min-w-24 rounded-lg bg-brand px-5 text-lg font-bold text-white">
          {t("add")}
        </button>
      </div>
      {/* The words name the range ("a whole number of ml, from 1 to 5000") whatever was wrong. */}
      <FieldError id={`${id}-error`} errors={errors.volumeMl ? [t("customError")] : undefined} />
    </form>
  );
}
