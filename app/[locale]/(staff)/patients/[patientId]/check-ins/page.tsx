import { getTranslations } from "next-intl/server";
import { getFormat } from "@/lib/i18n/format";
import { LevelBadge } from "@/components/caseload/level-badge";
import { Card } from "@/components/ui/card";
import { listDiaryDays, listRecentCheckIns } from "@/db/queries/check-in-review";
import { openRecordPage } from "@/lib/records/patient-record-page";
import { TableHead } from "@/components/ui/table-head";

export async function generateMetadata() {
  const t = await getTranslations("PatientRecord.tabs");
  return { title: t("checkIns") };
}

// Answer keys of lib/clinical's CheckInAnswers that this view knows how to label.
const answerKeys = [
  "draining",
  "pain",
  "hoursWithoutUrine",
  "temperatureC",
  "shivering",
  "newConfusion",
  "feelsVeryUnwell",
  "breathless",
  "blood",
  "leaking",
  "catheterOut",
  "cloudyOrSmelly",
  "sediment",
  "constipated",
  "suprapubicSiteRed",
  "passingUrine",
] as const;
const enumValues = ["yes", "less", "none", "mild", "severe", "pink", "red", "clots", "little", "not-sure"] as const;

export default async function CheckInsTab({ params }: { params: Promise<{ locale: string; patientId: string }> }) {
  const { locale, patientId } = await params;
  await openRecordPage({ locale, patientId, action: "patient.view.check-ins" });
  const [checkIns, days] = await Promise.all([listRecentCheckIns({ patientId }), listDiaryDays({ patientId, days: 7 })]);
  const t = await getTranslations("PatientCheckIns");
  const format = await getFormat();
  const dateTime = (iso: string) => format.dateTime(new Date(iso), { dateStyle: "medium", timeStyle: "short" });
  const time = (iso: string) => format.dateTime(new Date(iso), { timeStyle: "short" });
  const day = (iso: string) => format.dateTime(new Date(`${iso}T12:00:00Z`), { weekday: "short", day: "numeric", month: "short" });

  const answerValue = (key: string, value: unknown): string => {
    if (typeof value === "boolean") return value ? t("yes") : t("no");
    if (key === "hoursWithoutUrine" && typeof value === "number") return t("hours", { count: value });
    if (key === "temperatureC" && typeof value === "number") return t("celsius", { value: format.number(value, { maximumFractionDigits: 1 }) });
    if (typeof value === "string" && (enumValues as readonly string[]).includes(value)) return t(`values.${value as "yes"}`);
    return String(value);
  };
  const answerLabel = (key: string) => ((answerKeys as readonly string[]).includes(key) ? t(`answers.${key as "pain"}`) : key);

  return (
    <div className="flex flex-col gap-6">
      <p className="rounded-lg border border-stone-faint bg-paper-sunk p-3 text-sm">{t("readOnly")}</p>
      <section aria-labelledby="checkins-heading" className="flex flex-col gap-3">
        <h2 id="checkins-heading" className="text-2xl font-bold">
          {t("checkInsTitle")}
        </h2>
        {checkIns.length === 0 ? (
          <p>{t("noCheckIns")}</p>
        ) : (
          <ul className="flex flex-col gap-3" data-testid="check-in-list">
            {checkIns.map((c) => (
              <li key={c.id}>
                <Card className="flex flex-col gap-2">
                  <div className="flex flex-wrap items-center gap-3">
                    <LevelBadge level={c.level} />
                    <span className="tabular font-bold" data-testid="check-in-answered">
                      {dateTime(c.at)}
                    </span>
                    {c.receivedLaterAt ? (
                      <span className="tabular text-ink-soft" data-testid="check-in-received-later">
                        {t("receivedLater", { at: dateTime(c.receivedLaterAt) })}
                      </span>
                    ) : null}
                    <span className="text-ink-soft">
                      {c.reportedByName
                        ? t("reportedBy", { name: c.reportedByName, role: t(`roles.${(c.reportedByRole ?? "other") as "patient"}`) })
                        : t("reportedByTeam")}
                    </span>
                  </div>
                  <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 sm:grid-cols-[auto_1fr_auto_1fr]">
                    {Object.entries(c.answers)
                      .filter(([k]) => k !== "route")
                      .map(([k, v]) => (
                        <div key={k} className="contents">
                          <dt className="text-ink-soft">{answerLabel(k)}</dt>
                          <dd className="tabular font-bold">{answerValue(k, v)}</dd>
                        </div>
                      ))}
                  </dl>
                  <p className="text-sm">
                    <span className="text-ink-soft">{t("rules")} </span>
                    {c.ruleIds.length ? (
                      c.ruleIds.map((id) => (
                        <code key={id} className="me-1 inline-block rounded bg-paper-sunk px-1.5 py-0.5 text-xs" dir="ltr">
                          {id}
                        </code>
                      ))
                    ) : (
                      <span>{t("noRules")}</span>
                    )}
                  </p>
                </Card>
              </li>
            ))}
          </ul>
        )}
        <p className="text-sm text-ink-soft">{t("safety")}</p>
      </section>

      <section aria-labelledby="diary-heading" className="flex flex-col gap-3">
        <h2 id="diary-heading" className="text-2xl font-bold">
          {t("diaryTitle")}
        </h2>
        <div className="overflow-x-auto rounded-card border border-stone-faint bg-paper-raised">
          <table className="w-full" data-testid="diary-table">
            <caption className="sr-only">{t("diaryCaption")}</caption>
            <TableHead columns={[t("day"), { label: t("in"), end: true }, { label: t("out"), end: true }, { label: t("balance"), end: true }, t("entries")]} />
            <tbody>
              {days.map((d) => (
                <tr key={d.day} className="border-t border-stone-faint align-top">
                  <th scope="row" className="tabular whitespace-nowrap p-3 text-start">{day(d.day)}</th>
                  <td className="tabular whitespace-nowrap p-3 text-end">{d.inCount ? t("ml", { ml: d.inMl }) : "—"}</td>
                  <td className="tabular whitespace-nowrap p-3 text-end">{d.outCount ? t("ml", { ml: d.outMl }) : "—"}</td>
                  <td className="tabular whitespace-nowrap p-3 text-end">{d.inCount || d.outCount ? t("mlSigned", { ml: format.number(d.balanceMl, { signDisplay: "exceptZero" }) }) : "—"}</td>
                  <td className="tabular p-3 text-sm">
                    {d.entries.length
                      ? d.entries
                          .slice()
                          .reverse()
                          .map((e) => t(e.kind === "in" ? "entryIn" : "entryOut", { time: time(e.at), ml: e.volumeMl }))
                          .join(" · ")
                      : t("noEntries")}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        <p className="text-sm text-ink-soft">{t("diarySafety")}</p>
      </section>
    </div>
  );
}
