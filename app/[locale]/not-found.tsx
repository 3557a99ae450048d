import { getTranslations } from "next-intl/server";
import { Link } from "@/lib/i18n/navigation";

export default async function NotFound() {
  const t = await getTranslations("Errors");
  return (
    <main className="mx-auto flex min-h-dvh max-w-md flex-col justify-center gap-4 p-6">
      <h1 className="text-3xl font-bold">{t("notFoundTitle")}</h1>
      <p>{t("notFoundBody")}</p>
      <Link href="/home" className="font-bold text-brand underline underline-offset-4">
        {t("goHome")}
      </Link>
    </main>
  );
}
