"use client";
// Sharing a layout: publish it at a read-only link anyone can open (no account), with a short description; see
// its views; give it a new link (the old one stops working) or revoke it. Viewers see the link when there is one.
import { useState } from "react";
import { FormError } from "@/components/form-bits";
import { useLayoutShare, usePublishLayout, useRevokeShare } from "@/components/data/layouts";

export function SharePanel({ studioId, layoutId, canWrite }: { studioId: string; layoutId: string; canWrite: boolean }) {
  const share = useLayoutShare(studioId, layoutId);
  const publish = usePublishLayout(studioId, layoutId);
  const revoke = useRevokeShare(studioId, layoutId);
  const [description, setDescription] = useState<string | null>(null);
  const [copied, setCopied] = useState(false);
  const s = share.data;
  const text = description ?? s?.description ?? "";
  const url = s ? `${typeof window === "undefined" ? "" : window.location.origin}${s.path}` : "";
  const busy = publish.isPending || revoke.isPending;
  return (
    <section className="card space-y-3" data-testid="share-panel">
      <h3 className="font-semibold">Share this setup</h3>
      {share.isPending ? <p className="text-sm text-muted">Reading…</p> : s ? (
        <>
          <p className="text-sm">Anyone with this link sees the pads, notes, what each pad aims at and the pedal — never your kits, samples or studio.</p>
          <div className="flex flex-wrap items-center gap-2">
            <input readOnly className="field min-w-0 flex-1 font-mono text-xs" value={url} aria-label="Share link" data-testid="share-link" onFocus={(e) => e.currentTarget.select()} />
            <button type="button" className="btn-quiet" onClick={() => { void navigator.clipboard?.writeText(url).then(() => setCopied(true)); }}>{copied ? "Copied" : "Copy link"}</button>
          </div>
          <p className="text-xs text-muted" data-testid="share-views"><span className="num">{s.views}</span> view{s.views === 1 ? "" : "s"} since {s.publishedAt.slice(0, 10)}</p>
        </>
      ) : <p className="text-sm text-muted">Not shared. Publishing makes a read-only page at a link only you hand out.</p>}
      {canWrite ? (
        <form className="space-y-2" onSubmit={(e) => { e.preventDefault(); publish.mutate({ description: text }); }}>
          <label className="label" htmlFor="share-description">Description (shown on the shared page)</label>
          <textarea id="share-description" className="field min-h-20" maxLength={2000} value={text} onChange={(e) => setDescription(e.target.value)} placeholder="What this setup is for, the controller it was made on…" />
          <div className="flex flex-wrap gap-2">
            <button className="btn-primary" disabled={busy}>{s ? "Save description" : "Publish"}</button>
            {s && <button type="button" className="btn-quiet" disabled={busy} onClick={() => publish.mutate({ description: text, newLink: true })}>New link</button>}
            {s && <button type="button" className="btn-danger" disabled={busy} onClick={() => revoke.mutate()}>Stop sharing</button>}
          </div>
          <FormError error={publish.error ?? revoke.error} />
        </form>
      ) : <p className="text-xs text-muted">View only: an editor or owner can publish or revoke the link.</p>}
    </section>
  );
}
