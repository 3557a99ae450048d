import { z } from "zod";

export const visitAccessSchema = z.object({
  token: z.string().min(1).max(100),
  reason: z.string().trim().min(10).max(500),
});
