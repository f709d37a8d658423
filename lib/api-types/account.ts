// Requests and answers of the account routes: /api/auth/signup, /api/auth/verification,
// /api/auth/password-reset(/confirm) and /api/me. Types only, shared by lib/server and components/data.
import type { z } from "zod";
import type { emailOnlySchema, resetConfirmSchema, signInSchema, signUpSchema } from "@/lib/validation/auth";
import type { StudioSummary } from "./studios";

/** The signed-in person as every request reads it (lib/server/auth/sessions.ts). */
export interface SessionUser {
  id: string;
  email: string;
  name: string;
}

/** GET /api/me */
export interface Me {
  user: SessionUser;
  studios: StudioSummary[];
}

export type SignInBody = z.input<typeof signInSchema>;
/** POST /api/auth/signup (an invitation token joins its studio at once). */
export type SignUpBody = z.input<typeof signUpSchema> & { invite?: string };
export interface SignUpAnswer {
  verified: boolean;
  studioId: string | null;
}
/** POST /api/auth/verification with { email }: ask for a new confirmation link (202). */
export type ResendVerificationBody = z.input<typeof emailOnlySchema>;
/** POST /api/auth/password-reset (202, whether or not the address has an account). */
export type PasswordResetBody = z.input<typeof emailOnlySchema>;
export interface PasswordResetAnswer {
  message: string;
}
/** POST /api/auth/password-reset/confirm */
export type ResetConfirmBody = z.input<typeof resetConfirmSchema>;
export interface ResetConfirmAnswer {
  reset: true;
}
