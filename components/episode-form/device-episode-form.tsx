"use client";
// Record an insertion, or a change (the old catheter out and the new one in). Every
// documentation field of an insertion; the device checks run live beside the form from
// lib/clinical and again on the server when saving.
import { zodResolver } from "@hookform/resolvers/zod";
import { useFormatter, useTranslations } from "next-intl";
import { useEffect, useRef, useState } from "react";
import { Controller, get, useForm, type FieldPath, type Resolver } from "react-hook-form";
import type { z } from "zod";
import { useSharedErrorText } from "@/components/ui/shared-error-text";
import { Button } from "@/components/ui/button";
import {
  CATHETER_TYPES,
  charriereToMm,
  DEVICE_RULES,
  GEL_KINDS,
  LENGTH_CATEGORIES,
  MATERIALS,
  planDates,
  ROUTES,
  type Material,
  type PlanDefaults,
} from "@/lib/clinical";
import { reconcileOverrides, runDeviceCheck, type PatientFacts } from "@/lib/shared/episode-checks";
import { useRouter } from "@/lib/i18n/navigation";
import { changeSchema, EPISODE_ERROR_KEYS, insertionSchema, UNPLANNED_REASONS } from "@/lib/validations/episode";
import { fromLocalInputValue, toLocalInputValue } from "@/lib/browser/datetime-input";
import { dayIn } from "@/lib/shared/time-zone";
import { Checkbox, RadioGroup, Section, Select, TextArea, TextInput } from "./controls";
import { FindingsPanel } from "./findings-panel";
import { ScanField, type ScanFill } from "./scan-field";
import { isApiError, useRecord } from "./use-record";

type Values = z.input<typeof changeSchema>;

export type PreviousDevice = {
  route: string;
  catheterType: string;
  material: string;
  lengthCategory: string;
  sizeCh: number;
  balloonMl: number;
  makerBalloonMl: number | null;
  maker: string | null;
  productName: string | null;
  gelKind: string;
  gelVolumeMl: number | null;
  maxDwellDays: number | null;
  reviewIntervalDays: number | null;
  indication: string;
  insertedAt: string;
};

export type BlockageHint = { typicalDwellDays: number; suggestedIntervalDays: number; blockageEpisodes: number } | null;

function defaults(prev: PreviousDevice | null, planning: PlanDefaults): Values {
  const s = (v: number | null | undefined) => (v === null || v === undefined ? "" : String(v));
  return {
    route: prev?.route ?? "",
    catheterType: prev?.catheterType ?? "",
    material: prev?.material ?? "",
    lengthCategory: prev?.lengthCategory ?? "",
    sizeCh: s(prev?.sizeCh),
    balloonMl: s(prev?.balloonMl),
    makerBalloonMl: s(prev?.makerBalloonMl),
    maker: prev?.maker ?? "",
    productName: prev?.productName ?? "",
    lot: "",
    expiry: "",
    gtin: "",
    serial: "",
    udi: "",
    gelKind: prev?.gelKind ?? "",
    gelVolumeMl: s(prev?.gelVolumeMl),
    largerSizeReason: "",
    maxDwellDays: prev ? s(prev.maxDwellDays) : "",
    indication: prev?.indication ?? "",
    insertedAt: new Date(Math.floor(Date.now() / 60_000) * 60_000).toISOString(),
    residualUrineMl: "",
    urineDescription: "",
    specimenTaken: false,
    attempts: "1",
    difficulties: "",
    patientReaction: "",
    reviewIntervalDays: s(prev?.reviewIntervalDays ?? planning.reviewIntervalDays),
    overrides: [],
    changeKind: "",
    unplannedReason: "",
    reasonNotes: "",
    needReviewed: false,
  };
}

export function DeviceEpisodeForm({
  mode,
  patientId,
  patient,
  clinicianName,
  previous,
  timeZone,
  blockage,
  planning,
}: {
  mode: "insertion" | "change";
  patientId: string;
  patient: PatientFacts;
  clinicianName: string;
  /** The catheter in place (change) or the last one (insertion after a trial): its spec prefills the form. */
  previous: PreviousDevice | null;
  timeZone: string;
  blockage: BlockageHint;
  /** The deployment's planning values (lib/config/settings getPlanDefaults). */
  planning: PlanDefaults;
}) {
  const t = useTranslations("EpisodeForm");
  const tErrors = useTranslations("Errors");
  const range = useSharedErrorText();
  const format = useFormatter();
  const router = useRouter();
  const schema = mode === "change" ? changeSchema : insertionSchema;
  const {
    register,
    handleSubmit,
    control,
    watch,
    setValue,
    setError,
    formState: { errors },
  } = useForm<Values>({
    resolver: zodResolver(schema as typeof changeSchema) as unknown as Resolver<Values>,
    defaultValues: defaults(previous, planning),
    mode: "onTouched",
  });
  const [overrides, setOverrides] = useState<Record<string, string>>({});
  const [overrideErrors, setOverrideErrors] = useState<string[]>([]);
  const [formError, setFormError] = useState<string | null>(null);
  const dwellEdited = useRef(Boolean(previous?.maxDwellDays));
  const url = `/api/patients/${patientId}/episodes${mode === "change" ? "/change" : ""}`;
  const mutation = useRecord<{ episode: { id: string } }>(url);

  const draft = watch();
  const insertedAt = typeof draft.insertedAt === "string" && draft.insertedAt ? new Date(draft.insertedAt) : new Date();
  const checkAt = Number.isNaN(insertedAt.getTime()) ? new Date() : insertedAt;
  // Recomputed on every render: watch() re-renders on each keystroke and the check is cheap.
  const outcome = runDeviceCheck(draft, patient, checkAt, timeZone);
  const today = dayIn(new Date(), timeZone);

  // The maker's maximum dwell starts as the material's common-practice default until the nurse types one.
  const material = draft.material as Material | "";
  useEffect(() => {
    if (material && !dwellEdited.current) setValue("maxDwellDays", String(planning.maxDwellDays[material]));
  }, [material, setValue, planning]);

  let plan: ReturnType<typeof planDates> | null = null;
  try {
    plan = planDates({
      insertedOn: dayIn(checkAt, timeZone),
      material: draft.material as Material,
      route: draft.route as "urethral",
      maxDwellDays: draft.maxDwellDays ? Number(draft.maxDwellDays) : undefined,
      reviewIntervalDays: draft.reviewIntervalDays ? Number(draft.reviewIntervalDays) : undefined,
    }, { reviewIntervalDays: planning.reviewIntervalDays, dueSoonDays: planning.dueSoonDays, defaultMaxDwellDays: planning.maxDwellDays });
  } catch {
    plan = null;
  }

  const dateOnly = (iso: string) => format.dateTime(new Date(`${iso}T12:00:00Z`), { dateStyle: "medium", timeZone: "UTC" });
  const msg = (key: unknown) =>
    range(key) ??
    (typeof key === "string" && (EPISODE_ERROR_KEYS as readonly string[]).includes(key)
      ? t(`errors.${key as (typeof EPISODE_ERROR_KEYS)[number]}`)
      : t("errors.invalid"));
  const err = (name: FieldPath<Values>) => {
    const e = get(errors, name) as { message?: string } | undefined;
    return e ? [msg(e.message)] : undefined;
  };

  const onScan = (fill: ScanFill) => {
    const opts = { shouldValidate: true, shouldDirty: true } as const;
    // A scan replaces every field a label can carry; one this label lacks is cleared.
    setValue("gtin", fill.gtin ?? "", opts);
    setValue("lot", fill.lot ?? "", opts);
    setValue("expiry", fill.expiry ?? "", opts);
    setValue("serial", fill.serial ?? "", opts);
    setValue("udi", fill.udi, opts);
  };

  const overrideCheck = (values: Values, at: Date) => {
    const check = runDeviceCheck(values, patient, at, timeZone);
    return reconcileOverrides(
      check.ok ? check.findings : [],
      Object.entries(overrides).map(([code, reason]) => ({ code, reason })),
    );
  };

  // Invalid fields and missing override reasons are shown together, not one after the other.
  const onInvalid = () => {
    setOverrideErrors(overrideCheck(draft, checkAt).missing);
    setFormError(tErrors("validation_failed"));
  };

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    const { missing, kept } = overrideCheck(values, new Date(values.insertedAt as string));
    setOverrideErrors(missing);
    if (missing.length) {
      document.querySelector<HTMLTextAreaElement>(`[data-testid="override-${missing[0]}"]`)?.focus();
      setFormError(t("errors.override_required"));
      return;
    }
    try {
      await mutation.mutateAsync({ ...values, overrides: kept });
      router.push(`/patients/${patientId}`);
      router.refresh();
    } catch (e) {
      if (!isApiError(e)) {
        setFormError(tErrors("internal"));
        return;
      }
      const stopCodes: string[] = [];
      for (const [field, messages] of Object.entries(e.fields)) {
        if (field.startsWith("overrides.") && messages.includes("override_required")) stopCodes.push(field.slice("overrides.".length));
        else setError(field as FieldPath<Values>, { type: "server", message: messages[0] });
      }
      setOverrideErrors(stopCodes);
      setFormError(
        e.code === "conflict" ? t(mode === "change" ? "conflict.change" : "conflict.insertion") : tErrors(e.code as "internal"),
      );
    }
  }, onInvalid);

  const sizeCh = Number(draft.sizeCh);
  const routineMax = draft.route === "suprapubic" ? DEVICE_RULES.routineMaxChSuprapubic.value : DEVICE_RULES.routineMaxChUrethral.value;
  let mm: string | null = null;
  try {
    mm = draft.sizeCh ? format.number(charriereToMm(sizeCh), { minimumFractionDigits: 1 }) : null;
  } catch {
    mm = null;
  }
  const options = <T extends string>(values: readonly T[], group: "route" | "catheterType" | "material" | "lengthCategory" | "gelKind" | "unplannedReason") =>
    values.map((v) => ({ value: v, label: t(`option.${group}.${v}` as "option.route.urethral") }));
  // A prefilled default the nurse has not changed is not the maker's figure, whatever the field holds.
  const dwellIsDefault = Boolean(material) && !dwellEdited.current && Number(draft.maxDwellDays) === planning.maxDwellDays[material as Material];
  const planBasis = plan ? t(`plan.basis.${dwellIsDefault && plan.change.basis === "maker" ? "material-default" : plan.change.basis}`) : "";

  return (
    <form onSubmit={onSubmit} noValidate className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_22rem]" data-testid={`${mode}-form`}>
      <div className="flex min-w-0 flex-col gap-6">
        {mode === "change" ? (
          <Section title={t("change.title")}>
            {previous ? (
              <p className="sm:col-span-2" data-testid="previous-device">
                {t("change.previous", {
                  size: previous.sizeCh,
                  balloon: previous.balloonMl,
                  material: t(`option.material.${previous.material as "latex"}`),
                  date: format.dateTime(new Date(previous.insertedAt), { dateStyle: "medium" }),
                })}
              </p>
            ) : null}
            <RadioGroup
              className="sm:col-span-2"
              legend={t("change.kind")}
              options={[
                { value: "planned", label: t("change.planned") },
                { value: "unplanned", label: t("change.unplanned") },
              ]}
              inputProps={register("changeKind")}
              errors={err("changeKind")}
            />
            {draft.changeKind === "unplanned" ? (
              <>
                <Select
                  label={t("change.reason")}
                  placeholder={t("choose")}
                  options={options(UNPLANNED_REASONS, "unplannedReason")}
                  {...register("unplannedReason", { shouldUnregister: true })}
                  errors={err("unplannedReason")}
                />
                <TextArea label={t("change.notes")} hint={t("change.notesHint")} {...register("reasonNotes", { shouldUnregister: true })} errors={err("reasonNotes")} />
              </>
            ) : null}
            <Checkbox className="sm:col-span-2" label={t("change.needReviewed")} hint={t("change.needReviewedHint")} {...register("needReviewed")} />
            {blockage ? (
              <p className="rounded-lg border-2 border-finding-info bg-finding-info-soft p-3 sm:col-span-2" data-testid="blockage-hint">
                {t("change.blockage", {
                  count: blockage.blockageEpisodes,
                  typical: blockage.typicalDwellDays,
                  suggested: blockage.suggestedIntervalDays,
                })}{" "}
                <span className="text-sm text-ink-soft">{t("findings.judgement")}</span>
              </p>
            ) : null}
          </Section>
        ) : null}

        <Section title={t("section.catheter")}>
          <RadioGroup legend={t("field.route")} options={options(ROUTES, "route")} inputProps={register("route")} errors={err("route")} />
          <RadioGroup
            legend={t("field.catheterType")}
            options={options(CATHETER_TYPES, "catheterType")}
            inputProps={register("catheterType")}
            errors={err("catheterType")}
          />
          <Select label={t("field.material")} placeholder={t("choose")} options={options(MATERIALS, "material")} {...register("material")} errors={err("material")} />
          <Select
            label={t("field.lengthCategory")}
            placeholder={t("choose")}
            options={options(LENGTH_CATEGORIES, "lengthCategory")}
            {...register("lengthCategory")}
            errors={err("lengthCategory")}
          />
          <TextInput
            label={t("field.sizeCh")}
            unit={t("unit.ch")}
            inputMode="numeric"
            hint={mm ? t("hint.sizeMm", { mm }) : t("hint.size")}
            className="tabular"
            {...register("sizeCh")}
            errors={err("sizeCh")}
          />
          <TextInput label={t("field.balloonMl")} unit={t("unit.ml")} inputMode="numeric" hint={t("hint.balloon")} {...register("balloonMl")} errors={err("balloonMl")} />
          <TextInput label={t("field.makerBalloonMl")} unit={t("unit.ml")} inputMode="numeric" hint={t("hint.makerBalloon")} {...register("makerBalloonMl")} errors={err("makerBalloonMl")} />
          {sizeCh > routineMax || draft.largerSizeReason ? (
            <TextArea
              label={t("field.largerSizeReason", { max: routineMax })}
              {...register("largerSizeReason")}
              errors={err("largerSizeReason")}
              data-testid="larger-size-reason"
            />
          ) : null}
        </Section>

        <Section title={t("section.packaging")}>
          <ScanField today={today} onRead={onScan} />
          <TextInput label={t("field.maker")} autoComplete="off" {...register("maker")} errors={err("maker")} />
          <TextInput label={t("field.productName")} autoComplete="off" {...register("productName")} errors={err("productName")} />
          <TextInput label={t("field.lot")} autoComplete="off" dir="ltr" {...register("lot")} errors={err("lot")} data-testid="field-lot" />
          <TextInput label={t("field.expiry")} type="date" {...register("expiry")} errors={err("expiry")} data-testid="field-expiry" />
          <TextInput label={t("field.gtin")} inputMode="numeric" dir="ltr" {...register("gtin")} errors={err("gtin")} data-testid="field-gtin" />
          <TextInput label={t("field.serial")} autoComplete="off" dir="ltr" {...register("serial")} errors={err("serial")} data-testid="field-serial" />
          <input type="hidden" {...register("udi")} />
        </Section>

        <Section title={t("section.insertion")}>
          <TextArea className="sm:col-span-2" label={t("field.indication")} {...register("indication")} errors={err("indication")} />
          <Controller
            control={control}
            name="insertedAt"
            render={({ field }) => (
              <TextInput
                label={t(mode === "change" ? "field.changedAt" : "field.insertedAt")}
                type="datetime-local"
                max={toLocalInputValue(new Date().toISOString())}
                value={toLocalInputValue(field.value as string)}
                onChange={(e) => field.onChange(fromLocalInputValue(e.target.value))}
                onBlur={field.onBlur}
                name={field.name}
                ref={field.ref}
                errors={err("insertedAt")}
                data-testid="field-inserted-at"
              />
            )}
          />
          <div className="flex flex-col gap-1">
            <p className="font-bold">{t("field.insertedBy")}</p>
            <p className="flex min-h-12 items-center">{clinicianName}</p>
          </div>
          <Select label={t("field.gelKind")} placeholder={t("choose")} options={options(GEL_KINDS, "gelKind")} {...register("gelKind")} errors={err("gelKind")} />
          <TextInput
            label={t("field.gelVolumeMl")}
            unit={t("unit.ml")}
            inputMode="decimal"
            hint={t("hint.gel")}
            disabled={draft.gelKind === "none"}
            {...register("gelVolumeMl")}
            errors={err("gelVolumeMl")}
          />
          <TextInput label={t("field.attempts")} inputMode="numeric" {...register("attempts")} errors={err("attempts")} />
          <TextArea label={t("field.difficulties")} {...register("difficulties")} errors={err("difficulties")} />
          <TextArea label={t("field.patientReaction")} {...register("patientReaction")} errors={err("patientReaction")} />
        </Section>

        <Section title={t("section.urine")}>
          <TextInput label={t("field.residualUrineMl")} unit={t("unit.ml")} inputMode="numeric" {...register("residualUrineMl")} errors={err("residualUrineMl")} />
          <TextInput label={t("field.urineDescription")} hint={t("hint.urine")} {...register("urineDescription")} errors={err("urineDescription")} />
          <Checkbox label={t("field.specimenTaken")} {...register("specimenTaken")} />
        </Section>

        <Section title={t("section.plan")}>
          <TextInput
            label={t("field.maxDwellDays")}
            unit={t("unit.days")}
            inputMode="numeric"
            hint={material ? t("hint.dwell", { days: planning.maxDwellDays[material] }) : t("hint.dwellNoMaterial")}
            {...register("maxDwellDays", { onChange: () => (dwellEdited.current = true) })}
            errors={err("maxDwellDays")}
            data-testid="field-max-dwell"
          />
          <TextInput
            label={t("field.reviewIntervalDays")}
            unit={t("unit.days")}
            inputMode="numeric"
            hint={t("hint.review")}
            {...register("reviewIntervalDays")}
            errors={err("reviewIntervalDays")}
          />
          <div className="rounded-lg bg-paper-sunk p-3 sm:col-span-2" aria-live="polite" data-testid="plan-preview">
            {plan ? (
              <dl className="grid gap-1 sm:grid-cols-[auto_1fr] sm:gap-x-4">
                <dt className="font-bold">{t("plan.change")}</dt>
                <dd className="tabular">
                  {dateOnly(plan.change.date)} · {t("plan.afterDays", { days: plan.change.intervalDays })} · {planBasis}
                </dd>
                <dt className="font-bold">{t("plan.review")}</dt>
                <dd className="tabular">
                  {dateOnly(plan.review.date)} · {t("plan.afterDays", { days: plan.review.intervalDays })}
                </dd>
              </dl>
            ) : (
              <p className="text-ink-soft">{t("plan.incomplete")}</p>
            )}
            <p className="mt-2 text-sm text-ink-soft">{t("findings.judgement")}</p>
          </div>
        </Section>
      </div>

      <div className="flex flex-col gap-4 lg:sticky lg:top-4 lg:self-start">
        <FindingsPanel
          outcome={outcome}
          draft={draft}
          overrides={overrides}
          onOverride={(code, reason) => setOverrides((o) => ({ ...o, [code]: reason }))}
          overrideErrors={overrideErrors}
          formatDate={dateOnly}
        />
        {formError ? (
          <p role="alert" className="rounded-lg border-2 border-level-emergency bg-level-emergency-soft p-3 font-bold text-level-emergency-ink" data-testid="form-error">
            {formError}
          </p>
        ) : null}
        <Button type="submit" disabled={mutation.isPending} className="w-full text-lg" data-testid="save">
          {mutation.isPending ? t("saving") : t(mode === "change" ? "save.change" : "save.insertion")}
        </Button>
      </div>
    </form>
  );
}
