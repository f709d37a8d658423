"use client";
// Run an audit: a layout against a kit, with the studio's current catalogue. The kit offered first is the one last
// audited with the chosen layout (lastKitByLayout, newest audit first), else the one given, else the first.
// Compare: the link to the previous audit of the same layout, and a choice of any other.
import { useState } from "react";
import { useRouter } from "next/navigation";
import { compareHref } from "./audit-links";
import { FormError } from "@/components/form-bits";
import { useRunAudit } from "@/components/data/audits";
import { Select } from "@/components/ui/select";

export function RunAuditForm({ studioId, layouts, kits, layoutId, kitId, lastKits = {} }: { studioId: string; layouts: Array<{ id: string; name: string }>; kits: Array<{ id: string; name: string }>; layoutId?: string; kitId?: string; lastKits?: Record<string, string> }) {
  const router = useRouter();
  const defaultKit = (layout: string) => {
    const last = lastKits[layout];
    if (last && kits.some((x) => x.id === last)) return last;
    return kitId && kits.some((x) => x.id === kitId) ? kitId : (kits[0]?.id ?? "");
  };
  const [l, setL] = useState(layoutId ?? layouts[0]?.id ?? "");
  const [k, setK] = useState(() => defaultKit(layoutId ?? layouts[0]?.id ?? ""));
  const run = useRunAudit(studioId);
  // stays busy after success until the new audit's page replaces this one
  const busy = run.isPending || run.isSuccess;
  if (!layouts.length || !kits.length) return <p className="text-sm text-muted">Make a layout and a kit first.</p>;
  return (
    <form className="space-y-3" onSubmit={(e) => {
      e.preventDefault();
      run.mutate({ layoutId: l, kitId: k }, { onSuccess: (audit) => router.push(`/s/${studioId}/audits/${audit.id}`) });
    }}>
      <div>
        <label className="label" htmlFor="audit-layout">Layout</label>
        <Select id="audit-layout" className="field" value={l} onChange={(e) => { setL(e.target.value); setK(defaultKit(e.target.value)); }}>{layouts.map((x) => <option key={x.id} value={x.id}>{x.name}</option>)}</Select>
      </div>
      <div>
        <label className="label" htmlFor="audit-kit">Kit</label>
        <Select id="audit-kit" className="field" value={k} onChange={(e) => setK(e.target.value)}>{kits.map((x) => <option key={x.id} value={x.id}>{x.name}</option>)}</Select>
        {lastKits[l] === k && <p className="mt-1 text-xs text-muted" data-testid="kit-last-used">The kit last audited with this layout.</p>}
      </div>
      <button className="btn-primary" disabled={busy}>{busy ? "Auditing…" : "Run audit"}</button>
      <FormError error={run.error} />
    </form>
  );
}

export function CompareWith({ studioId, auditId, others }: { studioId: string; auditId: string; others: Array<{ id: string; label: string; older: boolean }> }) {
  const router = useRouter();
  if (!others.length) return null;
  return (
    <label className="inline-flex flex-wrap items-center gap-2 text-sm">
      <span>Or compare with</span>
      <Select className="field w-auto py-1" defaultValue="" aria-label="Compare with another audit" onChange={(e) => {
        const o = others.find((x) => x.id === e.target.value);
        if (!o) return;
        const [before, after] = o.older ? [o.id, auditId] : [auditId, o.id];
        router.push(compareHref(studioId, before, after));
      }}>
        <option value="" disabled>choose an audit…</option>
        {others.map((o) => <option key={o.id} value={o.id}>{o.label}</option>)}
      </Select>
    </label>
  );
}

export function PrintButton() {
  return <button type="button" className="btn-quiet" onClick={() => window.print()}>Print pad chart</button>;
}
