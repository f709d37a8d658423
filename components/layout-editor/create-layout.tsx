"use client";
// New layout: a blank grid (rows × columns, up to 64 pads), a blank trigger-zone list, or a template.
import { useState } from "react";
import { useRouter } from "next/navigation";
import { Field, FormError } from "@/components/form-bits";
import { useCreateLayout } from "@/components/data/layouts";
import { TEMPLATE_LABELS } from "@/components/kit/create-kit";
import { Select } from "@/components/ui/select";

export function CreateLayoutForm({ studioId }: { studioId: string }) {
  const router = useRouter();
  const [name, setName] = useState("");
  const [kind, setKind] = useState<string>("grid");
  const [rows, setRows] = useState(4);
  const [cols, setCols] = useState(4);
  const [zones, setZones] = useState(8);
  const create = useCreateLayout(studioId);
  // stays busy after success until the new layout's page replaces this one
  const busy = create.isPending || create.isSuccess;
  const tooMany = kind === "grid" && rows * cols > 64;
  return (
    <form className="space-y-3" onSubmit={(e) => {
      e.preventDefault();
      const body = kind === "grid" ? { name, grid: { rows, cols } } : kind === "zones" ? { name, zones } : { name, template: kind };
      create.mutate(body, { onSuccess: (layout) => router.push(`/s/${studioId}/layouts/${layout.id}`) });
    }}>
      <Field label="Layout name" id="layout-name" value={name} onChange={(e) => setName(e.target.value)} required maxLength={160} />
      <div>
        <label className="label" htmlFor="layout-kind">Start from</label>
        <Select id="layout-kind" className="field" value={kind} onChange={(e) => setKind(e.target.value)}>
          <option value="grid">A blank grid</option>
          <option value="zones">A blank list of trigger zones</option>
          {Object.entries(TEMPLATE_LABELS).map(([k, v]) => <option key={k} value={k}>Template: {v}</option>)}
        </Select>
      </div>
      {kind === "grid" && (
        <div className="grid grid-cols-2 gap-3">
          <div><label className="label" htmlFor="layout-rows">Rows</label><input id="layout-rows" type="number" min={1} max={64} className="field num" value={rows} onChange={(e) => setRows(Math.max(1, Number(e.target.value) || 1))} /></div>
          <div><label className="label" htmlFor="layout-cols">Columns</label><input id="layout-cols" type="number" min={1} max={64} className="field num" value={cols} onChange={(e) => setCols(Math.max(1, Number(e.target.value) || 1))} /></div>
          <p className={`col-span-2 text-xs ${tooMany ? "text-bad" : "text-muted"}`}>{rows * cols} pads{tooMany ? " — a grid holds at most 64 pads" : ""}</p>
        </div>
      )}
      {kind === "zones" && (
        <div><label className="label" htmlFor="layout-zones">Trigger zones</label><input id="layout-zones" type="number" min={1} max={128} className="field num" value={zones} onChange={(e) => setZones(Math.max(1, Number(e.target.value) || 1))} /></div>
      )}
      <button className="btn-primary" disabled={busy || tooMany}>Create layout</button>
      <FormError error={create.error} />
    </form>
  );
}
