import { getTranslations } from "next-intl/server";
import { BookIcon } from "@/components/portal/nav-icons";
import { requirePageRole } from "@/lib/auth/permissions";
import { Link } from "@/lib/i18n/navigation";
import { LEARN_PAGES } from "@/lib/shared/learn";

export async function generateMetadata() {
  const t = await getTranslations("Learn");
  return { title: t("title") };
}

export default async function LearnIndex({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  await requirePageRole(locale, "patient", "carer");
  const [t, tg] = await Promise.all([getTranslations("Learn"), getTranslations("Glossary")]);
  return (
    <div className="flex flex-col gap-5">
      <h1 className="text-3xl font-bold">{t("title")}</h1>
      <p>{t("intro")}</p>
      <ul className="flex flex-col gap-3">
        {LEARN_PAGES.map((p) => (
          <li key={p.slug}>
            <Link href={`/learn/${p.slug}`} className="flex min-h-16 items-center gap-4 rounded-lg border-2 border-brand bg-paper-raised px-4 py-3 hover:bg-brand-soft">
              <BookIcon className="h-7 w-7 shrink-0 text-brand" />
              <span className="flex flex-col">
                <span className="text-xl font-bold text-brand">{t(`pages.${p.key}.title`)}</span>
                <span className="text-ink">{t(`pages.${p.key}.summary`)}</span>
              </span>
            </Link>
          </li>
        ))}
        <li>
          <Link href="/learn/words" className="flex min-h-16 items-center gap-4 rounded-lg border-2 border-brand bg-paper-raised px-4 py-3 hover:bg-brand-soft" data-testid="glossary-link">
            <BookIcon className="h-7 w-7 shrink-0 text-brand" />
            <span className="flex flex-col">
              <span className="text-xl font-bold text-brand">{tg("title")}</span>
              <span className="text-ink">{tg("intro")}</span>
            </span>
          </Link>
        </li>
      </ul>
    </div>
  );
}
