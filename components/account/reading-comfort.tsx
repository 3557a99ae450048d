"use client";
// Reading comfort, kept for the person (not the phone): a text size step and a higher-contrast
// look. The portal layout applies them to every portal page, the check-in included.
import { useTranslations } from "next-intl";
import { useState } from "react";
import { DoneStatus, ErrorAlert } from "@/components/ui/notice";
import { useErrorText } from "@/components/ui/use-error-text";
import { apiFetch } from "@/lib/browser/api-client";
import { useRouter } from "@/lib/i18n/navigation";
import { CONTRASTS, TEXT_SIZES, type ReadingComfort } from "@/lib/validations/reading";

export function ReadingComfortForm({ initial }: { initial: ReadingComfort }) {
  const t = useTranslations("Reading");
  const errorText = useErrorText("Reading");
  const router = useRouter();
  const [value, setValue] = useState(initial);
  const [saved, setSaved] = useState(false);
  const [error, setError] = useState<string | null>(null);

  async function save(next: ReadingComfort) {
    setValue(next);
    setSaved(false);
    setError(null);
    try {
      await apiFetch("/api/account/reading", { method: "PUT", body: next });
      setSaved(true);
      router.refresh();
    } catch (e) {
      setError(errorText.one("generic"));
      void e;
    }
  }

  const choice = (selected: boolean) =>
    `flex min-h-12 items-center justify-center rounded-lg border-2 px-3 font-bold ${selected ? "border-brand bg-brand text-white" : "border-brand bg-paper-raised text-brand"}`;

  return (
    <section aria-labelledby="reading-title" className="flex flex-col gap-3 rounded-lg border border-stone-faint bg-paper-raised p-4" data-testid="reading-comfort">
      <h2 id="reading-title" className="text-xl font-bold">
        {t("title")}
      </h2>
      <p>{t("intro")}</p>
      <ErrorAlert message={error} />
      <fieldset className="flex flex-col gap-2">
        <legend className="mb-1 font-bold">{t("textSize")}</legend>
        <div className="grid grid-cols-2 gap-2">
          {TEXT_SIZES.map((percent, step) => (
            <button key={percent} type="button" className={choice(value.textSize === step)} aria-pressed={value.textSize === step} data-text-step={step} onClick={() => save({ ...value, textSize: step })}>
              <span style={{ fontSize: `${percent}%` }}>{t(`size${step}` as "size0")}</span>
            </button>
          ))}
        </div>
      </fieldset>
      <fieldset className="flex flex-col gap-2">
        <legend className="mb-1 font-bold">{t("contrast")}</legend>
        <div className="grid grid-cols-2 gap-2">
          {CONTRASTS.map((c) => (
            <button key={c} type="button" className={choice(value.contrast === c)} aria-pressed={value.contrast === c} data-contrast-choice={c} onClick={() => save({ ...value, contrast: c })}>
              {t(`contrast_${c}` as "contrast_standard")}
            </button>
          ))}
        </div>
      </fieldset>
      <DoneStatus message={saved ? t("saved") : null} />
    </section>
  );
}
