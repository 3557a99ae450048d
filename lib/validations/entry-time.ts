// When a patient or carer made an entry (a check-in answered, a drink, a bag emptied). Phones
// queue entries offline and send them later with this time, so the server bounds it: not in the
// future (beyond a phone clock a few minutes fast) and not older than a week. Messages are codes.
import { z } from "zod";

export const ENTRY_PAST_DAYS = 7;
export const ENTRY_FUTURE_TOLERANCE_MS = 5 * 60_000;

export const entryTimeSchema = z.iso
  .datetime({ offset: true, error: "date_time" })
  .refine((s) => Date.parse(s) <= Date.now() + ENTRY_FUTURE_TOLERANCE_MS, { error: "in_future" })
  .refine((s) => Date.parse(s) >= Date.now() - ENTRY_PAST_DAYS * 86_400_000, { error: "too_old" });
