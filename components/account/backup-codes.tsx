"use client";
import { useTranslations } from "next-intl";

/** Backup codes, shown once: each lets you sign in one time without the app. */
export function BackupCodes({ codes }: { codes: string[] }) {
  const t = useTranslations("TwoFactor");
  if (codes.length === 0) return null;
  return (
    <section aria-labelledby="backup-heading" className="flex flex-col gap-2 rounded-card border-2 border-finding-warn bg-finding-warn-soft p-4">
      <h3 id="backup-heading" className="text-lg font-bold">
        {t("backupHeading")}
      </h3>
      <p>{t("backupIntro")}</p>
      <ul className="grid grid-cols-2 gap-2 font-mono tabular" dir="ltr" data-testid="backup-codes">
        {codes.map((c) => (
          <li key={c}>{c}</li>
        ))}
      </ul>
    </section>
  );
}
