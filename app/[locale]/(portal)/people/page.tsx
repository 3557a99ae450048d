import { getTranslations } from "next-intl/server";
import { getFormat } from "@/lib/i18n/format";
import { InviteCarerForm } from "@/components/people/invite-carer-form";
import { RemoveCarerButton } from "@/components/people/remove-carer-button";
import { Card } from "@/components/ui/card";
import { listCarerLinks } from "@/db/queries/invitations";
import { requirePageRole } from "@/lib/auth/permissions";
import { portalPatient, portalPatients } from "@/lib/portal";

export async function generateMetadata() {
  const t = await getTranslations("People");
  return { title: t("title") };
}

export default async function PeoplePage({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  const viewer = await requirePageRole(locale, "patient", "carer");
  const t = await getTranslations("People");
  const format = await getFormat();

  if (viewer.role === "carer") {
    const helping = await portalPatients(viewer);
    return (
      <div className="flex flex-col gap-5">
        <h1 className="text-3xl font-bold">{t("title")}</h1>
        {helping.length ? (
          <ul className="flex flex-col gap-3">
            {helping.map((p) => (
              <li key={p.id}>
                <Card>
                  <p className="text-xl font-bold">{t("carer.helping", { name: `${p.givenName} ${p.familyName}` })}</p>
                </Card>
              </li>
            ))}
          </ul>
        ) : (
          <p>{t("carer.none")}</p>
        )}
        <p>{t("carer.note")}</p>
      </div>
    );
  }

  const patient = await portalPatient(viewer);
  if (!patient) return <p>{(await getTranslations("Today"))("noPatient")}</p>;
  const links = await listCarerLinks({ patientId: patient.id });
  const date = (iso: string) => format.dateTime(new Date(iso), { weekday: "long", day: "numeric", month: "long" });
  return (
    <div className="flex flex-col gap-5">
      <h1 className="text-3xl font-bold">{t("title")}</h1>
      <p>{t("intro")}</p>
      <section aria-labelledby="carers-title" className="flex flex-col gap-3">
        <h2 id="carers-title" className="text-2xl font-bold">
          {t("listTitle")}
        </h2>
        {links.length ? (
          <ul className="flex flex-col gap-3" data-testid="carer-list">
            {links.map((l) => (
              <li key={l.id}>
                <Card className="flex flex-col gap-3" data-testid="carer">
                  <div>
                    <p className="text-xl font-bold">{l.name ?? l.email}</p>
                    {l.name ? <p className="text-ink-soft [overflow-wrap:anywhere]">{l.email}</p> : null}
                    <p className="mt-1">
                      {l.status === "active"
                        ? t("active", { date: date(l.acceptedAt ?? l.invitedAt) })
                        : l.inviteExpired
                          ? t("expired")
                          : t("pending", { date: date(l.invitedAt) })}
                    </p>
                  </div>
                  <RemoveCarerButton patientId={patient.id} linkId={l.id} name={l.name ?? l.email} />
                </Card>
              </li>
            ))}
          </ul>
        ) : (
          <p>{t("none")}</p>
        )}
      </section>
      <section aria-labelledby="invite-title" className="flex flex-col gap-3">
        <h2 id="invite-title" className="text-2xl font-bold">
          {t("inviteTitle")}
        </h2>
        <InviteCarerForm patientId={patient.id} />
      </section>
    </div>
  );
}
