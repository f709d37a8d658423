// Kitwright's own outcome marks, readable without colour: a filled disc (direct), a half-filled disc
// (stand-in) and a hollow disc with a cross (silent). Always shown beside the outcome word.
import type { Outcome } from "@/lib/audit/types";

export const OUTCOME_TEXT: Record<Outcome, string> = { direct: "as recorded", "stand-in": "stand-in", silent: "silent" };

export function OutcomeIcon({ outcome, size = 14 }: { outcome: Outcome; size?: number }) {
  const r = 6;
  return (
    <svg width={size} height={size} viewBox="0 0 16 16" aria-hidden className={outcome === "direct" ? "text-good" : outcome === "stand-in" ? "text-warn" : "text-bad"} data-icon={outcome}>
      {outcome === "direct" && <circle cx="8" cy="8" r={r} fill="currentColor" stroke="currentColor" strokeWidth="1.5" />}
      {outcome === "stand-in" && (
        <>
          <circle cx="8" cy="8" r={r} fill="none" stroke="currentColor" strokeWidth="1.5" />
          <path d={`M8 ${8 - r} A ${r} ${r} 0 0 0 8 ${8 + r} Z`} fill="currentColor" />
        </>
      )}
      {outcome === "silent" && (
        <>
          <circle cx="8" cy="8" r={r} fill="none" stroke="currentColor" strokeWidth="1.5" />
          <path d="M4.5 4.5 L11.5 11.5 M11.5 4.5 L4.5 11.5" stroke="currentColor" strokeWidth="1.5" />
        </>
      )}
    </svg>
  );
}

export function OutcomeBadge({ outcome }: { outcome: Outcome }) {
  const cls = outcome === "direct" ? "border-good/40 bg-good-soft text-good" : outcome === "stand-in" ? "border-warn/40 bg-warn-soft text-warn" : "border-bad/40 bg-bad-soft text-bad";
  return (
    <span className={`tag gap-1 ${cls}`} data-outcome={outcome}>
      <OutcomeIcon outcome={outcome} size={12} />
      {OUTCOME_TEXT[outcome]}
    </span>
  );
}
