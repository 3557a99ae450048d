import { z } from "zod";

export const signInSchema = z.object({
  email: z.email().max(254),
  password: z.string().min(1).max(256),
});
export type SignInInput = z.infer<typeof signInSchema>;
