import { z } from "zod";

export const signInSchema = z.object({
  email: z.string().trim().min(1, "Enter your e-mail").email("Enter a valid e-mail"),
  password: z.string().min(1, "Enter your password"),
});
export type SignInValues = z.infer<typeof signInSchema>;
