import Link from "next/link";
import { Wordmark } from "@/components/logo";

export default function AuthLayout({ children }: { children: React.ReactNode }) {
  return (
    <main className="mx-auto flex min-h-screen max-w-md flex-col justify-center gap-6 px-4 py-10">
      <Link href="/" className="no-underline hover:no-underline"><Wordmark /></Link>
      <div className="card">{children}</div>
    </main>
  );
}
