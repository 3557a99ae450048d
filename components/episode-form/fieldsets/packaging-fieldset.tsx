"use client";
// What the packet says: scanned from its GS1 barcode (or typed), maker, product, lot, expiry,
// product number and serial.
import { useTranslations } from "next-intl";
import { Field } from "@/components/ui/field";
import { Section } from "@/components/ui/section";
import { ScanField, type ScanFill } from "../scan-field";
import type { EpisodeFields } from "../use-device-episode-form";

export function PackagingFieldset({ fields: { register, errorsOf }, today, onScan }: { fields: EpisodeFields; today: string; onScan: (fill: ScanFill) => void }) {
  const t = useTranslations("EpisodeForm");
  return (
    <Section title={t("section.packaging")}>
      <ScanField today={today} onRead={onScan} />
      <Field label={t("field.maker")} autoComplete="off" {...register("maker")} errors={errorsOf("maker")} />
      <Field label={t("field.productName")} autoComplete="off" {...register("productName")} errors={errorsOf("productName")} />
      <Field label={t("field.lot")} autoComplete="off" dir="ltr" {...register("lot")} errors={errorsOf("lot")} data-testid="field-lot" />
      <Field label={t("field.expiry")} type="date" {...register("expiry")} errors={errorsOf("expiry")} data-testid="field-expiry" />
      <Field label={t("field.gtin")} inputMode="numeric" dir="ltr" {...register("gtin")} errors={errorsOf("gtin")} data-testid="field-gtin" />
      <Field label={t("field.serial")} autoComplete="off" dir="ltr" {...register("serial")} errors={errorsOf("serial")} data-testid="field-serial" />
      <input type="hidden" {...register("udi")} />
    </Section>
  );
}
