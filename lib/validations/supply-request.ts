// A supply request as the nurse sends it after review: the period, which items the patient
// uses, and the quantities (the server recomputes the suggested ones with lib/clinical).
// Messages are keys of Supplies.errors, translated by the form.
import { z } from "zod";
import { multiLine, singleLine } from "./text";
import { numberIn, toNumber } from "./number";

export const supplyItems = ["catheter", "leg-bag", "night-bag", "valve", "gel"] as const;
export const supplyPeriodChoices = [7, 14, 28, 56, 84] as const;
export const DEFAULT_SUPPLY_PERIOD = 28;

export const supplyRequestSchema = z
  .object({
    periodDays: z.preprocess(toNumber, numberIn({ min: 1, max: 366, unit: "days", whole: true, missing: "period" })),
    include: z.object({ legBag: z.boolean(), valve: z.boolean(), nightBag: z.boolean(), gel: z.boolean() }),
    items: z
      .array(
        z.object({
          item: z.enum(supplyItems),
          quantity: z.preprocess(toNumber, numberIn({ min: 0, max: 999, whole: true, missing: "quantity" })),
        }),
      )
      .min(1, "nothing")
      .max(supplyItems.length),
    note: multiLine(z.string().trim().max(1000, "note")).optional(),
  })
  .superRefine((v, ctx) => {
    const seen = new Set<string>();
    v.items.forEach((i, n) => {
      if (seen.has(i.item)) ctx.addIssue({ code: "custom", path: ["items", n, "item"], message: "duplicate" });
      seen.add(i.item);
    });
    if (v.items.length && v.items.every((i) => i.quantity === 0)) ctx.addIssue({ code: "custom", path: ["items"], message: "nothing" });
  });

export type SupplyRequestInput = z.infer<typeof supplyRequestSchema>;
