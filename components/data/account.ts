// The account: who is signed in (GET /api/me), signing in (next-auth's credentials provider), signing up,
// new confirmation links, password resets. Query keys, queries and mutations; components call these hooks.
import { useMutation, useQuery } from "@tanstack/react-query";
import { signIn } from "next-auth/react";
import { api, ApiError } from "./api";
import { paths } from "./paths";
import type { Me, PasswordResetAnswer, PasswordResetBody, ResendVerificationBody, ResetConfirmAnswer, ResetConfirmBody, SignInBody, SignUpAnswer, SignUpBody } from "@/lib/api-types/account";

export const accountKeys = {
  me: () => ["account", "me"] as const,
};

export function useMe() {
  return useQuery({ queryKey: accountKeys.me(), queryFn: () => api<Me>(paths.me()) });
}

/** Signs in through next-auth (no redirect); a refusal throws ApiError with next-auth's message or ours. */
async function signInWithPassword(body: SignInBody): Promise<void> {
  const res = await signIn("credentials", { ...body, redirect: false });
  if (!res || res.error) {
    const message = res?.error && res.error !== "CredentialsSignin" ? res.error : "That e-mail and password do not match an account.";
    throw new ApiError(res?.status ?? 401, "unauthenticated", message);
  }
}

export function useSignIn() {
  return useMutation({ mutationFn: signInWithPassword });
}

/**
 * Creates the account; with a matching invitation the address is confirmed at once and the new account is
 * signed in. Answers the studio joined (signed in) or null (a confirmation mail is on its way).
 */
export function useSignUp() {
  return useMutation({
    mutationFn: async (body: SignUpBody): Promise<{ studioId: string | null }> => {
      const out = await api<SignUpAnswer>(paths.signUp(), { body });
      if (out.verified && out.studioId) {
        const res = await signIn("credentials", { email: body.email, password: body.password, redirect: false });
        if (!res?.error) return { studioId: out.studioId };
      }
      return { studioId: null };
    },
  });
}

export function useResendVerification() {
  return useMutation({ mutationFn: (body: ResendVerificationBody) => api(paths.verification(), { body }) });
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: (body: PasswordResetBody) => api<PasswordResetAnswer>(paths.passwordReset(), { body }) });
}

export function useResetPassword() {
  return useMutation({ mutationFn: (body: ResetConfirmBody) => api<ResetConfirmAnswer>(paths.passwordResetConfirm(), { body }) });
}
