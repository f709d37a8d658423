// A layout drawn read-only: a grid's pads in their rows and columns (free cells dashed), or a trigger-zone list;
// each pad with its label, note and channel, and what it aims at in the trade's words (slot, stroke). Used by the
// suggestion and the shared-layout page.
import type { Layout } from "@/lib/audit/types";
import { strokeName } from "@/components/audit/words";

type PadOf = Layout["pads"][number];

function PreviewPad({ p, aim, note, standIn }: { p: PadOf; aim: string; note?: string; standIn: boolean }) {
  return (
    <div className={`min-h-20 rounded-md border bg-card p-2 text-xs ${standIn ? "border-dashed border-warn/60" : "border-line"}`} title={note} data-testid="suggested-pad" data-pad-id={p.id}>
      <div className="flex justify-between gap-1"><span className="font-medium">{p.label}</span><span className="num text-muted">{p.note}{p.channel !== 10 ? ` ch${p.channel}` : ""}</span></div>
      <div className="mt-1 text-muted">{aim}</div>
      {standIn && <div className="mt-1 text-warn">stand-in</div>}
    </div>
  );
}

export function LayoutPreview({ layout, note, standIn, slotFamily }: { layout: Layout; note?: (padId: string) => string | undefined; standIn?: (padId: string) => boolean; slotFamily?: boolean }) {
  const slotName = new Map((layout.slots ?? []).map((s) => [s.id, slotFamily ? s.family : s.name] as const));
  const aim = (p: PadOf) => (p.target ? `${slotName.get(p.target.slotId) ?? p.target.slotId} · ${strokeName(null, p.target.articulation)}` : "not aimed");
  const surface = layout.surface;
  if (surface.kind === "grid") {
    return (
      <div className="overflow-x-auto">
        <div className="grid min-w-[36rem] gap-2" style={{ gridTemplateColumns: `repeat(${surface.cols}, minmax(0, 1fr))` }} data-testid="suggested-grid">
          {Array.from({ length: surface.rows * surface.cols }, (_, i) => {
            const row = Math.floor(i / surface.cols) + 1;
            const col = (i % surface.cols) + 1;
            const pad = layout.pads.find((p) => p.row === row && p.col === col);
            return pad ? <PreviewPad key={i} p={pad} aim={aim(pad)} note={note?.(pad.id)} standIn={!!standIn?.(pad.id)} /> : <div key={i} className="min-h-20 rounded-md border border-dashed border-line p-2 text-xs text-muted">free</div>;
          })}
        </div>
      </div>
    );
  }
  return (
    <ul className="grid grid-cols-1 gap-2 sm:grid-cols-2 lg:grid-cols-3" data-testid="suggested-zones">
      {layout.pads.map((p) => <li key={p.id}><PreviewPad p={p} aim={aim(p)} note={note?.(p.id)} standIn={!!standIn?.(p.id)} /></li>)}
    </ul>
  );
}
