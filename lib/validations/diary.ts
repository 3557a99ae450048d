import { z } from "zod";
import { MAX_ENTRY_ML } from "@/lib/clinical";
import { entryTimeSchema } from "./entry-time";
import { numberIn, requiredNumber } from "./number";

export const DIARY_RANGE_MAX_DAYS = 35;
export const DIARY_DELETE_HOURS = 24;

/** Common cups and bag emptyings for the quick-add buttons (ml). */
export const DRINK_SIZES = [150, 200, 250, 330, 500] as const;
export const BAG_SIZES = [250, 350, 500, 750] as const;

export const diaryEntrySchema = z.strictObject({
  patientId: z.uuid(),
  kind: z.enum(["in", "out"]),
  // A single drink or bag above MAX_ENTRY_ML is a typing error (lib/clinical).
  volumeMl: numberIn({ min: 1, max: MAX_ENTRY_ML, unit: "ml", whole: true }),
  // When it was drunk or emptied (an offline phone sends it later); bounded. Default: now.
  at: entryTimeSchema.optional(),
  // Made on the phone: the same key again is the same entry (a resend from its outbox).
  clientKey: z.uuid().optional(),
});
export type DiaryEntryInput = z.infer<typeof diaryEntrySchema>;

/** The form on the phone: a custom amount typed in ml. */
export const customVolumeSchema = z.object({
  // Plain decimals only: "1e3" or "0x10" is not 1000 or 16 ml.
  volumeMl: requiredNumber({ min: 1, max: MAX_ENTRY_ML, unit: "ml", whole: true }),
});

export const diaryRangeSchema = z
  .object({
    patientId: z.uuid(),
    from: z.iso.datetime({ offset: true }),
    to: z.iso.datetime({ offset: true }),
  })
  .refine((v) => Date.parse(v.from) < Date.parse(v.to), { path: ["to"], message: "must be after from" })
  .refine((v) => Date.parse(v.to) - Date.parse(v.from) <= DIARY_RANGE_MAX_DAYS * 86_400_000, {
    path: ["to"],
    message: `at most ${DIARY_RANGE_MAX_DAYS} days`,
  });

export const bagChangeSchema = z.strictObject({
  patientId: z.uuid(),
  kind: z.enum(["leg-bag", "valve"]),
});
