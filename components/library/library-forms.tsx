"use client";
// Library forms: create, rename and describe, delete (owners; the name typed again to confirm).
import { useState } from "react";
import { useRouter } from "next/navigation";
import { Field, FormError, Message, useFieldCheck } from "../form-bits";
import { useCreateLibrary, useDeleteLibrary, useUpdateLibrary } from "../data/libraries";
import { createLibrarySchema, updateLibrarySchema, type VelocityCurveName } from "@/lib/validation/library";
import { VELOCITY_CURVE_WORDS } from "./curve-words";
import { Select } from "@/components/ui/select";

export function CreateLibraryForm({ studioId }: { studioId: string }) {
  const router = useRouter();
  const { fields, check } = useFieldCheck();
  const m = useCreateLibrary(studioId);
  return (
    <form
      className="space-y-3"
      noValidate
      data-testid="create-library"
      onSubmit={(e) => {
        e.preventDefault();
        const fd = new FormData(e.currentTarget);
        const parsed = check(createLibrarySchema, { name: fd.get("name"), description: String(fd.get("description") ?? "") || undefined });
        if (!parsed) return;
        m.mutate(parsed, {
          onSuccess: (out) => {
            router.push(`/s/${studioId}/libraries/${out.id}`);
            router.refresh();
          },
        });
      }}
    >
      <h2>New library</h2>
      <Field label="Library name" name="name" required maxLength={160} error={fields.name} placeholder="e.g. Maple kit, March sessions" />
      <div>
        <label htmlFor="description" className="label">Description <span className="font-normal text-muted">(optional)</span></label>
        <textarea id="description" name="description" rows={3} maxLength={4000} className="field" />
      </div>
      <FormError error={m.error} />
      <button className="btn-primary" disabled={m.isPending}>Create library</button>
    </form>
  );
}

export function LibrarySettings({ studioId, libraryId, name, description, velocityCurve, canDelete }: { studioId: string; libraryId: string; name: string; description: string | null; velocityCurve: VelocityCurveName; canDelete: boolean }) {
  const router = useRouter();
  const { fields, check } = useFieldCheck();
  const [confirm, setConfirm] = useState("");
  const save = useUpdateLibrary(studioId, libraryId);
  const del = useDeleteLibrary(studioId, libraryId);
  const remove = () =>
    del.mutate(confirm, {
      onSuccess: () => {
        router.push(`/s/${studioId}/libraries`);
        router.refresh();
      },
    });
  return (
    <div className="space-y-6">
      <form
        className="space-y-3"
        noValidate
        onSubmit={(e) => {
          e.preventDefault();
          const fd = new FormData(e.currentTarget);
          const parsed = check(updateLibrarySchema, { name: fd.get("name"), description: String(fd.get("description") ?? ""), velocityCurve: fd.get("velocityCurve") });
          if (!parsed) return;
          save.mutate(parsed, { onSuccess: () => router.refresh() });
        }}
      >
        <Field label="Name" name="name" defaultValue={name} maxLength={160} error={fields.name} />
        <div>
          <label htmlFor="lib-description" className="label">Description</label>
          <textarea id="lib-description" name="description" rows={3} maxLength={4000} defaultValue={description ?? ""} className="field" />
        </div>
        <div>
          <label htmlFor="lib-curve" className="label">Velocity curve</label>
          <Select id="lib-curve" name="velocityCurve" defaultValue={velocityCurve} className="field">
            {(Object.keys(VELOCITY_CURVE_WORDS) as VelocityCurveName[]).map((c) => <option key={c} value={c}>{VELOCITY_CURVE_WORDS[c]}</option>)}
          </Select>
          <p className="mt-1 text-xs text-muted">How the layers&apos; loudness maps to MIDI velocities. Changing it sorts the library again.</p>
        </div>
        <FormError error={save.error} />
        {save.isSuccess && <Message kind="ok">Saved.</Message>}
        <button className="btn-quiet" disabled={save.isPending}>Save settings</button>
      </form>
      {canDelete && (
        <div className="space-y-2 rounded-md border border-bad/30 p-3">
          <h3 className="font-semibold text-bad">Delete this library</h3>
          <p className="text-sm text-muted">Deletes every sample, its stored file, the instruments and the health report. This cannot be undone. Type the library&apos;s name to confirm.</p>
          <label htmlFor="confirm-delete" className="label">Library name</label>
          <input id="confirm-delete" className="field" value={confirm} onChange={(e) => setConfirm(e.target.value)} placeholder={name} autoComplete="off" />
          <FormError error={del.error} />
          <button type="button" className="btn-danger" disabled={confirm.trim() !== name || del.isPending} onClick={remove}>Delete library and files</button>
        </div>
      )}
    </div>
  );
}
