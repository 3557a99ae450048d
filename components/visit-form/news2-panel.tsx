// NEWS2 as scored by lib/clinical: total, each measured value beside its sub-score, band and the
// RCP response, with the words that local policy, the maker's instructions and clinical judgement
// come first. Band shown by a word and a bordered box, never by colour alone.
import { useTranslations } from "next-intl";
import { news2HomeResponse, type News2Observations, type News2ResponseKey, type News2Risk } from "@/lib/clinical";

export type News2View = { total: number; subscores: Record<string, number>; risk: News2Risk; response: News2ResponseKey };

/** The observations as measured (the record's ObservationDto values). */
export type News2Values = News2Observations;

/** The numbers to call from the home (the care team's from its organisations, the emergency number from Settings). */
export type News2Contacts = { emergencyNumber: string | null; team: { name: string; phone: string | null; outOfHoursPhone: string | null }[] };

const tel = (phone: string) => `tel:${phone.replace(/[^+0-9]/g, "")}`;

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
  contacts,
}: {
  score: News2View;
  values?: News2Values | null;
  testId?: string;
  /** The history shows the values and score only; the response is for the moment of the visit. */
  showResponse?: boolean;
  contacts?: News2Contacts;
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
      {showResponse ? <HomeResponse response={score.response} contacts={contacts} /> : null}
      <p className="text-sm">{t("safety")}</p>
    </div>
  );
}

/** Beside the RCP text: whom to call from the patient's home (lib/clinical news2HomeResponse). */
function HomeResponse({ response, contacts }: { response: News2ResponseKey; contacts?: News2Contacts }) {
  const t = useTranslations("Visits");
  const home = news2HomeResponse(response);
  const link = (phone: string) => (
    <a href={tel(phone)} className="font-bold underline underline-offset-4">
      {phone}
    </a>
  );
  return (
    <div className="rounded-lg border-2 border-current/40 bg-paper-raised/60 p-3" data-testid="news2-home">
      <p className="font-bold">{t("home.title")}</p>
      <p className="text-sm italic">{t("home.noSource")}</p>
      <p data-testid="news2-home-text">{t(`home.text.${response}`)}</p>
      {home.call.length ? (
        <ul className="mt-1 flex flex-col gap-1">
          {home.call.map((c) => (
            <li key={c} data-contact={c}>
              {c === "gp" ? t("home.gp") : null}
              {c === "team"
                ? (contacts?.team.filter((o) => o.phone) ?? []).map((o) => (
                    <span key={o.name} className="block">
                      {t("home.team", { name: o.name })} {link(o.phone!)}
                    </span>
                  ))
                : null}
              {c === "out-of-hours"
                ? (contacts?.team.filter((o) => o.outOfHoursPhone) ?? []).map((o) => (
                    <span key={o.name} className="block">
                      {t("home.outOfHours", { name: o.name })} {link(o.outOfHoursPhone!)}
                    </span>
                  ))
                : null}
              {c === "emergency" ? (
                contacts?.emergencyNumber ? (
                  <span>
                    {t("home.emergency")} {link(contacts.emergencyNumber)}
                  </span>
                ) : (
                  <span>{t("home.emergencyUnset")}</span>
                )
              ) : null}
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}
