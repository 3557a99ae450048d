import { z } from "zod";

// Reading comfort, per person: a text size step and the contrast (components/account/reading-comfort).
/** Text size steps: the page's own size, then larger; the last is twice the size. */
export const TEXT_SIZES = [100, 125, 150, 200] as const;
export const CONTRASTS = ["standard", "high"] as const;

export const readingSchema = z
  .object({
    textSize: z.number({ error: "invalid" }).int({ error: "invalid" }).min(0, { error: "invalid" }).max(TEXT_SIZES.length - 1, { error: "invalid" }),
    contrast: z.enum(CONTRASTS, { error: "invalid" }),
  })
  .strict();
export type ReadingComfort = z.infer<typeof readingSchema>;
export const DEFAULT_READING: ReadingComfort = { textSize: 0, contrast: "standard" };
