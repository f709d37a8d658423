import type { Metadata } from "next";
import { SignInForm } from "@/components/auth-forms";

export const metadata: Metadata = { title: "Sign in" };

const NOTICES: Record<string, string> = {
  verified: "Your address is confirmed. Sign in to continue.",
  "password-reset": "Your password was changed. Sign in with the new one.",
};

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ next?: string; notice?: string }> }) {
  const { next, notice } = await searchParams;
  return <SignInForm next={next} notice={notice ? NOTICES[notice] : undefined} />;
}
