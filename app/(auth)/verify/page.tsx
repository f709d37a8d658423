// The link in the confirmation mail lands here; the single-use token is consumed on the server.
import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { verifyEmail } from "@/lib/server/auth/accounts";
import { AppError } from "@/lib/server/errors";

export const metadata: Metadata = { title: "Confirm your address" };
export const dynamic = "force-dynamic";

export default async function VerifyPage({ searchParams }: { searchParams: Promise<{ token?: string }> }) {
  const { token } = await searchParams;
  let problem = "This confirmation link is incomplete.";
  if (token) {
    try {
      await verifyEmail(token);
      problem = "";
    } catch (e) {
      problem = e instanceof AppError ? e.message : "Could not confirm the address right now; try the link again shortly.";
    }
  }
  if (!problem) redirect("/sign-in?notice=verified");
  return (
    <div className="space-y-3">
      <h1>Confirm your address</h1>
      <p role="alert" className="text-sm text-bad">{problem}</p>
      <p className="text-sm"><Link href="/sign-in">Sign in</Link> to ask for a new link.</p>
    </div>
  );
}
