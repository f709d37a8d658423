// Links between audits, usable by server pages and client components alike: the comparison address, the
// previous audit of the same layout, "Compare with the previous audit", and the kit last audited per layout.
import Link from "next/link";

/** The address of the comparison of two audits of one layout, the older one first. */
export function compareHref(studioId: string, before: string, after: string): string {
  return `/s/${studioId}/audits/compare?before=${before}&after=${after}`;
}

type Dated = { id: string; createdAt: string };
const older = (a: Dated, b: Dated) => a.createdAt < b.createdAt || (a.createdAt === b.createdAt && a.id < b.id);

/** The audit of the same layout run just before `audit` (among `sameLayout`), or null. */
export function previousAudit<T extends Dated>(audit: Dated, sameLayout: readonly T[]): T | null {
  let best: T | null = null;
  for (const x of sameLayout) if (x.id !== audit.id && older(x, audit) && (!best || older(best, x))) best = x;
  return best;
}

/** True when `a` was run before `b`. */
export const ranBefore = older;

/** The kit last audited with each layout, from audits listed newest first. */
export function lastKitByLayout(audits: ReadonlyArray<{ layoutId: string; kitId: string | null }>): Record<string, string> {
  const m: Record<string, string> = {};
  for (const a of audits) if (a.kitId && !(a.layoutId in m)) m[a.layoutId] = a.kitId;
  return m;
}

/** "Compare with the previous audit" (of the same layout), or a word that there is none yet. */
export function ComparePrevious({ studioId, auditId, previousId }: { studioId: string; auditId: string; previousId: string | null }) {
  if (!previousId) return <span className="text-sm text-muted" data-testid="compare-previous-none">The first audit of this layout: nothing to compare with yet.</span>;
  return <Link className="btn-quiet" href={compareHref(studioId, previousId, auditId)} data-testid="compare-previous">Compare with the previous audit</Link>;
}
