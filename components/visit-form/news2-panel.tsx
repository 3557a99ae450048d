// NEWS2 as scored by lib/clinical: total, each measured value beside its sub-score, band and the
// RCP response, with the words that local policy, the maker's instructions and clinical judgement
// come first. Band shown by a word and a bordered box, never by colour alone.
import { useTranslations } from "next-intl";
import type { Consciousness, News2ResponseKey, News2Risk } from "@/lib/clinical";

export type News2View = { total: number; subscores: Record<string, number>; risk: News2Risk; response: News2ResponseKey };

/** The observations as measured (the record's ObservationDto values). */
export type News2Values = {
  respirationRate: number;
  spo2: number;
  spo2Scale: 1 | 2;
  onOxygen: boolean;
  systolicBp: number;
  pulse: number;
  consciousness: Consciousness;
  temperatureC: number;
};

const tone: Record<News2Risk, string> = {
  low: "border-level-selfcare bg-level-selfcare-soft text-level-selfcare-ink",
  "low-medium": "border-level-soon bg-level-soon-soft text-level-soon-ink",
  medium: "border-level-urgent bg-level-urgent-soft text-level-urgent-ink",
  high: "border-level-emergency bg-level-emergency-soft text-level-emergency-ink",
};

const ORDER = ["respirationRate", "spo2", "air", "systolicBp", "pulse", "consciousness", "temperature"] as const;
type Parameter = (typeof ORDER)[number];

export function News2Panel({
  score,
  values,
  testId = "news2-panel",
  showResponse = true,
}: {
  score: News2View;
  values?: News2Values | null;
  testId?: string;
  /** The history shows the values and score only; the response is for the moment of the visit. */
  showResponse?: boolean;
}) {
  const t = useTranslations("VisitForm");
  const tv = useTranslations("Visits");
  const label = (k: Parameter) => (k === "air" ? t("airOrOxygen") : k === "temperature" ? t("temperature") : t(k));
  const valueOf = (k: Parameter): string | null => {
    if (!values) return null;
    switch (k) {
      case "respirationRate":
        return `${values.respirationRate} ${t("perMinute")}`;
      case "spo2":
        return tv("spo2Value", { value: values.spo2, scale: values.spo2Scale });
      case "air":
        return values.onOxygen ? t("oxygen") : t("air");
      case "systolicBp":
        return `${values.systolicBp} ${t("mmHg")}`;
      case "pulse":
        return `${values.pulse} ${t("perMinute")}`;
      case "consciousness":
        return `${values.consciousness} · ${t(`acvpu.${values.consciousness}`)}`;
      case "temperature":
        return `${values.temperatureC.toFixed(1)} ${t("celsius")}`;
    }
  };
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
      <table className="w-full max-w-xl tabular" data-testid="news2-values">
        <caption className="text-start font-bold">{values ? tv("valuesTitle") : t("subscores")}</caption>
        <thead>
          <tr>
            <th scope="col" className="py-1 pe-3 text-start">
              {tv("parameter")}
            </th>
            {values ? (
              <th scope="col" className="py-1 pe-3 text-start">
                {tv("value")}
              </th>
            ) : null}
            <th scope="col" className="py-1 text-end">
              {tv("subscore")}
            </th>
          </tr>
        </thead>
        <tbody>
          {ORDER.map((k) => (
            <tr key={k} className="border-t border-current/20" data-parameter={k}>
              <th scope="row" className="py-1 pe-3 text-start font-normal">
                {label(k)}
              </th>
              {values ? <td className="py-1 pe-3 font-bold">{valueOf(k)}</td> : null}
              <td className="py-1 text-end font-bold">{score.subscores[k] ?? 0}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {showResponse ? (
        <div>
          <p className="font-bold">{t("response")}</p>
          <p data-testid="news2-response">{t(`responses.${score.response}.text`)}</p>
          <p>{t("monitoring", { frequency: t(`responses.${score.response}.monitoring`) })}</p>
        </div>
      ) : null}
      <p className="text-sm">{t("safety")}</p>
    </div>
  );
}
