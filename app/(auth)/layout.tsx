import Link from "next/link";
import { Wordmark } from "@/components/logo";
import { ThemeSwitch } from "@/components/ui/theme";

export default function AuthLayout({ children }: { children: React.ReactNode }) {
  return (
    <main className="mx-auto flex min-h-screen max-w-md flex-col justify-center gap-6 px-4 py-10">
      <div className="flex items-center justify-between gap-3">
        <Link href="/" className="no-underline hover:no-underline"><Wordmark /></Link>
        <ThemeSwitch />
      </div>
      <div className="card">{children}</div>
    </main>
  );
}
