import { getTranslations } from "next-intl/server";
import { getFormat } from "@/lib/i18n/format";
import { ChecklistSummary } from "@/components/transfer/checklist-summary";
import { CareTeamChanges } from "@/components/transfer/care-team-changes";
import { ChecklistForm, ReferralForm } from "@/components/transfer/referral-form";
import { WithdrawReferral } from "@/components/transfer/referral-answer";
import { isolate, ltr } from "@/components/portal/call-buttons";
import { Card } from "@/components/ui/card";
import { getLeadTeamContact } from "@/db/queries/contacts";
import { getLatestDischargeChecklist, listCareTeam, listPatientReferrals, listTransferTimeline, searchTeamDirectory } from "@/db/queries/referrals";
import { isCareTeam } from "@/lib/auth/permissions";
import { openRecordPage } from "@/lib/records/patient-record-page";

export async function generateMetadata() {
  const t = await getTranslations("PatientRecord.tabs");
  return { title: t("careTeam") };
}

/** Transfer of care: who looks after the patient and whose numbers they call, referrals, the discharge checklist. */
export default async function CareTeamTab({ params }: { params: Promise<{ locale: string; patientId: string }> }) {
  const { locale, patientId } = await params;
  const { viewer, via, closed } = await openRecordPage({ locale, patientId, action: "patient.view.care-team" });
  const [team, lead, referrals, checklist, timeline, directory] = await Promise.all([
    listCareTeam({ patientId }),
    getLeadTeamContact({ patientId }),
    listPatientReferrals({ patientId }),
    getLatestDischargeChecklist({ patientId }),
    listTransferTimeline({ patientId }),
    searchTeamDirectory({}),
  ]);
  const t = await getTranslations("Transfer");
  const format = await getFormat();
  const at = (d: Date | string) => format.dateTime(new Date(d), { dateStyle: "medium", timeStyle: "short" });
  const canAct = isCareTeam(via) && !closed;
  const ownTeams = team.filter((m) => viewer.organisationIds.includes(m.organisationId)).map((m) => ({ id: m.organisationId, name: m.name }));
  const pending = referrals.filter((r) => r.status === "pending");
  return (
    <div className="flex flex-col gap-8">
      <section aria-labelledby="team-heading" className="flex flex-col gap-3">
        <h2 id="team-heading" className="text-2xl font-bold">
          {t("teamHeading")}
        </h2>
        <ul className="flex flex-col gap-2" data-testid="care-team-list">
          {team.map((m) => (
            <li key={m.organisationId} className="rounded-lg border-2 border-stone-faint p-3">
              <span className="font-bold">{m.name}</span>
              {m.lead ? <span className="ms-2 rounded bg-brand px-2 py-0.5 text-sm font-bold text-white">{t("lead")}</span> : null}
            </li>
          ))}
        </ul>
        {lead ? (
          <Card className="flex flex-col gap-1" data-testid="lead-contact">
            <p className="font-bold">{t("patientCalls", { team: isolate(lead.name) })}</p>
            <p className="tabular">{lead.phone ? t("day", { phone: ltr(lead.phone) }) : t("noPhone")}</p>
            <p className="tabular">
              {lead.outOfHoursPhone
                ? t(lead.outOfHoursIsService ? "oohService" : "oohTeam", { phone: ltr(lead.outOfHoursPhone), service: isolate(lead.outOfHoursServiceName ?? "") })
                : t("noOutOfHours")}
            </p>
          </Card>
        ) : (
          <p role="note" className="font-bold">{t("noTeam")}</p>
        )}
      </section>

      {pending.length ? (
        <section aria-labelledby="pending-heading" className="flex flex-col gap-3" data-testid="pending-referrals">
          <h2 id="pending-heading" className="text-2xl font-bold">
            {t("pendingHeading")}
          </h2>
          {pending.map((r) => (
            <Card key={r.id} className="flex flex-col gap-2">
              <p className="font-bold">{t("waitingFor", { team: isolate(r.toName), date: at(r.createdAt) })}</p>
              {r.reminders ? <p>{t("sentAgain", { count: r.reminders })}</p> : null}
              {canAct ? <WithdrawReferral patientId={patientId} referralId={r.id} /> : null}
            </Card>
          ))}
        </section>
      ) : null}

      {canAct ? (
        <section aria-labelledby="refer-heading" className="flex flex-col gap-3">
          <h2 id="refer-heading" className="text-2xl font-bold">
            {t("referral.heading")}
          </h2>
          <p className="text-ink-soft">{t("referral.intro")}</p>
          <ReferralForm patientId={patientId} ownTeams={ownTeams} onTeamIds={team.map((m) => m.organisationId)} initialDirectory={directory} />
        </section>
      ) : null}

      <section aria-labelledby="checklist-heading" className="flex flex-col gap-3">
        <h2 id="checklist-heading" className="text-2xl font-bold">
          {t("checklist.title")}
        </h2>
        {checklist ? <ChecklistSummary checklist={checklist} /> : <p>{t("checklist.none")}</p>}
        {canAct ? (
          <details className="rounded-lg border-2 border-stone-faint p-3">
            <summary className="min-h-12 cursor-pointer py-2 font-bold">{t("checklist.alone")}</summary>
            <ChecklistForm patientId={patientId} />
          </details>
        ) : null}
      </section>

      {canAct ? (
        <section aria-labelledby="changes-heading" className="flex flex-col gap-3">
          <h2 id="changes-heading" className="text-2xl font-bold">
            {t("changes.heading")}
          </h2>
          <CareTeamChanges
            patientId={patientId}
            team={team.map((m) => ({ id: m.organisationId, name: m.name, lead: m.lead }))}
            ownTeamIds={viewer.organisationIds}
            directory={directory.map((o) => ({ id: o.id, name: o.name }))}
          />
        </section>
      ) : null}

      <section aria-labelledby="transfer-timeline" className="flex flex-col gap-3">
        <h2 id="transfer-timeline" className="text-2xl font-bold">
          {t("timeline.heading")}
        </h2>
        {timeline.length ? (
          <ol className="flex flex-col gap-3 border-s-4 border-brand-soft ps-4" data-testid="transfer-timeline">
            {timeline.map((e) => (
              <li key={e.id}>
                <p className="font-bold">{t(`timeline.${e.action}`)}</p>
                <p className="text-ink-soft">
                  {[at(e.at), e.actorName ?? t("timeline.system"), e.organisationName].filter(Boolean).join(" · ")}
                </p>
                {e.reason ? <p>{t("timeline.reason", { reason: e.reason })}</p> : null}
              </li>
            ))}
          </ol>
        ) : (
          <p>{t("timeline.empty")}</p>
        )}
        {referrals
          .filter((r) => r.status === "declined")
          .map((r) => (
            <p key={r.id} className="rounded-lg border-2 border-level-urgent bg-level-urgent-soft p-3 text-level-urgent-ink" data-testid="declined-referral">
              {t("declinedBy", { team: isolate(r.toName), reason: isolate(r.declineReason ?? "") })}
            </p>
          ))}
      </section>
    </div>
  );
}
