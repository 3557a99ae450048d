import { getTranslations } from "next-intl/server";
import { glossaryEntries } from "@/components/glossary/with-terms";
import { requirePageRole } from "@/lib/auth/permissions";
import { Link } from "@/lib/i18n/navigation";

export async function generateMetadata() {
  const t = await getTranslations("Glossary");
  return { title: t("title") };
}

/** Plain words: every glossary term and its meaning, in the page's language. */
export default async function GlossaryPage({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  await requirePageRole(locale, "patient", "carer");
  const [t, tl, glossary] = await Promise.all([getTranslations("Glossary"), getTranslations("Learn"), glossaryEntries()]);
  return (
    <article className="flex flex-col gap-5" data-testid="glossary-page">
      <Link href="/learn" className="flex min-h-12 items-center self-start font-bold text-brand underline underline-offset-4">
        {tl("back")}
      </Link>
      <h1 className="text-3xl font-bold">{t("title")}</h1>
      <p>{t("intro")}</p>
      <dl className="flex flex-col gap-4">
        {glossary.entries.map((e) => (
          <div key={e.key} className="rounded-card border border-stone-faint bg-paper-raised p-4" id={`term-${e.key}`}>
            <dt className="text-xl font-bold text-brand">{e.term}</dt>
            <dd>{e.meaning}</dd>
          </div>
        ))}
      </dl>
    </article>
  );
}
