// Issuing a passport. A reissue must say so, so a double click or a stale page cannot revoke
// the passport a patient has just been given.
import { z } from "zod";

export const passportIssueSchema = z
  .object({
    reissue: z.boolean({ error: "invalid" }).optional(),
    // Print a fresh one-time portal activation code on the booklet (patients with no account).
    activationCode: z.boolean({ error: "invalid" }).optional(),
  })
  .strict();

