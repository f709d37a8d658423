"use client";
// Rename, copy, export and delete for one kit or one layout (the same four actions, the same words), and
// making a new one from a JSON file. Kits and layouts each have their own hooks (components/data/kits.ts,
// components/data/layouts.ts); the wrappers below hand them to the shared views.
import { useState } from "react";
import { useRouter } from "next/navigation";
import type { UseMutationResult } from "@tanstack/react-query";
import { FormError, Message } from "@/components/form-bits";
import { paths } from "@/components/data/paths";
import { ConfirmDialog } from "@/components/ui/dialog";
import { FilePicker } from "@/components/ui/file-picker";
import { useCopyKit, useDeleteKit, useImportKit, useRenameKit } from "@/components/data/kits";
import { useCopyLayout, useDeleteLayout, useImportLayout, useRenameLayout } from "@/components/data/layouts";

type Item = { id: string };
type Write<TVars> = UseMutationResult<Item, Error, TVars>;

interface ItemActionsProps {
  what: "kit" | "layout";
  name: string;
  canWrite: boolean;
  exportHref: string;
  /** The list page; a new item's page is `${listHref}/${id}`. */
  listHref: string;
  rename: Write<string>;
  copy: Write<string>;
  remove: UseMutationResult<unknown, Error, void>;
}

function ItemActions({ what, name, canWrite, exportHref, listHref, rename, copy, remove }: ItemActionsProps) {
  const router = useRouter();
  const [mode, setMode] = useState<"idle" | "rename" | "copy" | "delete">("idle");
  const [text, setText] = useState(name);
  const busy = rename.isPending || copy.isPending || remove.isPending;
  // one line of error for the three writes: starting one clears the others'
  const fresh = () => { rename.reset(); copy.reset(); remove.reset(); };
  return (
    <div className="no-print space-y-2">
      <div className="flex flex-wrap gap-2">
        <a className="btn-quiet" href={exportHref} download>Export JSON</a>
        {canWrite && <button type="button" className="btn-quiet" onClick={() => { setMode("rename"); setText(name); }}>Rename</button>}
        {canWrite && <button type="button" className="btn-quiet" onClick={() => { setMode("copy"); setText(`${name} (copy)`); }}>Copy</button>}
        {canWrite && (
          <ConfirmDialog
            open={mode === "delete"}
            onOpenChange={(o) => setMode(o ? "delete" : "idle")}
            title={`Delete the ${what}?`}
            confirmLabel="Delete for good"
            cancelLabel="Keep it"
            busy={busy}
            onConfirm={() => { fresh(); remove.mutate(undefined, { onSuccess: () => { router.push(listHref); router.refresh(); } }); }}
            trigger={<button type="button" className="btn-danger">Delete</button>}
          >
            <p>Delete the {what} “{name}”{what === "layout" ? " and its saved audits" : ""}? This cannot be undone.</p>
            <div className="mt-2"><FormError error={remove.error} /></div>
          </ConfirmDialog>
        )}
      </div>
      {(mode === "rename" || mode === "copy") && (
        <form className="flex flex-wrap items-end gap-2" onSubmit={(e) => {
          e.preventDefault();
          fresh();
          if (mode === "rename") rename.mutate(text, { onSuccess: () => { setMode("idle"); router.refresh(); } });
          else copy.mutate(text, { onSuccess: (item) => router.push(`${listHref}/${item.id}`) });
        }}>
          <div>
            <label className="label" htmlFor="entity-name">{mode === "rename" ? "New name" : "Name of the copy"}</label>
            <input id="entity-name" className="field" value={text} onChange={(e) => setText(e.target.value)} maxLength={160} required />
          </div>
          <button className="btn-primary" disabled={busy}>{mode === "rename" ? "Rename" : "Make copy"}</button>
          <button type="button" className="btn-quiet" onClick={() => setMode("idle")}>Cancel</button>
        </form>
      )}
      <FormError error={rename.error ?? copy.error ?? remove.error} />
    </div>
  );
}

export function KitActions({ studioId, kitId, name, canWrite }: { studioId: string; kitId: string; name: string; canWrite: boolean }) {
  const rename = useRenameKit(studioId, kitId);
  const copy = useCopyKit(studioId, kitId);
  const remove = useDeleteKit(studioId, kitId);
  return <ItemActions what="kit" name={name} canWrite={canWrite} exportHref={paths.kitExport(studioId, kitId)} listHref={`/s/${studioId}/kits`} rename={rename} copy={copy} remove={remove} />;
}

export function LayoutActions({ studioId, layoutId, name, canWrite }: { studioId: string; layoutId: string; name: string; canWrite: boolean }) {
  const rename = useRenameLayout(studioId, layoutId);
  const copy = useCopyLayout(studioId, layoutId);
  const remove = useDeleteLayout(studioId, layoutId);
  return <ItemActions what="layout" name={name} canWrite={canWrite} exportHref={paths.layoutExport(studioId, layoutId)} listHref={`/s/${studioId}/layouts`} rename={rename} copy={copy} remove={remove} />;
}

/** Read a JSON file the user picked and send it to an import route; go to the new item. */
function ImportJson({ write, listHref, label }: { write: Write<unknown>; listHref: string; label: string }) {
  const router = useRouter();
  const [notJson, setNotJson] = useState(false);
  return (
    <div className="space-y-2">
      <FilePicker id={`import-${label.replace(/\W+/g, "-")}`} label={label} buttonText="Choose a JSON file…" accept="application/json,.json" onChange={async (e) => {
        setNotJson(false);
        write.reset();
        const f = e.target.files?.[0];
        if (!f) return;
        let data: unknown;
        try { data = JSON.parse(await f.text()); } catch { setNotJson(true); return; }
        write.mutate(data, { onSuccess: (item) => router.push(`${listHref}/${item.id}`) });
      }} />
      {notJson && <Message kind="error">That file is not JSON.</Message>}
      <FormError error={write.error} />
    </div>
  );
}

export function ImportKitFile({ studioId, label }: { studioId: string; label: string }) {
  const write = useImportKit(studioId);
  return <ImportJson write={write} listHref={`/s/${studioId}/kits`} label={label} />;
}

export function ImportLayoutFile({ studioId, label }: { studioId: string; label: string }) {
  const write = useImportLayout(studioId);
  return <ImportJson write={write} listHref={`/s/${studioId}/layouts`} label={label} />;
}
