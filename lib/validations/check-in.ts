import { z } from "zod";
import { TEMPERATURE_RANGE } from "@/lib/shared/check-in-flow";
import { entryTimeSchema } from "./entry-time";

// Exactly triageCheckIn's answers (minus route, which the server takes from the record);
// unknown fields are refused (allow-list, ASVS 2.2.1).
export const checkInAnswersSchema = z.strictObject({
  draining: z.enum(["yes", "less", "none"]).optional(),
  pain: z.enum(["none", "mild", "severe"]).optional(),
  hoursWithoutUrine: z.number().min(0).max(720).optional(),
  temperatureC: z.number().min(TEMPERATURE_RANGE.min).max(TEMPERATURE_RANGE.max).optional(),
  shivering: z.boolean().optional(),
  newConfusion: z.boolean().optional(),
  feelsVeryUnwell: z.boolean().optional(),
  breathless: z.boolean().optional(),
  blood: z.enum(["none", "pink", "red", "clots"]).optional(),
  leaking: z.boolean().optional(),
  catheterOut: z.boolean().optional(),
  cloudyOrSmelly: z.boolean().optional(),
  sediment: z.boolean().optional(),
  constipated: z.boolean().optional(),
  suprapubicSiteRed: z.boolean().optional(),
  passingUrine: z.enum(["yes", "little", "none", "not-sure"]).optional(),
});

export const checkInSchema = z.strictObject({
  patientId: z.uuid(),
  answers: checkInAnswersSchema,
  // Made on the phone when the check-in starts; the same key twice is one check-in.
  idempotencyKey: z.uuid(),
  // When the person answered (it may reach us later, from an offline phone); bounded.
  answeredAt: entryTimeSchema.optional(),
});
