// The alerts to acknowledge and results to chase on the team's caseload, oldest first. Past its
// time (or sent again) an item is red, with the words "overdue", never by colour alone.
import { getTranslations } from "next-intl/server";
import { getFormat } from "@/lib/i18n/format";
import type { CaseloadItemView } from "@/lib/records/caseload-items";
import { Link } from "@/lib/i18n/navigation";
import { AcknowledgeForm } from "./acknowledge-form";

export async function CaseloadItemsPanel({ items }: { items: CaseloadItemView[] }) {
  const t = await getTranslations("CareLoop");
  const vocab = await getTranslations("Vocabulary");
  const visit = await getTranslations("VisitForm");
  const levelWord = (i: CaseloadItemView) =>
    i.kind === "check-in" && (i.level === "urgent" || i.level === "emergency")
      ? vocab(`triageLevel.${i.level}`)
      : i.kind === "news2" && (i.level === "low-medium" || i.level === "medium" || i.level === "high")
        ? visit(`bands.${i.level}`)
        : "";
  const format = await getFormat();
  const at = (iso: string) => format.dateTime(new Date(iso), { weekday: "short", day: "numeric", month: "short", hour: "2-digit", minute: "2-digit" });
  const reporter = (r: CaseloadItemView["reporter"]) =>
    !r ? null : r.kind === "patient" ? t("reporter.patient") : r.kind === "carer" ? t("reporter.carer", { name: r.name }) : t("reporter.clinician", { details: [r.name, r.organisation, r.phone].filter(Boolean).join(", ") });
  return (
    <section aria-labelledby="to-acknowledge" className="flex flex-col gap-3" data-testid="caseload-items">
      <h2 id="to-acknowledge" className="text-2xl font-bold">
        {t("title", { count: items.length })}
      </h2>
      {items.length === 0 ? <p>{t("none")}</p> : null}
      <ul className="flex flex-col gap-4">
        {items.map((i) => (
          <li
            key={i.id}
            className={`flex flex-col gap-2 rounded-card border-4 p-4 ${i.overdue ? "border-level-emergency bg-level-emergency-soft text-level-emergency-ink" : "border-level-urgent bg-paper-raised"}`}
            data-testid="caseload-item"
            data-overdue={i.overdue}
            data-kind={i.kind}
          >
            <div className="flex flex-wrap items-baseline justify-between gap-2">
              <p className="text-lg font-bold">
                {i.patientName} <span className="tabular font-normal">· {i.healthRecordNumber}</span>{" "}
                {/* Its own words, so the caseload table's link is the one named after the patient. */}
                <Link href={`/patients/${i.patientId}`} className="text-base underline underline-offset-4">
                  {t("openRecord")}
                </Link>
              </p>
              <p className="font-bold">{t(`kind.${i.kind}`, { level: levelWord(i) })}</p>
            </div>
            {i.overdue ? (
              <p className="font-bold" data-testid="caseload-item-overdue">
                {i.resentAt ? t("overdueResent", { when: at(i.resentAt) }) : t("overdue")}
              </p>
            ) : null}
            <p>{i.summary}</p>
            {reporter(i.reporter) ? <p className="text-sm">{t("reportedBy", { who: reporter(i.reporter)! })}</p> : null}
            {i.reporterNotes ? <p className="text-sm italic">{i.reporterNotes}</p> : null}
            <p className="tabular text-sm">
              {t("raised", { when: at(i.createdAt) })}
              {i.dueAt && !i.overdue ? ` · ${t("due", { when: at(i.dueAt) })}` : ""}
            </p>
            <AcknowledgeForm patientId={i.patientId} itemId={i.id} sample={i.kind === "sample-result"} />
          </li>
        ))}
      </ul>
    </section>
  );
}
