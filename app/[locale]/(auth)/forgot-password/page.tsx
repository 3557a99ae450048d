import { getTranslations, setRequestLocale } from "next-intl/server";
import { ForgotPasswordForm } from "@/components/auth/forgot-password-form";
import { Card } from "@/components/ui/card";
import { Link } from "@/lib/i18n/navigation";

export async function generateMetadata() {
  const t = await getTranslations("PasswordReset");
  return { title: t("forgotTitle") };
}

export default async function ForgotPasswordPage({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  setRequestLocale(locale as "en");
  const t = await getTranslations("PasswordReset");
  return (
    <Card className="flex flex-col gap-5">
      <div>
        <h1 className="text-3xl font-bold">{t("forgotTitle")}</h1>
        <p className="mt-1 text-ink-soft">{t("forgotIntro")}</p>
      </div>
      <ForgotPasswordForm />
      <Link href="/sign-in" className="text-brand underline underline-offset-4">
        {t("backToSignIn")}
      </Link>
    </Card>
  );
}
