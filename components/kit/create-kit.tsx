"use client";
// New kit: empty, or filled from the studio's catalogue for the slots a layout template expects.
import { useState } from "react";
import { useRouter } from "next/navigation";
import { api, ApiError } from "@/components/api";
import { Message } from "@/components/form-bits";

export const TEMPLATE_LABELS: Record<string, string> = {
  "gm-percussion": "General MIDI percussion map (47 notes)",
  "grid-24": "Our 24-pad grid (4 × 6)",
  "grid-2x8": "Two-row 16-pad strip (2 × 8)",
  "trigger-five": "Five-piece trigger kit (head/rim zones, hi-hat pedal)",
};

export function CreateKitForm({ studioId }: { studioId: string }) {
  const router = useRouter();
  const [name, setName] = useState("");
  const [template, setTemplate] = useState("");
  const [err, setErr] = useState("");
  const [busy, setBusy] = useState(false);
  return (
    <form className="space-y-3" onSubmit={async (e) => {
      e.preventDefault();
      setBusy(true);
      setErr("");
      try {
        const r = await api<{ kit: { id: string } }>(`/api/studios/${studioId}/kits`, { body: { name, ...(template ? { template } : {}) } });
        router.push(`/s/${studioId}/kits/${r.kit.id}`);
      } catch (x) { setErr(x instanceof ApiError ? x.message : String(x)); setBusy(false); }
    }}>
      <div>
        <label className="label" htmlFor="kit-name">Kit name</label>
        <input id="kit-name" className="field" value={name} onChange={(e) => setName(e.target.value)} required maxLength={160} />
      </div>
      <div>
        <label className="label" htmlFor="kit-template">Slots</label>
        <select id="kit-template" className="field" value={template} onChange={(e) => setTemplate(e.target.value)}>
          <option value="">Start empty</option>
          {Object.entries(TEMPLATE_LABELS).map(([k, v]) => <option key={k} value={k}>Fill from the catalogue for: {v}</option>)}
        </select>
        <p className="mt-1 text-xs text-muted">Filling picks one catalogued instrument per slot (toms high to low by measured pitch); you can change every slot afterwards.</p>
      </div>
      <button className="btn-primary" disabled={busy}>Create kit</button>
      {err && <Message kind="error">{err}</Message>}
    </form>
  );
}
