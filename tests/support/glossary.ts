// One term per concept in each language: the word Caddis uses, and the other spellings or words
// for the same thing that must not appear beside it. Kept short: the terms a nurse, a patient or
// a translator would be confused by if they changed from screen to screen. Add a term here when a
// translation review settles it. Matching is on whole words (prefixes like the Arabic article
// "ال" and conjunctions are allowed in front).
export type GlossaryTerm = { concept: string; use: string; notAlso: string[] };

export const glossary: Record<string, GlossaryTerm[]> = {
  en: [
    { concept: "catheter", use: "catheter", notAlso: ["cathether", "cath."] },
    { concept: "lidocaine", use: "lidocaine", notAlso: ["lignocaine"] },
    { concept: "chlorhexidine", use: "chlorhexidine", notAlso: ["chlorhexidene"] },
  ],
  es: [
    { concept: "catheter", use: "sonda", notAlso: ["catéter"] },
    { concept: "lidocaine", use: "lidocaína", notAlso: ["lignocaína", "xilocaína"] },
  ],
  pl: [
    { concept: "catheter", use: "cewnik", notAlso: ["kateter"] },
    { concept: "lidocaine", use: "lidokain", notAlso: ["lignokain"] },
    { concept: "sterile water", use: "jałow", notAlso: ["sterylnej wody", "wody sterylnej", "sterylna woda"] },
  ],
  ro: [
    { concept: "catheter", use: "sond", notAlso: ["cateterul", "catetere", "cateter "] },
    { concept: "lidocaine", use: "lidocain", notAlso: ["xilin"] },
  ],
  ar: [
    // قثطار and قسطرة both mean the catheter; Caddis says قسطرة (plural قساطر).
    { concept: "catheter", use: "قسطرة", notAlso: ["قثطار", "قثاطير", "قثطرة"] },
    { concept: "lidocaine", use: "ليدوكائين", notAlso: ["ليدوكايين", "ليدوكاين", "ليدوكين"] },
    { concept: "gel", use: "جل", notAlso: ["هلام "] },
  ],
  ur: [
    { concept: "catheter", use: "کیتھیٹر", notAlso: ["کیتھٹر", "کیٹھیٹر"] },
    { concept: "lidocaine", use: "لیڈوکین", notAlso: ["لائیڈوکین", "لیڈوکائن"] },
  ],
};
