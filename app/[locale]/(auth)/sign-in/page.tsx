import { getTranslations, setRequestLocale } from "next-intl/server";
import { redirect } from "next/navigation";
import { SignInForm } from "@/components/auth/sign-in-form";
import { Card } from "@/components/ui/card";
import { getViewer, homePathFor } from "@/lib/auth/session";
import { Link } from "@/lib/i18n/navigation";

export async function generateMetadata({ params }: { params: Promise<{ locale: "en" }> }) {
  const { locale } = await params;
  const t = await getTranslations({ locale, namespace: "SignIn" });
  return { title: t("title") };
}

export default async function SignInPage({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  setRequestLocale(locale as "en");
  const viewer = await getViewer();
  if (viewer) redirect(`/${locale}${homePathFor(viewer.role)}`);
  const t = await getTranslations("SignIn");
  const reset = await getTranslations("PasswordReset");
  return (
    <Card className="flex flex-col gap-5">
      <div>
        <h1 className="text-3xl font-bold">{t("title")}</h1>
        <p className="mt-1 text-ink-soft">{t("intro")}</p>
      </div>
      <SignInForm />
      <Link href="/forgot-password" className="text-brand underline underline-offset-4">
        {reset("forgotLink")}
      </Link>
    </Card>
  );
}
