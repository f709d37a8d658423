import "server-only";
// Work done after the answer: mail whose sending must not show in how long a request took (whether an account
// exists must not be readable from the time an answer takes). A failure is logged, never thrown at the caller.
const pending = new Set<Promise<void>>();

export function later(what: string, work: () => Promise<void>): void {
  const p: Promise<void> = new Promise<void>((resolve) => setImmediate(resolve))
    .then(work)
    .catch((e) => console.error(`[later] ${what} failed:`, e))
    .finally(() => pending.delete(p));
  pending.add(p);
}

/** Resolves once the work started so far is done (tests, shutdown). */
export async function settled(): Promise<void> {
  while (pending.size) await Promise.all([...pending]);
}
