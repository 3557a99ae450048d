import { getTranslations } from "next-intl/server";
import { SignOutButton } from "@/components/auth/sign-out-button";
import { Card } from "@/components/ui/card";
import { Link } from "@/lib/i18n/navigation";

// Signing out is a POST from this page; a GET never changes state (ASVS 3.5.3).
export default async function SignOutPage() {
  const t = await getTranslations("SignOut");
  return (
    <Card className="flex flex-col gap-5">
      <h1 className="text-3xl font-bold">{t("title")}</h1>
      <p>{t("question")}</p>
      <SignOutButton />
      <Link href="/home" className="text-center text-brand underline underline-offset-4">
        {t("stay")}
      </Link>
    </Card>
  );
}
