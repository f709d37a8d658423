"use client";
// New kit: empty, or filled for a kit template's slots from one library's instruments (or every library's).
import { useState } from "react";
import { useRouter } from "next/navigation";
import { Field, FormError } from "@/components/form-bits";
import { useCreateKit } from "@/components/data/kits";
import { expectedSlots } from "@/lib/audit/kits";
import { getTemplate } from "@/lib/audit/templates";
import { Select } from "@/components/ui/select";

export const TEMPLATE_LABELS: Record<string, string> = {
  "gm-percussion": "General MIDI percussion map (47 notes)",
  "grid-24": "Our 24-pad grid (4 × 6)",
  "grid-2x8": "Two-row 16-pad strip (2 × 8)",
  "trigger-five": "Five-piece trigger kit (head/rim zones, hi-hat pedal)",
};

/** Kit templates: the slot plans a new kit can be filled for (lib/audit/templates.ts; two templates that expect
 * the same slots are offered once). */
export const KIT_TEMPLATES: ReadonlyArray<{ id: string; label: string; slots: string[] }> = [
  { id: "trigger-five", label: "Five-piece kit" },
  { id: "grid-24", label: "Five-piece with more cymbals" },
  { id: "gm-percussion", label: "Kit and hand percussion (General MIDI)" },
].map((t) => ({ ...t, slots: expectedSlots(getTemplate(t.id)!).map((s) => s.name) }));

export function CreateKitForm({ studioId, libraries, library }: { studioId: string; libraries: Array<{ id: string; name: string; instruments: number }>; library?: string }) {
  const router = useRouter();
  const [name, setName] = useState("");
  const [template, setTemplate] = useState(libraries.some((l) => l.instruments > 0) ? "trigger-five" : "");
  const withInstruments = libraries.filter((l) => l.instruments > 0);
  const [libraryId, setLibraryId] = useState(library && libraries.some((l) => l.id === library) ? library : withInstruments.length === 1 ? withInstruments[0]!.id : "");
  const chosen = KIT_TEMPLATES.find((t) => t.id === template);
  const create = useCreateKit(studioId);
  // stays busy after success until the new kit's page replaces this one
  const busy = create.isPending || create.isSuccess;
  return (
    <form className="space-y-3" onSubmit={(e) => {
      e.preventDefault();
      create.mutate({ name, ...(template ? { template, ...(libraryId ? { libraryId } : {}) } : {}) }, { onSuccess: (kit) => router.push(`/s/${studioId}/kits/${kit.id}`) });
    }}>
      <Field label="Kit name" id="kit-name" value={name} onChange={(e) => setName(e.target.value)} required maxLength={160} placeholder="Studio A kit" />
      <div>
        <label className="label" htmlFor="kit-template">Kit template</label>
        <Select id="kit-template" className="field" value={template} onChange={(e) => setTemplate(e.target.value)} aria-describedby="kit-template-hint">
          <option value="">No template: start with no slots</option>
          {KIT_TEMPLATES.map((t) => <option key={t.id} value={t.id}>{t.label} ({t.slots.length} slots)</option>)}
        </Select>
        <p id="kit-template-hint" className="mt-1 text-xs text-muted">
          {chosen && <span className="block text-ink" data-testid="kit-template-slots">{chosen.slots.length > 12 ? `${chosen.slots.slice(0, 12).join(", ")} and ${chosen.slots.length - 12} more` : chosen.slots.join(", ")}.</span>}
          A template names the slots and puts one instrument in each (toms high to low by measured pitch); instruments left over get slots of their own. You can change every slot afterwards.
        </p>
      </div>
      {template && (
        <div>
          <label className="label" htmlFor="kit-library">Take the instruments from</label>
          <Select id="kit-library" className="field" value={libraryId} onChange={(e) => setLibraryId(e.target.value)}>
            {libraries.map((l) => <option key={l.id} value={l.id} disabled={l.instruments === 0}>{l.name} ({l.instruments === 0 ? "no instruments yet" : `${l.instruments} instrument${l.instruments === 1 ? "" : "s"}`})</option>)}
            <option value="">Every library of the studio</option>
          </Select>
        </div>
      )}
      <button className="btn-primary" disabled={busy}>Create kit</button>
      <FormError error={create.error} />
    </form>
  );
}
