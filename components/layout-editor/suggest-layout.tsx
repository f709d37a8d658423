"use client";
// Suggest a layout: choose a kit and a surface, see the suggested pads with the reason for each, keep it as a
// new layout (editors and owners) and continue in the layout editor.
import { useState } from "react";
import { useRouter } from "next/navigation";
import { FormError } from "@/components/form-bits";
import { useImportLayout, useSuggestLayout } from "@/components/data/layouts";
import type { SuggestLayoutAnswer } from "@/lib/api-types/layouts";
import { LAYOUT_SCHEMA } from "@/lib/audit/schema";
import { LayoutPreview } from "./layout-preview";
import { Select } from "@/components/ui/select";

type KitChoice = { id: string; name: string; filled: number };

/** Reasons read in the order of the pads: row by row, left to right (zones in their listed order). */
const padOrder = (s: SuggestLayoutAnswer, padId: string) => {
  const i = s.layout.pads.findIndex((p) => p.id === padId);
  const p = s.layout.pads[i]!;
  return p.row ? p.row * 1000 + p.col! : i;
};

function Preview({ s }: { s: SuggestLayoutAnswer }) {
  const reason = new Map(s.placements.map((p) => [p.padId, p] as const));
  return <LayoutPreview layout={s.layout} note={(id) => reason.get(id)?.reason} standIn={(id) => !!reason.get(id)?.standIn} />;
}

export function SuggestLayout({ studioId, kits, canSave }: { studioId: string; kits: KitChoice[]; canSave: boolean }) {
  const router = useRouter();
  const [kitId, setKitId] = useState(kits[0]!.id);
  const [kind, setKind] = useState<"grid" | "zones">("grid");
  const [rows, setRows] = useState(4);
  const [cols, setCols] = useState(4);
  const [zones, setZones] = useState("kick head\nsnare head\nsnare rim\ntom 1 head\ntom 2 head\nfloor tom head\nhi-hat top\nhi-hat edge\ncrash edge\nride bow\nride bell");
  const [standIns, setStandIns] = useState(false);
  const suggest = useSuggestLayout(studioId);
  const save = useImportLayout(studioId);
  const s = suggest.data;
  const tooMany = kind === "grid" && rows * cols > 64;
  const num = (v: string) => Math.min(64, Math.max(1, Number(v) || 1));
  return (
    <div className="grid grid-cols-1 gap-6 lg:grid-cols-[320px_minmax(0,1fr)]">
      <form className="card min-w-0 space-y-3 self-start" onSubmit={(e) => {
        e.preventDefault();
        const surface = kind === "grid" ? { kind, rows, cols } : { kind, zones: zones.split("\n").map((z) => z.trim()).filter(Boolean) };
        suggest.mutate({ kitId, surface, standIns });
      }}>
        <div>
          <label className="label" htmlFor="suggest-kit">Kit</label>
          <Select id="suggest-kit" className="field" value={kitId} onChange={(e) => setKitId(e.target.value)}>
            {kits.map((k) => <option key={k.id} value={k.id}>{k.name} ({k.filled} filled slots)</option>)}
          </Select>
        </div>
        <fieldset>
          <legend className="label">Controller</legend>
          <label className="mr-4 inline-block text-sm"><input type="radio" name="suggest-kind" checked={kind === "grid"} onChange={() => setKind("grid")} /> A grid of pads</label>
          <label className="inline-block text-sm"><input type="radio" name="suggest-kind" checked={kind === "zones"} onChange={() => setKind("zones")} /> Named trigger zones</label>
        </fieldset>
        {kind === "grid" ? (
          <div className="grid grid-cols-2 gap-3">
            <div><label className="label" htmlFor="suggest-rows">Rows</label><input id="suggest-rows" type="number" min={1} max={64} className="field num" value={rows} onChange={(e) => setRows(num(e.target.value))} /></div>
            <div><label className="label" htmlFor="suggest-cols">Columns</label><input id="suggest-cols" type="number" min={1} max={64} className="field num" value={cols} onChange={(e) => setCols(num(e.target.value))} /></div>
            <p className={`col-span-2 text-xs ${tooMany ? "text-bad" : "text-muted"}`}>{rows * cols} pads{tooMany ? " — a grid holds at most 64 pads" : ""}</p>
          </div>
        ) : (
          <div>
            <label className="label" htmlFor="suggest-zones">Zone names, one per line</label>
            <textarea id="suggest-zones" className="field min-h-40" value={zones} onChange={(e) => setZones(e.target.value)} />
            <p className="mt-1 text-xs text-muted">Name them as you would a drum: &quot;snare rim&quot;, &quot;tom 2 head&quot;, &quot;ride bell&quot;.</p>
          </div>
        )}
        <label className="flex items-start gap-2 text-sm">
          <input type="checkbox" checked={standIns} onChange={(e) => setStandIns(e.target.checked)} className="mt-1" />
          <span>Also place a main stroke the kit never recorded (it plays the nearest recorded one, marked as a stand-in)</span>
        </label>
        <button className="btn-primary" disabled={suggest.isPending || tooMany}>{suggest.isPending ? "Suggesting…" : "Suggest"}</button>
        <FormError error={suggest.error} />
      </form>

      <section className="min-w-0 space-y-4" aria-live="polite">
        {!s ? (
          <p className="card text-sm text-muted">The suggestion appears here, with the reason for every pad.</p>
        ) : (
          <>
            <div className="card space-y-3">
              <div className="flex flex-wrap items-center justify-between gap-2">
                <h2>{s.layout.pads.length} pads for {s.kitName}</h2>
                {canSave ? (
                  <button type="button" className="btn-primary" disabled={save.isPending || save.isSuccess}
                    onClick={() => save.mutate({ schema: LAYOUT_SCHEMA, layout: s.layout }, { onSuccess: (l) => router.push(`/s/${studioId}/layouts/${l.id}`) })}>
                    Keep it as a new layout
                  </button>
                ) : <p className="text-sm text-muted">View only: an editor or owner can keep it as a layout.</p>}
              </div>
              <Preview s={s} />
              <FormError error={save.error} />
            </div>
            <div className="card">
              <h3 className="font-semibold">Why each pad is where it is</h3>
              <ol className="mt-2 space-y-1 text-sm" data-testid="suggest-reasons">
                {[...s.placements].sort((a, b) => padOrder(s, a.padId) - padOrder(s, b.padId)).map((p) => {
                  const pad = s.layout.pads.find((x) => x.id === p.padId)!;
                  return <li key={p.padId}><span className="font-medium">{pad.label}</span>{pad.row ? <span className="text-muted"> (row {pad.row}, column {pad.col})</span> : null}: {p.reason}</li>;
                })}
              </ol>
              {s.leftOut.length > 0 && (
                <>
                  <h3 className="mt-4 font-semibold">Not placed</h3>
                  <ul className="mt-1 space-y-1 text-sm" data-testid="suggest-left-out">{s.leftOut.map((l, i) => <li key={i}>{l.slotId ? `${l.slotId} ${l.articulation}: ` : ""}{l.reason}</li>)}</ul>
                </>
              )}
            </div>
          </>
        )}
      </section>
    </div>
  );
}
