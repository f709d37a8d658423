import Link from "next/link";

export default function NotFound() {
  return (
    <main className="mx-auto max-w-lg px-4 py-20 text-center">
      <h1>Not found</h1>
      <p className="mt-3 text-muted">There is nothing here, or it belongs to a studio you are not a member of.</p>
      <p className="mt-6"><Link href="/studios">Go to your studios</Link></p>
    </main>
  );
}
