import Link from "next/link";
import { redirect } from "next/navigation";
import { Wordmark } from "@/components/logo";
import { currentUser } from "@/lib/server/session";

export const dynamic = "force-dynamic";

export default async function Home() {
  if (await currentUser()) redirect("/studios");
  return (
    <main className="mx-auto flex min-h-screen max-w-3xl flex-col justify-center gap-8 px-6 py-16">
      <Wordmark />
      <h1 className="text-4xl font-semibold leading-tight">Know what your drum samples really cover.</h1>
      <p className="max-w-2xl text-lg text-muted">
        Upload WAV one-shots, and Kitwright measures each one, sorts it into instrument, articulation, velocity layer and
        round robin, flags what is broken, and tells you which pads of your controller will play what, and which will stay silent.
      </p>
      <div className="flex gap-3">
        <Link href="/sign-in" className="btn-primary">Sign in</Link>
        <Link href="/sign-up" className="btn-quiet">Create an account</Link>
      </div>
    </main>
  );
}
