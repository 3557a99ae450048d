"use client";
// The nurse reviews what lib/clinical suggests for the period, adjusts it and sends it to the GP
// practice. The same zod schema checks the request here and on the server.
import { zodResolver } from "@hookform/resolvers/zod";
import { useTranslations } from "next-intl";
import { useEffect, useMemo, useState } from "react";
import { useFieldArray, useForm, useWatch } from "react-hook-form";
import type { z } from "zod";
import { Button } from "@/components/ui/button";
import { Checkbox, ChoiceGroup } from "@/components/ui/choice";
import { FieldError, SelectField, TextArea } from "@/components/ui/field";
import { DoneStatus, ErrorAlert } from "@/components/ui/notice";
import { useSubmitFailure } from "@/components/ui/use-error-text";
import { apiFetch } from "@/lib/browser/api-client";
import { suppliesFor } from "@/lib/clinical";
import { useRouter } from "@/lib/i18n/navigation";
import { DEFAULT_SUPPLY_PERIOD, supplyPeriodChoices, supplyRequestSchema, type SupplyRequestInput } from "@/lib/validations/supply-request";
import { TableHead } from "@/components/ui/table-head";

type Props = {
  patientId: string;
  changeIntervalDays: number;
  /** Days to the catheter's next planned change (catheters are counted on the real change days). */
  firstChangeInDays?: number;
  /** Spare catheters (Settings, default one). */
  spareCatheters?: number;
  /** The gel used at the last insertion or change, in words, named on the gel line. */
  gelName?: string | null;
  gpName: string | null;
  gpHasInbox: boolean;
  /** From the discharge checklist: the period up to a planned trial without catheter, and a valve instead of a leg bag. */
  initialPeriod?: number;
  valve?: boolean;
};

const includeKeys = ["legBag", "valve", "nightBag", "gel"] as const;

export function SupplyRequestForm({ patientId, changeIntervalDays, firstChangeInDays, spareCatheters, gelName, gpName, gpHasInbox, initialPeriod = DEFAULT_SUPPLY_PERIOD, valve = false }: Props) {
  const t = useTranslations("Supplies");
  const v = useTranslations("Vocabulary");
  const router = useRouter();
  const [sent, setSent] = useState<string | null>(null);
  const initialInclude = { legBag: !valve, valve, nightBag: true, gel: true };
  const suggest = (periodDays: number, include: SupplyRequestInput["include"]) => {
    try {
      return suppliesFor({ changeIntervalDays, firstChangeInDays, spareCatheters, ...include }, periodDays).lines;
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
      periodDays: initialPeriod,
      include: initialInclude,
      items: suggest(initialPeriod, initialInclude).map((l) => ({ item: l.item, quantity: l.quantity })),
      note: "",
    },
  });
  const failure = useSubmitFailure("Supplies", setError);
  const text = failure.text;
  const { fields, replace } = useFieldArray({ control, name: "items" });
  const periodDays = useWatch({ control, name: "periodDays" });
  const include = useWatch({ control, name: "include" });
  const lines = useMemo(() => suggest(Number(periodDays), include), [periodDays, include?.legBag, include?.valve, include?.nightBag, include?.gel]); // eslint-disable-line react-hooks/exhaustive-deps
  // A new period or item list starts again from the suggestion.
  useEffect(() => {
    replace(lines.map((l) => ({ item: l.item, quantity: l.quantity })));
  }, [lines, replace]);

  const onSubmit = handleSubmit(async (values) => {
    setSent(null);
    failure.clear();
    try {
      const r = await apiFetch<{ supplyRequest: { message: { status: string } | null } }>(`/api/patients/${patientId}/supply-requests`, { method: "POST", body: values });
      if (r.supplyRequest.message?.status === "failed") failure.show(t("savedNotSent"));
      else setSent(t("sent", { gp: gpName ?? "" }));
      reset({ ...values });
      router.refresh();
    } catch (e) {
      failure.fail(e, () => t("failed"));
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-5">
      <p className="rounded-lg border-s-4 border-finding-info bg-finding-info-soft p-3 text-sm">{t("safety")}</p>
      <SelectField
        label={t("period")}
        className="max-w-xs"
        options={supplyPeriodChoices.map((d) => ({ value: String(d), label: t("periodOption", { days: d }) }))}
        errors={text.list(errors.periodDays)}
        {...register("periodDays", { valueAsNumber: true })}
      />
      <ChoiceGroup legend={t("uses")}>
        <div className="flex flex-wrap gap-x-6">
          {includeKeys.map((k) => (
            <Checkbox key={k} label={t(`include.${k}`)} {...register(`include.${k}`)} />
          ))}
        </div>
      </ChoiceGroup>
      <div className="overflow-x-auto rounded-card border border-stone-faint bg-paper-raised">
        <table className="w-full text-start">
          <caption className="sr-only">{t("tableCaption", { days: Number(periodDays) || DEFAULT_SUPPLY_PERIOD })}</caption>
          <TableHead columns={[t("colItem"), t("colSuggested"), t("colQuantity"), t("colBasis")]} />
          <tbody>
            {fields.map((f, i) => {
              const line = lines.find((l) => l.item === f.item);
              const err = errors.items?.[i]?.quantity?.message;
              return (
                <tr key={f.id} className="border-t border-stone-faint">
                  <th scope="row" className="p-3 text-start font-bold">
                    <label htmlFor={`qty-${f.item}`}>{f.item === "gel" && gelName ? `${v("supplyItem.gel")}: ${gelName}` : v(`supplyItem.${f.item}`)}</label>
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
                    <FieldError id={`qty-${f.item}-error`} errors={err ? [text.one(err)] : undefined} className="mt-1" />
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
      <FieldError errors={text.list(errors.items?.root ?? errors.items)} />
      <TextArea label={t("note")} hint={t("noteHint")} rows={3} errors={text.list(errors.note)} {...register("note")} />
      {!gpHasInbox ? (
        <p className="rounded-lg border-2 border-level-urgent bg-level-urgent-soft p-3 font-bold text-level-urgent-ink">{t("noInbox")}</p>
      ) : null}
      <div className="flex flex-wrap items-center gap-4">
        <Button type="submit" disabled={isSubmitting}>
          {isSubmitting ? t("sending") : gpName ? t("submit", { gp: gpName }) : t("submitNoGp")}
        </Button>
      </div>
      <ErrorAlert message={failure.message} />
      <DoneStatus message={sent} />
    </form>
  );
}
