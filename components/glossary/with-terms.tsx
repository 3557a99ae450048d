import { getTranslations } from "next-intl/server";
import { GLOSSARY_KEYS, findTerms, type GlossaryEntry } from "@/lib/shared/glossary";
import { GlossaryTerm } from "./glossary-term";

/** The glossary of the request's language, for WithTerms. */
export async function glossaryEntries(): Promise<{ entries: GlossaryEntry[]; close: string }> {
  const t = await getTranslations("Glossary");
  const entries = GLOSSARY_KEYS.map((key) => ({ key, term: t(`terms.${key}.term`), meaning: t(`terms.${key}.meaning`), find: t(`terms.${key}.find`) }));
  return { entries, close: t("close") };
}

/** Text with its glossary words made tappable. */
export function WithTerms({ text, glossary }: { text: string; glossary: { entries: GlossaryEntry[]; close: string } }) {
  return (
    <>
      {findTerms(text, glossary.entries).map((s, i) => {
        const entry = s.key ? glossary.entries.find((e) => e.key === s.key) : undefined;
        return entry ? (
          <GlossaryTerm key={i} term={entry.term} meaning={entry.meaning} closeLabel={glossary.close}>
            {s.text}
          </GlossaryTerm>
        ) : (
          <span key={i}>{s.text}</span>
        );
      })}
    </>
  );
}
