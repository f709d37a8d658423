"use client";

export default function ErrorPage({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <main className="mx-auto max-w-lg px-4 py-20 text-center">
      <h1>Something went wrong</h1>
      <p className="mt-3 text-muted">The page could not be shown. If the database or queue is restarting, trying again in a moment usually works.</p>
      {error.digest && <p className="num mt-2 text-xs text-muted">reference {error.digest}</p>}
      <button className="btn-primary mt-6" onClick={reset}>Try again</button>
    </main>
  );
}
