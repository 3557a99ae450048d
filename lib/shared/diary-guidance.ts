import type { SourceId } from "@/lib/clinical";

/**
 * Drinking advice on the diary page: about 1.5-2 litres a day unless the care team has set a
 * fluid limit, in which case the limit is shown instead and no "drink more" advice is given.
 * Advice text only; it computes nothing. (Candidate for lib/clinical if a rule ever uses it.)
 */
export const DRINK_GUIDE = { minMl: 1500, maxMl: 2000, source: "regional-fluids" satisfies SourceId } as const;

/** The low-output check looks back over a whole day, so a bag emptied late does not alarm. */
export const OUTPUT_WINDOW_HOURS = 24;
