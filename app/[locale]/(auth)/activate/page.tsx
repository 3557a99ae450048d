import { getTranslations, setRequestLocale } from "next-intl/server";
import { ActivateForm } from "@/components/auth/activate-form";
import { Card } from "@/components/ui/card";
import { Link } from "@/lib/i18n/navigation";

export async function generateMetadata({ params }: { params: Promise<{ locale: "en" }> }) {
  const { locale } = await params;
  const t = await getTranslations({ locale, namespace: "Activate" });
  return { title: t("title"), referrer: "no-referrer" as const };
}

export default async function ActivatePage({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  setRequestLocale(locale as "en");
  const t = await getTranslations("Activate");
  return (
    <Card className="flex flex-col gap-5 text-body">
      <div>
        <h1 className="text-3xl font-bold">{t("title")}</h1>
        <p className="mt-1">{t("intro")}</p>
      </div>
      <ActivateForm />
      <Link href="/sign-in" className="flex min-h-12 items-center justify-center font-bold text-brand underline underline-offset-4">
        {t("haveAccount")}
      </Link>
    </Card>
  );
}
