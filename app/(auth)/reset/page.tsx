import type { Metadata } from "next";
import Link from "next/link";
import { ResetForm } from "@/components/auth-forms";

export const metadata: Metadata = { title: "Choose a new password" };

export default async function ResetPage({ searchParams }: { searchParams: Promise<{ token?: string }> }) {
  const { token } = await searchParams;
  if (!token) return <p className="text-sm">This reset link is incomplete. <Link href="/forgot">Ask for a new one.</Link></p>;
  return <ResetForm token={token} />;
}
