"use client";
// The nurse reviews what lib/clinical suggests for the period, adjusts it and sends it to the GP
// practice. The same zod schema checks the request here and on the server.
import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation } from "@tanstack/react-query";
import { useTranslations } from "next-intl";
import { useEffect, useMemo, useState } from "react";
import { useFieldArray, useForm, useWatch } from "react-hook-form";
import type { z } from "zod";
import { useSharedErrorText } from "@/components/ui/shared-error-text";
import { Button } from "@/components/ui/button";
import { suppliesFor } from "@/lib/clinical";
import { useRouter } from "@/lib/i18n/navigation";
import {
  DEFAULT_SUPPLY_PERIOD,
  supplyErrorKeys,
  supplyPeriodChoices,
  supplyRequestSchema,
  type SupplyErrorKey,
  type SupplyRequestInput,
} from "@/lib/validations/supply-request";

type Props = { patientId: string; changeIntervalDays: number; gpName: string | null; gpHasInbox: boolean };

const includeKeys = ["legBag", "valve", "nightBag", "gel"] as const;

export function SupplyRequestForm({ patientId, changeIntervalDays, gpName, gpHasInbox }: Props) {
  const t = useTranslations("Supplies");
  const router = useRouter();
  const [result, setResult] = useState<{ ok: boolean; text: string } | null>(null);
  const initialInclude = { legBag: true, valve: false, nightBag: true, gel: true };
  const suggest = (periodDays: number, include: SupplyRequestInput["include"]) => {
    try {
      return suppliesFor({ changeIntervalDays, ...include }, periodDays).lines;
    } catch {
      return [];
    }
  };
  const {
    register,
    control,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isSubmitting },
  } = useForm<z.input<typeof supplyRequestSchema>, unknown, SupplyRequestInput>({
    resolver: zodResolver(supplyRequestSchema),
    defaultValues: {
      periodDays: DEFAULT_SUPPLY_PERIOD,
      include: initialInclude,
      items: suggest(DEFAULT_SUPPLY_PERIOD, initialInclude).map((l) => ({ item: l.item, quantity: l.quantity })),
      note: "",
    },
  });
  const { fields, replace } = useFieldArray({ control, name: "items" });
  const periodDays = useWatch({ control, name: "periodDays" });
  const include = useWatch({ control, name: "include" });
  const lines = useMemo(() => suggest(Number(periodDays), include), [periodDays, include?.legBag, include?.valve, include?.nightBag, include?.gel]); // eslint-disable-line react-hooks/exhaustive-deps
  // A new period or item list starts again from the suggestion.
  useEffect(() => {
    replace(lines.map((l) => ({ item: l.item, quantity: l.quantity })));
  }, [lines, replace]);

  const range = useSharedErrorText();
  const message = (key: string | undefined) => range(key) ?? (key && (supplyErrorKeys as readonly string[]).includes(key) ? t(`errors.${key as SupplyErrorKey}`) : key ? t("errors.quantity") : undefined);

  const send = useMutation({
    mutationFn: async (values: SupplyRequestInput) => {
      const res = await fetch(`/api/patients/${patientId}/supply-requests`, {
        method: "POST",
        headers: { "content-type": "application/json" },
        body: JSON.stringify(values),
      });
      const body = await res.json().catch(() => ({}));
      if (!res.ok) throw Object.assign(new Error(String(res.status)), { body });
      return body as { supplyRequest: { message: { status: string } | null } };
    },
  });

  const onSubmit = handleSubmit(async (values) => {
    setResult(null);
    try {
      const r = await send.mutateAsync(values);
      const failed = r.supplyRequest.message?.status === "failed";
      setResult({ ok: !failed, text: failed ? t("savedNotSent") : t("sent", { gp: gpName ?? "" }) });
      reset({ ...values });
      router.refresh();
    } catch (e) {
      const fields = (e as { body?: { error?: { fields?: Record<string, string[]> } } }).body?.error?.fields;
      if (fields) for (const [k, v] of Object.entries(fields)) setError(k as "items", { message: v[0] });
      setResult({ ok: false, text: t("failed") });
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-5">
      <p className="rounded-lg border-s-4 border-finding-info bg-finding-info-soft p-3 text-sm">{t("safety")}</p>
      <div className="flex flex-col gap-1">
        <label htmlFor="supply-period" className="font-bold">
          {t("period")}
        </label>
        <select
          id="supply-period"
          className="min-h-12 w-full max-w-xs rounded-lg border-2 border-stone-line bg-paper-raised px-3"
          aria-invalid={errors.periodDays ? true : undefined}
          {...register("periodDays", { valueAsNumber: true })}
        >
          {supplyPeriodChoices.map((d) => (
            <option key={d} value={d}>
              {t("periodOption", { days: d })}
            </option>
          ))}
        </select>
        {errors.periodDays ? <p className="text-sm font-bold text-level-emergency-ink">{message(errors.periodDays.message)}</p> : null}
      </div>
      <fieldset className="flex flex-col gap-2">
        <legend className="mb-1 font-bold">{t("uses")}</legend>
        <div className="flex flex-wrap gap-x-6 gap-y-2">
          {includeKeys.map((k) => (
            <label key={k} className="inline-flex min-h-12 items-center gap-2">
              <input type="checkbox" className="h-5 w-5 accent-brand" {...register(`include.${k}`)} />
              {t(`include.${k}`)}
            </label>
          ))}
        </div>
      </fieldset>
      <div className="overflow-x-auto rounded-card border border-stone-faint bg-paper-raised">
        <table className="w-full text-start">
          <caption className="sr-only">{t("tableCaption", { days: Number(periodDays) || DEFAULT_SUPPLY_PERIOD })}</caption>
          <thead className="bg-paper-sunk">
            <tr>
              <th scope="col" className="p-3 text-start">{t("colItem")}</th>
              <th scope="col" className="p-3 text-start">{t("colSuggested")}</th>
              <th scope="col" className="p-3 text-start">{t("colQuantity")}</th>
              <th scope="col" className="p-3 text-start">{t("colBasis")}</th>
            </tr>
          </thead>
          <tbody>
            {fields.map((f, i) => {
              const line = lines.find((l) => l.item === f.item);
              const err = errors.items?.[i]?.quantity?.message;
              return (
                <tr key={f.id} className="border-t border-stone-faint">
                  <th scope="row" className="p-3 text-start font-bold">
                    <label htmlFor={`qty-${f.item}`}>{t(`item.${f.item}`)}</label>
                  </th>
                  <td className="tabular p-3">{line?.quantity ?? "—"}</td>
                  <td className="p-3">
                    <input
                      id={`qty-${f.item}`}
                      inputMode="numeric"
                      autoComplete="off"
                      className={`tabular min-h-12 w-24 rounded-lg border-2 bg-paper-raised px-3 ${err ? "border-level-emergency" : "border-stone-line"}`}
                      aria-invalid={err ? true : undefined}
                      aria-describedby={err ? `qty-${f.item}-error` : undefined}
                      {...register(`items.${i}.quantity`)}
                    />
                    <input type="hidden" {...register(`items.${i}.item`)} />
                    {err ? (
                      <p id={`qty-${f.item}-error`} className="mt-1 text-sm font-bold text-level-emergency-ink">
                        {message(err)}
                      </p>
                    ) : null}
                  </td>
                  <td className="p-3 text-sm text-ink-soft">
                    {line
                      ? f.item === "catheter"
                        ? t("basis.catheter", { days: line.intervalDays, spares: line.spares })
                        : f.item === "gel"
                          ? t("basis.gel")
                          : f.item === "night-bag"
                            ? t("basis.night")
                            : t("basis.every", { days: line.intervalDays })
                      : null}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      {errors.items?.message || errors.items?.root?.message ? (
        <p role="alert" className="font-bold text-level-emergency-ink">
          {message(errors.items?.message ?? errors.items?.root?.message)}
        </p>
      ) : null}
      <div className="flex flex-col gap-1">
        <label htmlFor="supply-note" className="font-bold">
          {t("note")}
        </label>
        <p id="supply-note-hint" className="text-sm text-ink-soft">
          {t("noteHint")}
        </p>
        <textarea
          id="supply-note"
          rows={3}
          aria-describedby="supply-note-hint"
          className="rounded-lg border-2 border-stone-line bg-paper-raised p-3"
          {...register("note")}
        />
        {errors.note ? <p className="text-sm font-bold text-level-emergency-ink">{message(errors.note.message)}</p> : null}
      </div>
      {!gpHasInbox ? (
        <p className="rounded-lg border-2 border-level-urgent bg-level-urgent-soft p-3 font-bold text-level-urgent-ink">{t("noInbox")}</p>
      ) : null}
      <div className="flex flex-wrap items-center gap-4">
        <Button type="submit" disabled={isSubmitting}>
          {isSubmitting ? t("sending") : gpName ? t("submit", { gp: gpName }) : t("submitNoGp")}
        </Button>
        <p aria-live="polite">
          {result ? (
            <span className={`font-bold ${result.ok ? "text-level-selfcare-ink" : "text-level-emergency-ink"}`} role={result.ok ? undefined : "alert"}>
              {result.text}
            </span>
          ) : null}
        </p>
      </div>
    </form>
  );
}
