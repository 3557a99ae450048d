import { notFound } from "next/navigation";
import { getTranslations } from "next-intl/server";
import { PassportPanel } from "@/components/passport/passport-panel";
import { StaffTranslationStatus } from "@/components/translation/translation-status";
import { PortalInviteButton } from "@/components/portal-invite/portal-invite-button";
import { getPatientForInvite } from "@/db/queries/invitations";
import { getPassportOverview } from "@/db/queries/passports";
import { getPatientRecord } from "@/db/queries/patients";
import { passportLanguages } from "@/lib/passport";
import { openRecordPage } from "@/lib/records/patient-record-page";
import { isCareTeam } from "@/lib/auth/permissions";

export async function generateMetadata() {
  const t = await getTranslations("Passport");
  return { title: t("title") };
}

export default async function PassportTab({ params }: { params: Promise<{ locale: string; patientId: string }> }) {
  const { locale, patientId } = await params;
  const { via, closed } = await openRecordPage({ locale, patientId, action: "patient.view.passport" });
  const [record, overview, invitee] = await Promise.all([
    getPatientRecord({ patientId }),
    getPassportOverview({ patientId }),
    getPatientForInvite({ patientId }),
  ]);
  if (!record || !invitee) notFound();
  // Only the care team gives activation codes (as on the invite route), and only before an account exists.
  const canInvite = isCareTeam(via) && !invitee.userId && !invitee.closedAt && !closed;
  return (
    <div className="flex flex-col gap-8">
      <PassportPanel
        patientId={patientId}
        overview={overview}
        languages={passportLanguages(record.patient.preferredLocale)}
        hasDevice={Boolean(record.currentEpisode)}
        canOfferActivation={canInvite}
        // Only the care team issues or reissues (the route refuses visit access too).
        readOnly={closed || !isCareTeam(via)}
        translationStatus={<StaffTranslationStatus locales={passportLanguages(record.patient.preferredLocale)} />}
      />
      {canInvite ? <PortalInviteButton patientId={patientId} /> : null}
    </div>
  );
}
