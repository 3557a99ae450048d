// The trend charts' text equivalent: every visit's observations and their NEWS2 sub-scores in
// one table, newest first, so a screen reader (or anyone) gets the same numbers as the charts.
import { getTranslations } from "next-intl/server";
import { getFormat } from "@/lib/i18n/format";
import type { ObservationDto } from "@/db/queries/observations";

export async function ObservationTable({ observations }: { observations: ObservationDto[] }) {
  const t = await getTranslations("Visits.trends");
  const v = await getTranslations("VisitForm");
  const format = await getFormat();
  const cell = (value: string, score: number | undefined) => (
    <td className="p-2 text-end tabular">
      {value} <span className="text-ink-soft">({score ?? 0})</span>
    </td>
  );
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-sm" data-testid="observation-table">
        <caption className="pb-2 text-start">{t("tableCaption")}</caption>
        <thead className="bg-paper-sunk">
          <tr>
            <th scope="col" className="p-2 text-start">
              {t("when")}
            </th>
            <th scope="col" className="p-2 text-end">{t("param.total")}</th>
            <th scope="col" className="p-2 text-end">{t("param.respirationRate")}</th>
            <th scope="col" className="p-2 text-end">{t("param.spo2")}</th>
            <th scope="col" className="p-2 text-end">{t("param.systolicBp")}</th>
            <th scope="col" className="p-2 text-end">{t("param.pulse")}</th>
            <th scope="col" className="p-2 text-end">{v("consciousness")}</th>
            <th scope="col" className="p-2 text-end">{t("param.temperatureC")}</th>
          </tr>
        </thead>
        <tbody>
          {observations.map((o) => (
            <tr key={o.id} className="border-t border-stone-faint" data-observation={o.id}>
              <th scope="row" className="p-2 text-start font-normal tabular">
                {format.dateTime(new Date(o.takenAt), { dateStyle: "medium", timeStyle: "short" })}
              </th>
              <td className="p-2 text-end font-bold tabular">
                {o.news2.total} · {v(`bands.${o.news2.risk}`)}
              </td>
              {cell(String(o.values.respirationRate), o.news2.subscores.respirationRate)}
              {cell(`${o.values.spo2} %${o.values.onOxygen ? ` ${v("oxygen")}` : ""}`, o.news2.subscores.spo2)}
              {cell(String(o.values.systolicBp), o.news2.subscores.systolicBp)}
              {cell(String(o.values.pulse), o.news2.subscores.pulse)}
              {cell(o.values.consciousness, o.news2.subscores.consciousness)}
              {cell(o.values.temperatureC.toFixed(1), o.news2.subscores.temperature)}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
