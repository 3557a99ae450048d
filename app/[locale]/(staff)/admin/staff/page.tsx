import { getTranslations } from "next-intl/server";
import { getFormat } from "@/lib/i18n/format";
import { InviteStaffForm } from "@/components/admin/invite-staff-form";
import { WithdrawInvitationButton } from "@/components/admin/withdraw-invitation-button";
import { Card } from "@/components/ui/card";
import { listOrganisationsManagedBy } from "@/db/queries/organisations";
import { listPendingInvitations, listStaff } from "@/db/queries/staff";
import { requirePageRole } from "@/lib/auth/permissions";
import { Link } from "@/lib/i18n/navigation";
import { TableHead } from "@/components/ui/table-head";

export async function generateMetadata() {
  const t = await getTranslations("AdminStaff");
  return { title: t("title") };
}

export default async function StaffPage({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  const viewer = await requirePageRole(locale, "admin");
  const t = await getTranslations("AdminStaff");
  const v = await getTranslations("Vocabulary");
  const format = await getFormat();
  const [staff, invitations, orgs] = await Promise.all([
    listStaff({ organisationIds: viewer.organisationIds }),
    listPendingInvitations({ organisationIds: viewer.organisationIds }),
    listOrganisationsManagedBy({ organisationIds: viewer.organisationIds }),
  ]);
  const when = (d: Date) => format.dateTime(d, { weekday: "short", day: "numeric", month: "short", hour: "numeric", minute: "2-digit" });
  return (
    <div className="flex flex-col gap-8">
      <div>
        <h1 className="text-3xl font-bold">{t("title")}</h1>
        <p className="text-ink-soft">{t("intro")}</p>
      </div>

      <section aria-labelledby="staff-heading" className="flex flex-col gap-3">
        <h2 id="staff-heading" className="text-xl font-bold">
          {t("listHeading", { count: staff.length })}
        </h2>
        <div className="overflow-x-auto">
          <table className="w-full min-w-[40rem] border-collapse text-start">
            <TableHead dense columns={[t("name"), t("role"), t("organisations"), t("status")]} />
            <tbody>
              {staff.map((m) => (
                <tr key={m.id} className="border-b border-stone-faint align-top">
                  <td className="p-2">
                    <Link href={`/admin/staff/${m.id}`} className="font-bold text-brand underline underline-offset-4">
                      {m.name}
                    </Link>
                    <div className="break-all text-sm text-ink-soft">{m.email}</div>
                  </td>
                  <td className="p-2">{v(`role.${m.role}`)}</td>
                  <td className="p-2">
                    {m.organisations.map((o) => o.name).join(", ")}
                    {m.otherOrganisationCount ? <div className="text-sm text-ink-soft">{t("otherOrganisations", { count: m.otherOrganisationCount })}</div> : null}
                  </td>
                  <td className="p-2">
                    {m.active ? t("active") : <strong className="text-level-emergency-ink">{t("inactive")}</strong>}
                    <div className="text-sm text-ink-soft">{m.twoFactorEnabled ? t("twoFactorOn") : t("twoFactorOff")}</div>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </section>

      <section aria-labelledby="pending-heading" className="flex flex-col gap-3">
        <h2 id="pending-heading" className="text-xl font-bold">
          {t("pendingHeading")}
        </h2>
        {invitations.length === 0 ? <p className="text-ink-soft">{t("noPending")}</p> : null}
        <ul className="flex flex-col gap-2">
          {invitations.map((i) => (
            <li key={i.id}>
              <Card className="flex flex-wrap items-center justify-between gap-3 p-3">
                <div>
                  <p className="break-all font-bold">{i.email}</p>
                  <p className="text-sm">
                    {v(`role.${i.role}`)} · {i.organisations.map((o) => o.name).join(", ")}
                  </p>
                  <p className="text-sm text-ink-soft tabular">{i.expired ? t("expired") : t("expires", { when: when(i.expiresAt) })}</p>
                  {i.mail ? (
                    <p className={i.mail.status === "failed" ? "text-sm font-bold text-level-emergency-ink" : "text-sm text-ink-soft"} data-testid="invite-mail-state">
                      {i.mail.status === "sent" && i.mail.sentAt
                        ? t("mailSent", { when: when(i.mail.sentAt) })
                        : i.mail.status === "failed"
                          ? t("mailFailed")
                          : t("mailQueued")}
                    </p>
                  ) : null}
                </div>
                <WithdrawInvitationButton invitationId={i.id} email={i.email} />
              </Card>
            </li>
          ))}
        </ul>
      </section>

      <section aria-labelledby="invite-heading" className="flex flex-col gap-3">
        <h2 id="invite-heading" className="text-xl font-bold">
          {t("inviteHeading")}
        </h2>
        <p className="text-ink-soft">{t("inviteIntro")}</p>
        <Card>
          <InviteStaffForm organisations={orgs.map((o) => ({ id: o.id, name: o.name }))} />
        </Card>
      </section>
    </div>
  );
}
