// The audit's score as it reads: NN/100, its sentence, the counts behind it, and "How is this computed?" (the
// formula of lib/audit/audit-score.ts in words and in MathML, with this audit's numbers). Then what needs the
// reader's attention first: the silent pads (those on empty slots grouped, told once), the stand-ins, the
// velocity gaps and the conflicts, in a drummer's words. Server components (no state).
import Link from "next/link";
import type { AuditResult, PlayFinding } from "@/lib/audit/types";
import { STAND_IN_FLOOR, STAND_IN_STEP } from "@/lib/audit/audit-score";
import { OutcomeIcon } from "./outcome-icon";
import { conflictTitle, gapsInWords, onEmptySlot, playDetail, playsInWords, silentReason } from "./words";

// MathML Core (drawn by the browser): score = round(100 × Σ wᵢ·cᵢ·kᵢ / N)
const FORMULA_MATHML =
  '<math display="block" aria-label="score equals 100 times the sum over all items of w times c times k, divided by N, rounded">' +
  "<mrow><mi>score</mi><mo>=</mo><mi>round</mi><mo>(</mo><mn>100</mn><mo>×</mo><mfrac><mrow><mstyle displaystyle='true'><munderover><mo>∑</mo><mrow><mi>i</mi><mo>=</mo><mn>1</mn></mrow><mi>N</mi></munderover>" +
  "<msub><mi>w</mi><mi>i</mi></msub><mo>·</mo><msub><mi>c</mi><mi>i</mi></msub><mo>·</mo><msub><mi>k</mi><mi>i</mi></msub></mstyle></mrow><mi>N</mi></mfrac><mo>)</mo></mrow></math>";
const WEIGHT_MATHML =
  '<math aria-label="w for a stand-in d steps away equals the larger of one half and 1 minus d over 10"><mrow><msub><mi>w</mi><mi>i</mi></msub><mo>=</mo><mi>max</mi><mo>(</mo><mfrac><mn>1</mn><mn>2</mn></mfrac><mo>,</mo><mn>1</mn><mo>−</mo><mfrac><mi>d</mi><mn>10</mn></mfrac><mo>)</mo></mrow></math>';

export function ScoreCard({ result: r }: { result: AuditResult }) {
  const s = r.summary;
  const sc = r.score;
  const items = sc.items;
  const pedalItems = items - s.pads;
  return (
    <section className="card space-y-4" aria-labelledby="score-h" data-testid="score-card">
      <div className="flex flex-wrap items-end gap-x-6 gap-y-2">
        <div>
          <h2 id="score-h" className="text-sm font-medium text-muted">Score</h2>
          <p className="num text-5xl font-semibold leading-none" data-testid="audit-score">{sc.value}<span className="text-2xl font-normal text-muted">/100</span></p>
        </div>
        <p className="min-w-0 flex-1 basis-64 text-base" data-testid="score-sentence">{sc.sentence}</p>
      </div>
      <ul className="flex flex-wrap gap-x-5 gap-y-1 text-sm" data-testid="audit-summary">
        <li className="flex items-center gap-1"><OutcomeIcon outcome="direct" /> <span className="num">{s.direct}</span> as recorded</li>
        <li className="flex items-center gap-1"><OutcomeIcon outcome="stand-in" /> <span className="num">{s.standIn}</span> stand-in{s.standIn === 1 ? "" : "s"}</li>
        <li className="flex items-center gap-1"><OutcomeIcon outcome="silent" /> <span className="num">{s.silent}</span> silent</li>
        {s.pedalZones > 0 && <li>pedal positions recorded: <span className="num">{s.pedalZonesRecorded} of {s.pedalZones}</span></li>}
      </ul>
      <details className="group rounded-md border border-line bg-paper/60 px-3 py-2 text-sm" data-testid="score-how">
        <summary className="cursor-pointer font-medium text-brand">How is this computed?</summary>
        <div className="mt-2 space-y-2 leading-relaxed">
          <p>The score is the share of what this layout asks for that will really play, and how well: each of its{" "}
            {s.pads} pad{s.pads === 1 ? "" : "s"}{pedalItems > 0 ? ` and ${pedalItems} pedal position${pedalItems === 1 ? "" : "s"}` : ""} counts between 0 and 1.</p>
          <div className="overflow-x-auto text-base" dangerouslySetInnerHTML={{ __html: FORMULA_MATHML }} />
          <ul className="list-disc space-y-1 pl-5">
            <li><i>N</i> = {items}: every pad, pedal position and the pedal’s chick note, each counted once.</li>
            <li><i>w</i>, how it plays: 1 as recorded; through a stand-in <span dangerouslySetInnerHTML={{ __html: WEIGHT_MATHML }} />, where <i>d</i> is how many steps the stroke that plays is from the one asked for (a neighbouring stroke is one step and counts {1 - STAND_IN_STEP}; a rim shot played by the centre hit is two and counts {1 - 2 * STAND_IN_STEP}; never below {STAND_IN_FLOOR}); 0 when silent. A pad aimed at an empty slot is silent and counts 0, once.</li>
            <li><i>c</i>, velocities covered: the share of velocities 1–127 that one of its layers covers.</li>
            <li><i>k</i>, note clash: 0 when another pad sends the same note on the same channel for a different sound, since only one can answer; otherwise 1.</li>
          </ul>
          <p className="tabular-nums" data-testid="score-worked">For this audit: 100 × {sc.itemSum.toFixed(2)} ÷ {items} = {items ? ((100 * sc.itemSum) / items).toFixed(1) : "0"} → {sc.value}/100.</p>
          <p className="text-xs text-muted" title="Velocities are MIDI 1.0 note-on velocities (1–127). The closeness steps between strokes are common practice of drum libraries, not a published standard.">Conflicts that change nothing that plays (a pad outside the grid, a repeated pad id) are listed but do not change the score.</p>
        </div>
      </details>
    </section>
  );
}

function Item({ f, label, children }: { f: PlayFinding; label: string; children?: React.ReactNode }) {
  return (
    <li className="flex items-start gap-1.5">
      <span className="mt-0.5"><OutcomeIcon outcome={f.outcome} /></span>
      <span><span className="font-medium">{label}</span>{" "}
        <span className="cursor-help underline decoration-dotted decoration-muted/60 underline-offset-2" title={playDetail(f)}>{children ?? playsInWords(f).replace(/^Plays/, "plays").replace(/^Silent — /, "is silent: ")}</span></span>
    </li>
  );
}

/** What needs attention, first: silent pads (empty slots grouped), stand-ins, velocity gaps, conflicts. */
export function AuditAttention({ result: r, kitHref }: { result: AuditResult; kitHref?: string | null }) {
  const items: Array<{ f: PlayFinding; label: string }> = [
    ...r.pads.map((p) => ({ f: p as PlayFinding, label: p.label })),
    ...(r.pedal?.zones ?? []).map((z) => ({ f: z as PlayFinding, label: `Pedal ${z.low}–${z.high}` })),
    ...(r.pedal?.chick ? [{ f: r.pedal.chick as PlayFinding, label: r.pedal.chick.label }] : []),
  ];
  const otherSilent = items.filter((x) => x.f.outcome === "silent" && !onEmptySlot(x.f));
  const standIns = items.filter((x) => x.f.outcome === "stand-in");
  const gaps = items.filter((x) => x.f.outcome !== "silent" && x.f.velocityGaps.length);
  const onEmpty = r.emptySlots.reduce((n, g) => n + g.padIds.length, 0);
  const nothing = !onEmpty && !otherSilent.length && !standIns.length && !gaps.length && !r.conflicts.length && !r.pedal?.uncovered.length;
  return (
    <section className="card space-y-4" aria-labelledby="attention-h" data-testid="audit-attention">
      <h2 id="attention-h">{nothing ? "Nothing to fix" : "What to look at"}</h2>
      {nothing && <p className="flex items-center gap-1.5 text-sm"><OutcomeIcon outcome="direct" /> Every pad plays what you asked, as recorded, at every velocity 1–127.</p>}

      {onEmpty > 0 && (
        <div className="space-y-1.5" data-testid="empty-slots">
          <h3 className="flex items-center gap-1.5 font-semibold"><OutcomeIcon outcome="silent" /> {onEmpty} pad{onEmpty === 1 ? " aims at a slot" : "s aim at slots"} this kit leaves empty</h3>
          <ul className="flex flex-wrap gap-1.5 text-sm">
            {r.emptySlots.map((g) => (
              <li key={g.slotId} className="rounded border border-line bg-paper px-1.5 py-0.5" title={`Silent: ${g.labels.join(", ")}`} data-slot={g.slotId}>
                {g.slotName}{(g.labels.length > 1 || g.labels[0] !== g.slotName) && <span className="text-muted"> · {g.labels.join(", ")}</span>}
              </li>
            ))}
          </ul>
          <p className="text-xs text-muted">Each is silent and counted once. Fill the slots in the kit{kitHref ? <> (<Link href={kitHref} className="underline">edit the kit</Link>)</> : null}, or leave them: a small kit plays what it has.</p>
        </div>
      )}

      {otherSilent.length > 0 && (
        <div className="space-y-1" data-testid="other-silent">
          <h3 className="font-semibold">{onEmpty ? `${otherSilent.length} more silent` : `${otherSilent.length} silent`}</h3>
          <ul className="space-y-0.5 text-sm">{otherSilent.map((x, i) => <Item key={i} f={x.f} label={x.label}>is silent: {silentReason(x.f)}</Item>)}</ul>
        </div>
      )}

      {standIns.length > 0 && (
        <div className="space-y-1" data-testid="stand-ins">
          <h3 className="font-semibold">{standIns.length} play{standIns.length === 1 ? "s" : ""} a stand-in</h3>
          <ul className="space-y-0.5 text-sm">{standIns.map((x, i) => <Item key={i} f={x.f} label={x.label} />)}</ul>
        </div>
      )}

      {gaps.length > 0 && (
        <div className="space-y-1" data-testid="gaps">
          <h3 className="font-semibold">{gaps.length} miss{gaps.length === 1 ? "es" : ""} some velocities</h3>
          <ul className="space-y-0.5 text-sm">{gaps.map((x, i) => <Item key={i} f={x.f} label={x.label}>plays nothing at velocities {gapsInWords(x.f)}</Item>)}</ul>
        </div>
      )}

      {r.pedal && r.pedal.uncovered.length > 0 && (
        <p className="text-sm text-bad">✕ Pedal positions no zone covers: {r.pedal.uncovered.map((u) => `${u.low}–${u.high}`).join(", ")}</p>
      )}

      {r.conflicts.length > 0 && (
        <div className="space-y-1" data-testid="conflicts">
          <h3 className="font-semibold text-warn">⚠ {r.conflicts.length} problem{r.conflicts.length === 1 ? "" : "s"} in the layout or the kit</h3>
          <ul className="space-y-0.5 text-sm">
            {r.conflicts.map((c, i) => <li key={i}><span className="font-medium">{conflictTitle(c)}:</span> {c.message.replace(/ -> /g, " → ")}</li>)}
          </ul>
        </div>
      )}
    </section>
  );
}
