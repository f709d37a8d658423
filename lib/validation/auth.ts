// Shared zod schemas of the sign-up, sign-in and password forms: used by the forms and the handlers.
import { z } from "zod";

export const email = z.string().trim().toLowerCase().max(254).email("Enter a valid e-mail address.");
export const password = z
  .string()
  .min(10, "Use at least 10 characters.")
  .max(200, "Use at most 200 characters.");

export const signUpSchema = z.strictObject({
  name: z.string().trim().min(1, "Enter your name.").max(120),
  email,
  password,
});
export type SignUpInput = z.infer<typeof signUpSchema>;

export const signInSchema = z.strictObject({ email, password: z.string().min(1, "Enter your password.").max(200) });

export const emailOnlySchema = z.strictObject({ email });

export const tokenSchema = z.strictObject({ token: z.string().min(20).max(200) });

export const resetConfirmSchema = z.strictObject({ token: z.string().min(20).max(200), password });
