// NEWS2 as scored by lib/clinical: total, sub-scores, band and the RCP response, with the words
// that local policy, the maker's instructions and clinical judgement come first. Band shown by a
// word and a bordered box, never by colour alone.
import { useTranslations } from "next-intl";
import type { News2ResponseKey, News2Risk } from "@/lib/clinical";

export type News2View = { total: number; subscores: Record<string, number>; risk: News2Risk; response: News2ResponseKey };

const tone: Record<News2Risk, string> = {
  low: "border-level-selfcare bg-level-selfcare-soft text-level-selfcare-ink",
  "low-medium": "border-level-soon bg-level-soon-soft text-level-soon-ink",
  medium: "border-level-urgent bg-level-urgent-soft text-level-urgent-ink",
  high: "border-level-emergency bg-level-emergency-soft text-level-emergency-ink",
};

const ORDER = ["respirationRate", "spo2", "air", "systolicBp", "pulse", "consciousness", "temperature"] as const;

export function News2Panel({ score, testId = "news2-panel" }: { score: News2View; testId?: string }) {
  const t = useTranslations("VisitForm");
  const label = (k: (typeof ORDER)[number]) =>
    k === "air" ? t("airOrOxygen") : k === "temperature" ? t("temperature") : t(k);
  return (
    <div className={`flex flex-col gap-3 rounded-card border-4 p-4 ${tone[score.risk]}`} data-testid={testId} data-risk={score.risk}>
      <div className="flex flex-wrap items-baseline gap-x-4">
        <p className="text-2xl font-bold tabular" data-testid="news2-total">
          {t("scoreTitle")} · {t("total", { score: score.total })}
        </p>
        <p className="text-lg font-bold" data-testid="news2-band">
          {t("band")}: {t(`bands.${score.risk}`)}
        </p>
      </div>
      <div>
        <p className="font-bold">{t("subscores")}</p>
        <ul className="grid gap-x-6 sm:grid-cols-2">
          {ORDER.map((k) => (
            <li key={k} className="flex justify-between gap-3 tabular">
              <span>{label(k)}</span>
              <span className="font-bold">{score.subscores[k] ?? 0}</span>
            </li>
          ))}
        </ul>
      </div>
      <div>
        <p className="font-bold">{t("response")}</p>
        <p data-testid="news2-response">{t(`responses.${score.response}.text`)}</p>
        <p>{t("monitoring", { frequency: t(`responses.${score.response}.monitoring`) })}</p>
      </div>
      <p className="text-sm">{t("safety")}</p>
    </div>
  );
}
