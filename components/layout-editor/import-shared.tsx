"use client";
// Copy a shared layout into one of the studios where the signed-in person may edit; then open it there.
import { useState } from "react";
import { useRouter } from "next/navigation";
import { FormError } from "@/components/form-bits";
import { useImportShared } from "@/components/data/layouts";
import { Select } from "@/components/ui/select";

export function ImportShared({ token, studios }: { token: string; studios: { id: string; name: string }[] }) {
  const router = useRouter();
  const [studioId, setStudioId] = useState(studios[0]?.id ?? "");
  const imp = useImportShared();
  if (!studios.length) return <p className="text-sm text-muted">You edit no studio yet: an owner or editor can import it.</p>;
  return (
    <form className="flex flex-wrap items-end gap-2" onSubmit={(e) => { e.preventDefault(); imp.mutate({ studioId, token }, { onSuccess: (l) => router.push(`/s/${studioId}/layouts/${l.id}`) }); }}>
      <div>
        <label className="label" htmlFor="import-studio">Into the studio</label>
        <Select id="import-studio" className="field" value={studioId} onChange={(e) => setStudioId(e.target.value)}>
          {studios.map((s) => <option key={s.id} value={s.id}>{s.name}</option>)}
        </Select>
      </div>
      <button className="btn-primary" disabled={imp.isPending || imp.isSuccess}>Import into my studio</button>
      <FormError error={imp.error} />
    </form>
  );
}
