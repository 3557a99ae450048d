"use client";
// The state of the insertion and change form, apart from its fieldsets: the draft, the live
// device check and planned dates (lib/clinical, run again by the server when saving), the
// override reasons, the maker's maximum dwell following the material, and the submit.
import { zodResolver } from "@hookform/resolvers/zod";
import { useTranslations } from "next-intl";
import { useEffect, useRef, useState } from "react";
import { useForm, type Control, type Resolver, type UseFormRegister } from "react-hook-form";
import type { z } from "zod";
import { useSubmitFailure } from "@/components/ui/use-error-text";
import { apiFetch, isApiError, setServerFieldErrors } from "@/lib/browser/api-client";
import { planDates, type Material, type PlanDatesResult, type PlanDefaults } from "@/lib/clinical";
import { useRouter } from "@/lib/i18n/navigation";
import { reconcileOverrides, runDeviceCheck, type CheckOutcome, type PatientFacts } from "@/lib/shared/episode-checks";
import { dayIn } from "@/lib/shared/time-zone";
import { changeSchema, insertionSchema } from "@/lib/validations/episode";
import type { ScanFill } from "./scan-field";

export type DeviceValues = z.input<typeof changeSchema>;
export type EpisodeMode = "insertion" | "change";

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

/** The deployment's planning defaults (admin settings over the rules' own: lib/config/settings getPlanDefaults), from the page. */
export type { PlanDefaults } from "@/lib/clinical";

/** What every fieldset of the form needs: the fields, their errors in words, and the live draft. */
export type EpisodeFields = {
  register: UseFormRegister<DeviceValues>;
  control: Control<DeviceValues>;
  errorsOf: (name: string) => string[] | undefined;
  draft: DeviceValues;
};

function startingValues(prev: PreviousDevice | null, defaults: PlanDefaults): DeviceValues {
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
    maxDwellDays: s(prev?.maxDwellDays),
    indication: prev?.indication ?? "",
    insertedAt: new Date(Math.floor(Date.now() / 60_000) * 60_000).toISOString(),
    residualUrineMl: "",
    urineDescription: "",
    specimenTaken: false,
    attempts: "1",
    difficulties: "",
    patientReaction: "",
    reviewIntervalDays: s(prev?.reviewIntervalDays ?? defaults.reviewIntervalDays),
    overrides: [],
    changeKind: "",
    unplannedReason: "",
    reasonNotes: "",
    needReviewed: false,
  };
}

export function useDeviceEpisodeForm({
  mode,
  patientId,
  patient,
  previous,
  timeZone,
  planDefaults,
}: {
  mode: EpisodeMode;
  patientId: string;
  patient: PatientFacts;
  previous: PreviousDevice | null;
  timeZone: string;
  planDefaults: PlanDefaults;
}) {
  const t = useTranslations("EpisodeForm");
  const router = useRouter();
  const { register, handleSubmit, control, watch, setValue, setError, formState } = useForm<DeviceValues>({
    resolver: zodResolver((mode === "change" ? changeSchema : insertionSchema) as typeof changeSchema) as unknown as Resolver<DeviceValues>,
    defaultValues: startingValues(previous, planDefaults),
    mode: "onTouched",
  });
  const [overrides, setOverrides] = useState<Record<string, string>>({});
  const [overrideErrors, setOverrideErrors] = useState<string[]>([]);
  const failure = useSubmitFailure("EpisodeForm");

  const draft = watch();
  const insertedAt = typeof draft.insertedAt === "string" && draft.insertedAt ? new Date(draft.insertedAt) : new Date();
  const checkAt = Number.isNaN(insertedAt.getTime()) ? new Date() : insertedAt;
  // Recomputed on every render: watch() re-renders on each keystroke and the check is cheap.
  const outcome: CheckOutcome = runDeviceCheck(draft, patient, checkAt, timeZone);

  // The maker's maximum dwell follows the material (the deployment's default for it) until the
  // nurse types a figure for this catheter. A figure carried over from the previous catheter is
  // that catheter's, not this one's: it gives way as soon as the material changes.
  const material = (draft.material || "") as Material | "";
  const dwellTyped = useRef(false);
  const dwellMaterial = useRef(material);
  useEffect(() => {
    if (material === dwellMaterial.current) return;
    dwellMaterial.current = material;
    if (material && !dwellTyped.current) setValue("maxDwellDays", String(planDefaults.maxDwellDays[material]), { shouldValidate: true });
  }, [material, planDefaults, setValue]);
  const materialDwell = material ? planDefaults.maxDwellDays[material] : null;
  // A default the nurse has not changed is not the maker's figure, whatever the field holds.
  const dwellIsDefault = materialDwell !== null && !dwellTyped.current && Number(draft.maxDwellDays) === materialDwell;

  let plan: PlanDatesResult | null = null;
  try {
    plan = planDates(
      {
        insertedOn: dayIn(checkAt, timeZone),
        material: draft.material as Material,
        route: draft.route as "urethral",
        maxDwellDays: draft.maxDwellDays ? Number(draft.maxDwellDays) : undefined,
        reviewIntervalDays: draft.reviewIntervalDays ? Number(draft.reviewIntervalDays) : undefined,
      },
      { defaultMaxDwellDays: planDefaults.maxDwellDays, reviewIntervalDays: planDefaults.reviewIntervalDays, dueSoonDays: planDefaults.dueSoonDays },
    );
  } catch {
    plan = null;
  }

  const onScan = (fill: ScanFill) => {
    const opts = { shouldValidate: true, shouldDirty: true } as const;
    // A scan replaces every field a label can carry; one this label lacks is cleared, never left
    // from the packet scanned before.
    setValue("gtin", fill.gtin ?? "", opts);
    setValue("lot", fill.lot ?? "", opts);
    setValue("expiry", fill.expiry ?? "", opts);
    setValue("serial", fill.serial ?? "", opts);
    setValue("udi", fill.udi, opts);
  };

  const overrideCheck = (values: DeviceValues, at: Date) => {
    const check = runDeviceCheck(values, patient, at, timeZone);
    return reconcileOverrides(
      check.ok ? check.findings : [],
      Object.entries(overrides).map(([code, reason]) => ({ code, reason })),
    );
  };

  // Invalid fields and missing override reasons are shown together, not one after the other.
  const onInvalid = () => {
    setOverrideErrors(overrideCheck(draft, checkAt).missing);
    failure.show(failure.text.one("validation_failed"));
  };

  const onSubmit = handleSubmit(async (values) => {
    failure.clear();
    const { missing, kept } = overrideCheck(values, new Date(values.insertedAt as string));
    setOverrideErrors(missing);
    if (missing.length) {
      document.querySelector<HTMLTextAreaElement>(`[data-testid="override-${missing[0]}"]`)?.focus();
      failure.show(t("errors.override_required"));
      return;
    }
    try {
      await apiFetch(`/api/patients/${patientId}/episodes${mode === "change" ? "/change" : ""}`, { method: "POST", body: { ...values, overrides: kept } });
      router.push(`/patients/${patientId}`);
      router.refresh();
    } catch (e) {
      // A stop the server found without its reason goes to that finding's box, not to a field.
      const fields = isApiError(e) ? Object.keys(e.fields) : [];
      const isOverride = (f: string) => f.startsWith("overrides.");
      setServerFieldErrors(e, setError, fields.filter((f) => !isOverride(f)));
      setOverrideErrors(isApiError(e) ? fields.filter((f) => isOverride(f) && e.fields[f].includes("override_required")).map((f) => f.slice("overrides.".length)) : []);
      failure.fail(e, (error) => (error.code === "conflict" ? t(mode === "change" ? "conflict.change" : "conflict.insertion") : null));
    }
  }, onInvalid);

  const fields: EpisodeFields = { register, control, errorsOf: (name) => failure.text.at(formState.errors, name), draft };
  return {
    fields,
    outcome,
    plan,
    /** Where the planned change comes from, for the plan preview. */
    planBasis: plan ? (dwellIsDefault && plan.change.basis === "maker" ? "material-default" : plan.change.basis) : null,
    materialDwell,
    /** The nurse typed the maker's figure for this catheter: the material no longer changes it. */
    onDwellTyped: () => {
      dwellTyped.current = true;
    },
    onScan,
    overrides,
    setOverride: (code: string, reason: string) => setOverrides((o) => ({ ...o, [code]: reason })),
    overrideErrors,
    failure: failure.message,
    submitting: formState.isSubmitting,
    onSubmit,
    today: dayIn(new Date(), timeZone),
  };
}
