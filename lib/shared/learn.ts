// The guidance library: page slugs and their message keys (content lives in messages/*.json,
// namespace "Learn", so every locale has every page and the catalogue test guards it).
export const LEARN_PAGES = [
  { slug: "living-with-a-catheter", key: "living" },
  { slug: "leg-and-night-bags", key: "bags" },
  { slug: "valves", key: "valves" },
  { slug: "washing", key: "washing" },
  { slug: "drinks", key: "drinks" },
  { slug: "constipation", key: "constipation" },
  { slug: "sex-and-intimacy", key: "intimacy" },
  { slug: "travel", key: "travel" },
  { slug: "what-is-normal", key: "normal" },
  { slug: "when-to-get-help", key: "help" },
] as const;

export type LearnSection = { heading: string; points: string[] };

export function learnPage(slug: string) {
  return LEARN_PAGES.find((p) => p.slug === slug) ?? null;
}
