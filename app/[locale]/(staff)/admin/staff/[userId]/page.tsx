import { getTranslations } from "next-intl/server";
import { notFound } from "next/navigation";
import { SignOutStaffButton } from "@/components/admin/sign-out-staff-button";
import { StaffEditor } from "@/components/admin/staff-editor";
import { listOrganisationsManagedBy } from "@/db/queries/organisations";
import { getStaffMember } from "@/db/queries/staff";
import { requirePageRole } from "@/lib/auth/permissions";
import { Link } from "@/lib/i18n/navigation";

export async function generateMetadata() {
  const t = await getTranslations("AdminStaff");
  return { title: t("memberTitle") };
}

export default async function StaffMemberPage({ params }: { params: Promise<{ locale: string; userId: string }> }) {
  const { locale, userId } = await params;
  const viewer = await requirePageRole(locale, "admin");
  const member = await getStaffMember({ userId, organisationIds: viewer.organisationIds });
  if (!member) notFound();
  const t = await getTranslations("AdminStaff");
  const orgs = await listOrganisationsManagedBy({ organisationIds: viewer.organisationIds });
  return (
    <div className="flex flex-col gap-6">
      <Link href="/admin/staff" className="text-brand underline underline-offset-4">
        {t("back")}
      </Link>
      <div>
        <h1 className="text-3xl font-bold">{member.name}</h1>
        <p className="break-all text-ink-soft">{member.email}</p>
        <p>
          {member.active ? t("active") : <strong className="text-level-emergency-ink">{t("inactive")}</strong>} ·{" "}
          {member.twoFactorEnabled ? t("twoFactorOn") : t("twoFactorOff")}
        </p>
        {member.otherOrganisationCount ? <p className="text-sm text-ink-soft">{t("otherOrganisations", { count: member.otherOrganisationCount })}</p> : null}
      </div>
      {member.id !== viewer.userId ? (
        <section aria-labelledby="sessions-heading" className="flex flex-col gap-2">
          <h2 id="sessions-heading" className="text-xl font-bold">
            {t("sessionsHeading")}
          </h2>
          <p className="text-ink-soft">{t("sessionsIntro")}</p>
          <SignOutStaffButton userId={member.id} name={member.name} />
        </section>
      ) : null}
      <StaffEditor
        member={{ id: member.id, name: member.name, role: member.role, active: member.active, organisationIds: member.organisations.map((o) => o.id) }}
        organisations={orgs.map((o) => ({ id: o.id, name: o.name }))}
        isSelf={member.id === viewer.userId}
      />
    </div>
  );
}
