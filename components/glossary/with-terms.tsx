import { getTranslations } from "next-intl/server";
import { GLOSSARY_KEYS } from "@/lib/shared/glossary";
import type { Glossary } from "./glossary-term";

/** The glossary of the request's language, for WithTerms (components/glossary/glossary-term). */
export async function glossaryEntries(): Promise<Glossary> {
  const t = await getTranslations("Glossary");
  const entries = GLOSSARY_KEYS.map((key) => ({ key, term: t(`terms.${key}.term`), meaning: t(`terms.${key}.meaning`), find: t(`terms.${key}.find`) }));
  return { entries, close: t("close") };
}
