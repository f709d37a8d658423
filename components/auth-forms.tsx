"use client";
// Sign-in, sign-up, forgotten-password and reset forms. Each validates with the shared zod schema first,
// then calls its account hook (components/data/account.ts) and shows the server's message when it refuses.
import { useState } from "react";
import { useRouter } from "next/navigation";
import Link from "next/link";
import { Field, FormError, Message, errorText, useFieldCheck } from "./form-bits";
import { useRequestPasswordReset, useResendVerification, useResetPassword, useSignIn, useSignUp } from "./data/account";
import { emailOnlySchema, resetConfirmSchema, signInSchema, signUpSchema } from "@/lib/validation/auth";

export function SignInForm({ next, notice }: { next?: string; notice?: string }) {
  const router = useRouter();
  const { fields, check } = useFieldCheck();
  const [email, setEmail] = useState("");
  const signIn = useSignIn();
  const resend = useResendVerification();
  const unverified = signIn.isError && /Confirm your e-mail/.test(errorText(signIn.error));
  function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = new FormData(e.currentTarget);
    const parsed = check(signInSchema, { email: form.get("email"), password: form.get("password") });
    if (!parsed) return;
    signIn.mutate(parsed, {
      onSuccess: () => {
        router.push(next && next.startsWith("/") && !next.startsWith("//") ? next : "/studios");
        router.refresh();
      },
    });
  }
  return (
    <form onSubmit={onSubmit} className="space-y-4" noValidate>
      <h1>Sign in</h1>
      {notice && <Message kind="ok">{notice}</Message>}
      <Field label="E-mail" name="email" type="email" autoComplete="email" required value={email} onChange={(e) => setEmail(e.target.value)} error={fields.email} />
      <Field label="Password" name="password" type="password" autoComplete="current-password" required error={fields.password} />
      <FormError error={signIn.error} />
      {/* whatever the answer, the same words: it never says whether the address has an account */}
      {unverified && (resend.isIdle ? <button type="button" className="btn-quiet" onClick={() => resend.mutate({ email })}>Send a new confirmation link</button> : <Message kind="info">A new confirmation link is on its way.</Message>)}
      <button className="btn-primary w-full" disabled={signIn.isPending}>{signIn.isPending ? "Signing in…" : "Sign in"}</button>
      <p className="flex justify-between text-sm">
        <Link href="/forgot">Forgot your password?</Link>
        <Link href="/sign-up">Create an account</Link>
      </p>
    </form>
  );
}

export function SignUpForm({ invite, invitedEmail }: { invite?: string; invitedEmail?: string }) {
  const router = useRouter();
  const { fields, check } = useFieldCheck();
  const signUp = useSignUp();
  function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = new FormData(e.currentTarget);
    const input = { name: form.get("name"), email: form.get("email"), password: form.get("password") };
    const parsed = check(signUpSchema, input);
    if (!parsed) return;
    signUp.mutate({ ...parsed, ...(invite ? { invite } : {}) }, {
      onSuccess: ({ studioId }) => {
        if (studioId) {
          router.push(`/s/${studioId}`);
          router.refresh();
        } else router.push(`/check-mail?email=${encodeURIComponent(parsed.email)}`);
      },
    });
  }
  return (
    <form onSubmit={onSubmit} className="space-y-4" noValidate>
      <h1>Create an account</h1>
      <Field label="Your name" name="name" autoComplete="name" required error={fields.name} />
      <Field label="E-mail" name="email" type="email" autoComplete="email" required defaultValue={invitedEmail} error={fields.email} />
      <Field label="Password" name="password" type="password" autoComplete="new-password" required hint="At least 10 characters." error={fields.password} />
      <FormError error={signUp.error} fallback="Could not create the account; try again." />
      <button className="btn-primary w-full" disabled={signUp.isPending}>{signUp.isPending ? "Creating…" : "Create account"}</button>
      <p className="text-sm">Already have an account? <Link href={invite ? `/sign-in?next=/invite/${invite}` : "/sign-in"}>Sign in</Link></p>
    </form>
  );
}

export function ForgotForm() {
  const { fields, check } = useFieldCheck();
  const request = useRequestPasswordReset();
  function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const parsed = check(emailOnlySchema, { email: new FormData(e.currentTarget).get("email") });
    if (!parsed) return;
    request.mutate(parsed);
  }
  return (
    <form onSubmit={onSubmit} className="space-y-4" noValidate>
      <h1>Reset your password</h1>
      <p className="text-sm text-muted">We will mail you a link to choose a new password.</p>
      <Field label="E-mail" name="email" type="email" autoComplete="email" required error={fields.email} />
      <FormError error={request.error} fallback="Could not send the link; try again." />
      {request.isSuccess && <Message kind="ok">{request.data.message}</Message>}
      <button className="btn-primary w-full" disabled={request.isPending || request.isSuccess}>Send reset link</button>
      <p className="text-sm"><Link href="/sign-in">Back to sign in</Link></p>
    </form>
  );
}

export function ResetForm({ token }: { token: string }) {
  const router = useRouter();
  const { fields, check } = useFieldCheck();
  const reset = useResetPassword();
  function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const parsed = check(resetConfirmSchema, { token, password: new FormData(e.currentTarget).get("password") });
    if (!parsed) return;
    reset.mutate(parsed, { onSuccess: () => router.push("/sign-in?notice=password-reset") });
  }
  return (
    <form onSubmit={onSubmit} className="space-y-4" noValidate>
      <h1>Choose a new password</h1>
      <Field label="New password" name="password" type="password" autoComplete="new-password" required hint="At least 10 characters." error={fields.password} />
      <FormError error={reset.error} fallback="Could not reset the password; try again." />
      <button className="btn-primary w-full" disabled={reset.isPending}>Set password</button>
    </form>
  );
}
