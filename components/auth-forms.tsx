"use client";
// Sign-in, sign-up, forgotten-password and reset forms. Each validates with the shared zod schema first,
// then calls the API (or next-auth for sign-in) and shows the server's message when it refuses.
import { useState } from "react";
import { signIn } from "next-auth/react";
import { useRouter } from "next/navigation";
import Link from "next/link";
import { api, ApiError } from "./api";
import { Field, Message, fieldErrors } from "./form-bits";
import { emailOnlySchema, resetConfirmSchema, signInSchema, signUpSchema } from "@/lib/validation/auth";

function useSubmit() {
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [fields, setFields] = useState<Record<string, string>>({});
  return { busy, setBusy, error, setError, fields, setFields };
}

export function SignInForm({ next, notice }: { next?: string; notice?: string }) {
  const router = useRouter();
  const s = useSubmit();
  const [email, setEmail] = useState("");
  const [unverified, setUnverified] = useState(false);
  const [resent, setResent] = useState(false);
  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = new FormData(e.currentTarget);
    const parsed = signInSchema.safeParse({ email: form.get("email"), password: form.get("password") });
    if (!parsed.success) return s.setFields(fieldErrors(parsed.error.issues));
    s.setFields({});
    s.setBusy(true);
    s.setError(null);
    const res = await signIn("credentials", { ...parsed.data, redirect: false });
    s.setBusy(false);
    if (!res || res.error) {
      const msg = res?.error && res.error !== "CredentialsSignin" ? res.error : "That e-mail and password do not match an account.";
      setUnverified(/Confirm your e-mail/.test(msg));
      return s.setError(msg);
    }
    router.push(next && next.startsWith("/") && !next.startsWith("//") ? next : "/studios");
    router.refresh();
  }
  async function resend() {
    await api("/api/auth/verification", { body: { email } }).catch(() => undefined);
    setResent(true);
  }
  return (
    <form onSubmit={onSubmit} className="space-y-4" noValidate>
      <h1>Sign in</h1>
      {notice && <Message kind="ok">{notice}</Message>}
      <Field label="E-mail" name="email" type="email" autoComplete="email" required value={email} onChange={(e) => setEmail(e.target.value)} error={s.fields.email} />
      <Field label="Password" name="password" type="password" autoComplete="current-password" required error={s.fields.password} />
      {s.error && <Message kind="error">{s.error}</Message>}
      {unverified && (resent ? <Message kind="info">A new confirmation link is on its way.</Message> : <button type="button" className="btn-quiet" onClick={resend}>Send a new confirmation link</button>)}
      <button className="btn-primary w-full" disabled={s.busy}>{s.busy ? "Signing in…" : "Sign in"}</button>
      <p className="flex justify-between text-sm">
        <Link href="/forgot">Forgot your password?</Link>
        <Link href="/sign-up">Create an account</Link>
      </p>
    </form>
  );
}

export function SignUpForm({ invite, invitedEmail }: { invite?: string; invitedEmail?: string }) {
  const router = useRouter();
  const s = useSubmit();
  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = new FormData(e.currentTarget);
    const input = { name: form.get("name"), email: form.get("email"), password: form.get("password") };
    const parsed = signUpSchema.safeParse(input);
    if (!parsed.success) return s.setFields(fieldErrors(parsed.error.issues));
    s.setFields({});
    s.setBusy(true);
    s.setError(null);
    try {
      const out = await api<{ verified: boolean; studioId: string | null }>("/api/auth/signup", { body: { ...parsed.data, ...(invite ? { invite } : {}) } });
      if (out.verified && out.studioId) {
        const res = await signIn("credentials", { email: parsed.data.email, password: parsed.data.password, redirect: false });
        if (!res?.error) {
          router.push(`/s/${out.studioId}`);
          router.refresh();
          return;
        }
      }
      router.push(`/check-mail?email=${encodeURIComponent(parsed.data.email)}`);
    } catch (err) {
      s.setError(err instanceof ApiError ? err.message : "Could not create the account; try again.");
    } finally {
      s.setBusy(false);
    }
  }
  return (
    <form onSubmit={onSubmit} className="space-y-4" noValidate>
      <h1>Create an account</h1>
      <Field label="Your name" name="name" autoComplete="name" required error={s.fields.name} />
      <Field label="E-mail" name="email" type="email" autoComplete="email" required defaultValue={invitedEmail} error={s.fields.email} />
      <Field label="Password" name="password" type="password" autoComplete="new-password" required hint="At least 10 characters." error={s.fields.password} />
      {s.error && <Message kind="error">{s.error}</Message>}
      <button className="btn-primary w-full" disabled={s.busy}>{s.busy ? "Creating…" : "Create account"}</button>
      <p className="text-sm">Already have an account? <Link href={invite ? `/sign-in?next=/invite/${invite}` : "/sign-in"}>Sign in</Link></p>
    </form>
  );
}

export function ForgotForm() {
  const s = useSubmit();
  const [done, setDone] = useState<string | null>(null);
  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const parsed = emailOnlySchema.safeParse({ email: new FormData(e.currentTarget).get("email") });
    if (!parsed.success) return s.setFields(fieldErrors(parsed.error.issues));
    s.setFields({});
    s.setBusy(true);
    try {
      const out = await api<{ message: string }>("/api/auth/password-reset", { body: parsed.data });
      setDone(out.message);
    } catch (err) {
      s.setError(err instanceof ApiError ? err.message : "Could not send the link; try again.");
    } finally {
      s.setBusy(false);
    }
  }
  return (
    <form onSubmit={onSubmit} className="space-y-4" noValidate>
      <h1>Reset your password</h1>
      <p className="text-sm text-muted">We will mail you a link to choose a new password.</p>
      <Field label="E-mail" name="email" type="email" autoComplete="email" required error={s.fields.email} />
      {s.error && <Message kind="error">{s.error}</Message>}
      {done && <Message kind="ok">{done}</Message>}
      <button className="btn-primary w-full" disabled={s.busy || !!done}>Send reset link</button>
      <p className="text-sm"><Link href="/sign-in">Back to sign in</Link></p>
    </form>
  );
}

export function ResetForm({ token }: { token: string }) {
  const router = useRouter();
  const s = useSubmit();
  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const parsed = resetConfirmSchema.safeParse({ token, password: new FormData(e.currentTarget).get("password") });
    if (!parsed.success) return s.setFields(fieldErrors(parsed.error.issues));
    s.setFields({});
    s.setBusy(true);
    try {
      await api("/api/auth/password-reset/confirm", { body: parsed.data });
      router.push("/sign-in?notice=password-reset");
    } catch (err) {
      s.setError(err instanceof ApiError ? err.message : "Could not reset the password; try again.");
    } finally {
      s.setBusy(false);
    }
  }
  return (
    <form onSubmit={onSubmit} className="space-y-4" noValidate>
      <h1>Choose a new password</h1>
      <Field label="New password" name="password" type="password" autoComplete="new-password" required hint="At least 10 characters." error={s.fields.password} />
      {s.error && <Message kind="error">{s.error}</Message>}
      <button className="btn-primary w-full" disabled={s.busy}>Set password</button>
    </form>
  );
}
