import { getTranslations } from "next-intl/server";
import { getFormat } from "@/lib/i18n/format";
import { isolate } from "@/components/portal/call-buttons";
import { Card } from "@/components/ui/card";
import { listCaseloadReferrals } from "@/db/queries/referrals";
import { getReferralReminderHours } from "@/lib/config/settings";
import { Link } from "@/lib/i18n/navigation";
import { ReferralAnswer } from "./referral-answer";

/**
 * The top of the caseload: patients referred to the viewer's teams (accept or decline), and the
 * referrals their teams sent that are still waiting (flagged once unanswered past the reminder
 * time in Settings) or were declined, with the reason.
 */
export async function CaseloadReferrals({ organisationIds }: { organisationIds: string[] }) {
  const hours = await getReferralReminderHours();
  const { incoming, outgoing } = await listCaseloadReferrals({ organisationIds, hours });
  if (!incoming.length && !outgoing.length) return null;
  const t = await getTranslations("Transfer.caseload");
  const format = await getFormat();
  const at = (d: Date) => format.dateTime(d, { dateStyle: "medium", timeStyle: "short" });
  const day = (d: string) => format.dateTime(new Date(`${d}T12:00:00Z`), { dateStyle: "medium", timeZone: "UTC" });
  return (
    <div className="flex flex-col gap-6">
      {incoming.length ? (
        <section aria-labelledby="referred-to-you" className="flex flex-col gap-3" data-testid="referred-to-you">
          <h2 id="referred-to-you" className="text-2xl font-bold">
            {t("incomingHeading", { count: incoming.length })}
          </h2>
          {incoming.map((r) => {
            const name = `${r.givenName} ${r.familyName}`;
            return (
              <Card key={r.id} className="flex flex-col gap-2 border-4 border-brand" data-testid="incoming-referral">
                <p className="text-xl font-bold">{name}</p>
                <p className="tabular">{t("who", { hrn: isolate(r.healthRecordNumber), born: day(r.dateOfBirth) })}</p>
                <p>{t("from", { team: isolate(r.fromName), name: isolate(r.referredByName ?? ""), date: at(r.createdAt) })}</p>
                <p className="whitespace-pre-line rounded-lg bg-paper-sunk p-3">{r.handoverNote}</p>
                <ReferralAnswer referralId={r.id} patientName={name} />
              </Card>
            );
          })}
        </section>
      ) : null}
      {outgoing.length ? (
        <section aria-labelledby="your-referrals" className="flex flex-col gap-3" data-testid="your-referrals">
          <h2 id="your-referrals" className="text-xl font-bold">
            {t("outgoingHeading")}
          </h2>
          <ul className="flex flex-col gap-2">
            {outgoing.map((r) => {
              const late = r.overdue;
              const tone = r.status === "declined" || late ? "border-level-urgent bg-level-urgent-soft text-level-urgent-ink" : "border-stone-faint";
              return (
                <li key={r.id} className={`rounded-lg border-2 p-3 ${tone}`} data-testid={late ? "referral-unanswered" : r.status === "declined" ? "referral-declined" : "referral-waiting"}>
                  <Link href={`/patients/${r.patientId}/care-team`} className="font-bold underline">
                    {r.givenName} {r.familyName}
                  </Link>{" "}
                  {r.status === "declined"
                    ? t("declined", { team: isolate(r.toName), reason: isolate(r.declineReason ?? "") })
                    : late
                      ? t("unanswered", { team: isolate(r.toName), date: at(r.createdAt), hours })
                      : t("waiting", { team: isolate(r.toName), date: at(r.createdAt) })}
                </li>
              );
            })}
          </ul>
        </section>
      ) : null}
    </div>
  );
}
