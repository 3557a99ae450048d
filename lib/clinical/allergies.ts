// Allergies that matter for a catheter and its gel, each answered yes, no or not asked. "Not
// asked" is not "no": the device checks warn ("not recorded: ask first") and every record,
// card, booklet and letter says "not recorded" for it.
export const ALLERGENS = ["latex", "chlorhexidine", "lidocaine"] as const;
export type Allergen = (typeof ALLERGENS)[number];

export const ALLERGY_ANSWERS = ["yes", "no", "not-asked"] as const;
export type AllergyAnswer = (typeof ALLERGY_ANSWERS)[number];

export type AllergyAnswers = Record<Allergen, AllergyAnswer>;

/** For checkDevice: true (allergic), false (asked, not allergic) or undefined (not known). */
export function allergyKnown(answer: AllergyAnswer): boolean | undefined {
  return answer === "yes" ? true : answer === "no" ? false : undefined;
}

/** Which allergens the patient has, and which nobody has asked about yet (in ALLERGENS order). */
export function allergySummary(a: AllergyAnswers): { present: Allergen[]; notRecorded: Allergen[] } {
  return {
    present: ALLERGENS.filter((k) => a[k] === "yes"),
    notRecorded: ALLERGENS.filter((k) => a[k] !== "yes" && a[k] !== "no"),
  };
}
