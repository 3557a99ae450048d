import { useTranslations } from "next-intl";
import { WarningMark } from "@/components/ui/warning-mark";
import { allergySummary } from "@/lib/clinical/allergies";
import type { PatientDetails } from "@/lib/shared/dto";

/**
 * Allergies that matter for a catheter, in a bordered warning box (never colour alone); those
 * nobody has asked about are named as not recorded, so the nurse asks before catheterising.
 */
export function AllergyBox({ allergies }: { allergies: PatientDetails["allergies"] }) {
  const t = useTranslations("PatientRecord");
  const { present, notRecorded } = allergySummary(allergies);
  const list = [...present.map((a) => t(`allergy.${a}`)), ...(allergies.other ? [allergies.other] : [])];
  const unknown = notRecorded.map((a) => t(`allergy.${a}`)).join(" · ");
  if (list.length === 0 && !unknown) return null;
  const stop = list.length > 0;
  return (
    <div
      role="note"
      aria-label={t("allergyTitle")}
      className={`flex items-start gap-3 rounded-lg p-3 ${stop ? "border-4 border-level-emergency bg-level-emergency-soft text-level-emergency-ink" : "border-2 border-level-urgent bg-level-urgent-soft text-level-urgent-ink"}`}
      data-testid="allergy-box"
    >
      <WarningMark className="mt-0.5 h-6 w-6 shrink-0" />
      <div>
        <p className="font-bold">{t("allergyTitle")}</p>
        {stop ? <p className="text-lg font-bold">{list.join(" · ")}</p> : null}
        {unknown ? (
          <p className="font-bold" data-testid="allergy-not-recorded">
            {t("allergyNotRecorded", { allergens: unknown })}
          </p>
        ) : null}
      </div>
    </div>
  );
}
