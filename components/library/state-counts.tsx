// Counts per sample state, in words and symbols (never colour alone).
import type { StateCounts } from "@/lib/api-types/libraries";

export const STATE_LOOK = {
  queued: { icon: "◷", word: "queued", cls: "border-line bg-paper text-ink" },
  measuring: { icon: "◔", word: "measuring", cls: "border-brand/30 bg-brand-soft text-brand" },
  measured: { icon: "◑", word: "measured", cls: "border-brand/30 bg-paper text-ink" },
  catalogued: { icon: "✓", word: "catalogued", cls: "border-good/30 bg-good-soft text-good" },
  rejected: { icon: "✕", word: "rejected", cls: "border-bad/30 bg-bad-soft text-bad" },
} as const;

export function StateTag({ state }: { state: keyof typeof STATE_LOOK }) {
  const s = STATE_LOOK[state];
  return <span className={`tag ${s.cls}`}><span aria-hidden>{s.icon}</span>&nbsp;{s.word}</span>;
}

export function StateCountsLine({ counts }: { counts: StateCounts }) {
  return (
    <p className="flex flex-wrap items-center gap-2 text-sm" data-testid="state-counts">
      <span><span className="num">{counts.total}</span> samples:</span>
      {(["catalogued", "measured", "queued", "measuring", "rejected"] as const).map((k) => (
        <span key={k} className={`tag ${STATE_LOOK[k].cls}`} data-state={k}>
          <span aria-hidden>{STATE_LOOK[k].icon}</span>&nbsp;<span className="num">{counts[k]}</span>&nbsp;{STATE_LOOK[k].word}
        </span>
      ))}
    </p>
  );
}
