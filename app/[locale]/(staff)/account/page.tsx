import { getTranslations } from "next-intl/server";
import { ChangePasswordForm } from "@/components/account/change-password-form";
import { TwoFactorPanel } from "@/components/account/two-factor-panel";
import { Card } from "@/components/ui/card";
import { requirePageRole } from "@/lib/auth/permissions";
import { Link } from "@/lib/i18n/navigation";

export async function generateMetadata() {
  const t = await getTranslations("Account");
  return { title: t("title") };
}

export default async function AccountPage({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  const viewer = await requirePageRole(locale, "admin", "clinician");
  const t = await getTranslations("Account");
  return (
    <div className="flex flex-col gap-6">
      <div>
        <h1 className="text-3xl font-bold">{t("title")}</h1>
        <p className="text-ink-soft">{t("signedInAs", { name: viewer.name, email: viewer.email })}</p>
      </div>
      <Card className="flex flex-col gap-3">
        <h2 className="text-xl font-bold">{t("sessionsHeading")}</h2>
        <p className="text-ink-soft">{t("sessionsIntro")}</p>
        <Link href="/account/sessions" className="font-bold text-brand underline underline-offset-4">
          {t("sessionsLink")}
        </Link>
      </Card>
      <Card className="flex flex-col gap-3">
        <h2 className="text-xl font-bold">{t("twoFactorHeading")}</h2>
        <TwoFactorPanel enabled={viewer.secondFactor?.enabled ?? false} required={viewer.secondFactor?.required ?? false} />
      </Card>
      <Card className="flex flex-col gap-3">
        <h2 className="text-xl font-bold">{t("passwordHeading")}</h2>
        <p className="text-ink-soft">{t("passwordIntro")}</p>
        <ChangePasswordForm />
      </Card>
    </div>
  );
}
