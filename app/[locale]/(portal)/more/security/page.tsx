import { getTranslations } from "next-intl/server";
import { ChangePasswordForm } from "@/components/account/change-password-form";
import { TwoFactorPanel } from "@/components/account/two-factor-panel";
import { requirePageRole } from "@/lib/auth/permissions";
import { Link } from "@/lib/i18n/navigation";

export async function generateMetadata() {
  const t = await getTranslations("More.security");
  return { title: t("title") };
}

/** A patient's or carer's sign-in: the optional second step, the password, and their sessions. */
export default async function PortalSecurityPage({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  const viewer = await requirePageRole(locale, "patient", "carer");
  const t = await getTranslations("More.security");
  const section = "flex flex-col gap-3 rounded-lg border border-stone-faint bg-paper-raised p-4";
  return (
    <div className="flex flex-col gap-5">
      <Link href="/more" className="text-brand underline underline-offset-4">
        {t("back")}
      </Link>
      <h1 className="text-3xl font-bold">{t("title")}</h1>
      <p>{t("intro")}</p>
      <section aria-labelledby="sessions-heading" className={section}>
        <h2 id="sessions-heading" className="text-xl font-bold">
          {t("sessionsHeading")}
        </h2>
        <p>{t("sessionsIntro")}</p>
        <Link href="/more/sessions" className="font-bold text-brand underline underline-offset-4">
          {t("sessionsLink")}
        </Link>
      </section>
      <section aria-labelledby="two-step-heading" className={section}>
        <h2 id="two-step-heading" className="text-xl font-bold">
          {t("twoStepHeading")}
        </h2>
        <TwoFactorPanel enabled={viewer.secondFactor?.enabled ?? false} required={false} />
      </section>
      <section aria-labelledby="password-heading" className={section}>
        <h2 id="password-heading" className="text-xl font-bold">
          {t("passwordHeading")}
        </h2>
        <ChangePasswordForm />
      </section>
    </div>
  );
}
