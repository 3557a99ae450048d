import { useTranslations } from "next-intl";
import type { PatientDetails } from "@/lib/shared/dto";

/** Allergies that matter for a catheter, in a bordered warning box (never colour alone). */
export function AllergyBox({ allergies }: { allergies: PatientDetails["allergies"] }) {
  const t = useTranslations("PatientRecord");
  const list = [
    allergies.latex ? t("allergy.latex") : null,
    allergies.chlorhexidine ? t("allergy.chlorhexidine") : null,
    allergies.lidocaine ? t("allergy.lidocaine") : null,
    allergies.other ? allergies.other : null,
  ].filter((x): x is string => Boolean(x));
  if (list.length === 0) return null;
  return (
    <div role="note" aria-label={t("allergyTitle")} className="flex items-start gap-3 rounded-lg border-4 border-level-emergency bg-level-emergency-soft p-3 text-level-emergency-ink" data-testid="allergy-box">
      <svg viewBox="0 0 16 16" className="mt-0.5 h-6 w-6 shrink-0" aria-hidden="true">
        <path d="M8 1.5 15 14.5H1z" fill="currentColor" />
        <path d="M8 6v4" stroke="white" strokeWidth="1.8" strokeLinecap="round" />
        <circle cx="8" cy="12.3" r="1" fill="white" />
      </svg>
      <div>
        <p className="font-bold">{t("allergyTitle")}</p>
        <p className="text-lg font-bold">{list.join(" · ")}</p>
      </div>
    </div>
  );
}
