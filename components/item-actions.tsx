"use client";
// Rename, copy, export and delete for a kit or a layout (the same four actions, the same words).
import { useState } from "react";
import { useRouter } from "next/navigation";
import { api, ApiError } from "@/components/api";
import { Message } from "@/components/form-bits";

export function EntityActions({ apiBase, pageBase, listHref, name, what, canWrite }: { apiBase: string; pageBase: string; listHref: string; name: string; what: "kit" | "layout"; canWrite: boolean }) {
  const router = useRouter();
  const [mode, setMode] = useState<"idle" | "rename" | "copy" | "delete">("idle");
  const [text, setText] = useState(name);
  const [err, setErr] = useState("");
  const [busy, setBusy] = useState(false);
  async function run(fn: () => Promise<void>) {
    setBusy(true);
    setErr("");
    try { await fn(); } catch (e) { setErr(e instanceof ApiError ? e.message : String(e)); } finally { setBusy(false); }
  }
  return (
    <div className="no-print space-y-2">
      <div className="flex flex-wrap gap-2">
        <a className="btn-quiet" href={`${apiBase}/export`} download>Export JSON</a>
        {canWrite && <button type="button" className="btn-quiet" onClick={() => { setMode("rename"); setText(name); }}>Rename</button>}
        {canWrite && <button type="button" className="btn-quiet" onClick={() => { setMode("copy"); setText(`${name} (copy)`); }}>Copy</button>}
        {canWrite && <button type="button" className="btn-danger" onClick={() => setMode("delete")}>Delete</button>}
      </div>
      {(mode === "rename" || mode === "copy") && (
        <form className="flex flex-wrap items-end gap-2" onSubmit={(e) => {
          e.preventDefault();
          void run(async () => {
            if (mode === "rename") {
              await api(apiBase, { method: "PATCH", body: { name: text } });
              setMode("idle");
              router.refresh();
            } else {
              const r = await api<{ kit?: { id: string }; layout?: { id: string } }>(`${apiBase}/copy`, { method: "POST", body: { name: text } });
              router.push(`${pageBase}/${(r.kit ?? r.layout)!.id}`);
            }
          });
        }}>
          <div>
            <label className="label" htmlFor="entity-name">{mode === "rename" ? "New name" : "Name of the copy"}</label>
            <input id="entity-name" className="field" value={text} onChange={(e) => setText(e.target.value)} maxLength={160} required />
          </div>
          <button className="btn-primary" disabled={busy}>{mode === "rename" ? "Rename" : "Make copy"}</button>
          <button type="button" className="btn-quiet" onClick={() => setMode("idle")}>Cancel</button>
        </form>
      )}
      {mode === "delete" && (
        <div className="flex flex-wrap items-center gap-2 text-sm">
          <span>Delete the {what} “{name}”{what === "layout" ? " and its saved audits" : ""}? This cannot be undone.</span>
          <button type="button" className="btn-danger" disabled={busy} onClick={() => void run(async () => { await api(apiBase, { method: "DELETE" }); router.push(listHref); router.refresh(); })}>Delete for good</button>
          <button type="button" className="btn-quiet" onClick={() => setMode("idle")}>Keep it</button>
        </div>
      )}
      {err && <Message kind="error">{err}</Message>}
    </div>
  );
}

/** Read a JSON file the user picked and POST it to an import route; go to the new item. */
export function ImportJson({ action, pageBase, label }: { action: string; pageBase: string; label: string }) {
  const router = useRouter();
  const [err, setErr] = useState("");
  return (
    <div className="space-y-2">
      <label className="label" htmlFor={`import-${label}`}>{label}</label>
      <input id={`import-${label}`} type="file" accept="application/json,.json" className="block text-sm" onChange={async (e) => {
        setErr("");
        const f = e.target.files?.[0];
        if (!f) return;
        let data: unknown;
        try { data = JSON.parse(await f.text()); } catch { setErr("That file is not JSON."); return; }
        try {
          const r = await api<{ kit?: { id: string }; layout?: { id: string } }>(action, { method: "POST", body: data });
          router.push(`${pageBase}/${(r.kit ?? r.layout)!.id}`);
        } catch (x) { setErr(x instanceof ApiError ? x.message : String(x)); }
      }} />
      {err && <Message kind="error">{err}</Message>}
    </div>
  );
}
