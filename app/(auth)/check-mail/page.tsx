import type { Metadata } from "next";
import Link from "next/link";

export const metadata: Metadata = { title: "Check your mail" };

export default async function CheckMailPage({ searchParams }: { searchParams: Promise<{ email?: string }> }) {
  const { email } = await searchParams;
  return (
    <div className="space-y-3">
      <h1>Check your mail</h1>
      <p className="text-sm">We sent a confirmation link to <strong>{email ?? "your address"}</strong>. Open it to finish creating your account; it works once and expires in 48 hours.</p>
      <p className="text-sm text-muted">Nothing arrived? Look in your spam folder, or <Link href="/sign-in">sign in</Link> to ask for a new link.</p>
    </div>
  );
}
