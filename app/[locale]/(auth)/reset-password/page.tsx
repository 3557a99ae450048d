import type { Metadata } from "next";
import { getTranslations, setRequestLocale } from "next-intl/server";
import { ResetPasswordForm } from "@/components/auth/reset-password-form";
import { Card } from "@/components/ui/card";
import { Link } from "@/lib/i18n/navigation";

export async function generateMetadata(): Promise<Metadata> {
  const t = await getTranslations("PasswordReset");
  return { title: t("resetTitle"), referrer: "no-referrer", robots: { index: false } };
}

/** better-auth sends the reset link here with ?token=… (or ?error=INVALID_TOKEN). */
export default async function ResetPasswordPage({
  params,
  searchParams,
}: {
  params: Promise<{ locale: string }>;
  searchParams: Promise<{ token?: string; error?: string }>;
}) {
  const { locale } = await params;
  setRequestLocale(locale as "en");
  const { token, error } = await searchParams;
  const t = await getTranslations("PasswordReset");
  const valid = typeof token === "string" && token.length >= 16 && !error;
  return (
    <Card className="flex flex-col gap-5">
      <h1 className="text-3xl font-bold">{t("resetTitle")}</h1>
      {valid ? (
        <ResetPasswordForm token={token} />
      ) : (
        <>
          <p>{t("errors.link_invalid")}</p>
          <Link href="/forgot-password" className="font-bold text-brand underline underline-offset-4">
            {t("askAgain")}
          </Link>
        </>
      )}
    </Card>
  );
}
