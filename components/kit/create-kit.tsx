"use client";
// New kit: empty, or filled from the studio's catalogue for the slots a layout template expects.
import { useState } from "react";
import { useRouter } from "next/navigation";
import { FormError } from "@/components/form-bits";
import { useCreateKit } from "@/components/data/kits";
import { Select } from "@/components/ui/select";

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
  const create = useCreateKit(studioId);
  // stays busy after success until the new kit's page replaces this one
  const busy = create.isPending || create.isSuccess;
  return (
    <form className="space-y-3" onSubmit={(e) => {
      e.preventDefault();
      create.mutate({ name, ...(template ? { template } : {}) }, { onSuccess: (kit) => router.push(`/s/${studioId}/kits/${kit.id}`) });
    }}>
      <div>
        <label className="label" htmlFor="kit-name">Kit name</label>
        <input id="kit-name" className="field" value={name} onChange={(e) => setName(e.target.value)} required maxLength={160} />
      </div>
      <div>
        <label className="label" htmlFor="kit-template">Slots</label>
        <Select id="kit-template" className="field" value={template} onChange={(e) => setTemplate(e.target.value)}>
          <option value="">Start empty</option>
          {Object.entries(TEMPLATE_LABELS).map(([k, v]) => <option key={k} value={k}>Fill from the catalogue for: {v}</option>)}
        </Select>
        <p className="mt-1 text-xs text-muted">Filling picks one catalogued instrument per slot (toms high to low by measured pitch); you can change every slot afterwards.</p>
      </div>
      <button className="btn-primary" disabled={busy}>Create kit</button>
      <FormError error={create.error} />
    </form>
  );
}
