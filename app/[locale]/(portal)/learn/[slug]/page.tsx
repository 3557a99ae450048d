import { getTranslations } from "next-intl/server";
import { notFound } from "next/navigation";
import { WithTerms } from "@/components/glossary/glossary-term";
import { glossaryEntries } from "@/components/glossary/with-terms";
import { Picture, type PictureKey } from "@/components/pictures/pictures";
import { SafetyNotice } from "@/components/portal/call-buttons";
import { getHelpContacts } from "@/db/queries/contacts";
import { requirePageRole } from "@/lib/auth/permissions";
import { Link } from "@/lib/i18n/navigation";
import { LEARN_PAGES, learnPage, type LearnSection } from "@/lib/shared/learn";
import { portalPatient } from "@/lib/portal";

/** The drawings each page shows, after its summary. */
const PAGE_PICTURES: Partial<Record<string, PictureKey[]>> = {
  living: ["bagBelowBladder", "legStrap"],
  bags: ["legBag", "nightBag"],
  valves: ["valve"],
  drinks: ["drinking"],
  normal: ["urineColours"],
  help: ["kinkedTube"],
};

export function generateStaticParams() {
  return LEARN_PAGES.map((p) => ({ slug: p.slug }));
}

export async function generateMetadata({ params }: { params: Promise<{ slug: string }> }) {
  const page = learnPage((await params).slug);
  const t = await getTranslations("Learn");
  return { title: page ? t(`pages.${page.key}.title`) : t("title") };
}

export default async function LearnPage({ params }: { params: Promise<{ locale: string; slug: string }> }) {
  const { locale, slug } = await params;
  const viewer = await requirePageRole(locale, "patient", "carer");
  const page = learnPage(slug);
  if (!page) notFound();
  const t = await getTranslations("Learn");
  const sections = t.raw(`pages.${page.key}.sections`) as LearnSection[];
  const patient = await portalPatient(viewer);
  const contacts = await getHelpContacts({ patientId: patient?.id ?? null });
  const [tp, glossary] = await Promise.all([getTranslations("Pictures"), glossaryEntries()]);
  return (
    <article className="flex flex-col gap-5" data-testid="learn-page">
      <Link href="/learn" className="flex min-h-12 items-center self-start font-bold text-brand underline underline-offset-4">
        {t("back")}
      </Link>
      <h1 className="text-3xl font-bold">{t(`pages.${page.key}.title`)}</h1>
      <p className="text-xl">
        <WithTerms text={t(`pages.${page.key}.summary`)} glossary={glossary} />
      </p>
      {(PAGE_PICTURES[page.key] ?? []).length ? (
        <div className="grid gap-3 sm:grid-cols-2">
          {(PAGE_PICTURES[page.key] ?? []).map((name) => (
            <Picture key={name} name={name} alt={tp(name)} />
          ))}
        </div>
      ) : null}
      {sections.map((s) => (
        <section key={s.heading} className="flex flex-col gap-2">
          <h2 className="text-2xl font-bold">{s.heading}</h2>
          <ul className="flex list-disc flex-col gap-2 ps-6">
            {s.points.map((p) => (
              <li key={p}>
                <WithTerms text={p} glossary={glossary} />
              </li>
            ))}
          </ul>
        </section>
      ))}
      <SafetyNotice contacts={contacts} />
    </article>
  );
}
