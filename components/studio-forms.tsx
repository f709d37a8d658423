"use client";
// Forms of the studio area: create and rename a studio, invite, change roles, remove members, revoke and
// accept invitations. Each validates with the shared zod schema, calls the API, then refreshes the page.
import { useState } from "react";
import { useRouter } from "next/navigation";
import { useMutation } from "@tanstack/react-query";
import { api, ApiError } from "./api";
import { Field, Message, fieldErrors } from "./form-bits";
import { inviteSchema, studioNameSchema } from "@/lib/validation/studio";
import { DEFAULT_INVITE_ROLE, ROLES, rolesInWords, type Role } from "@/lib/permissions";

const errText = (e: unknown) => (e instanceof ApiError ? e.message : "Something went wrong; try again.");

export function CreateStudioForm() {
  const router = useRouter();
  const [fields, setFields] = useState<Record<string, string>>({});
  const m = useMutation({
    mutationFn: (name: string) => api<{ id: string }>("/api/studios", { body: { name } }),
    onSuccess: (out) => {
      router.push(`/s/${out.id}`);
      router.refresh();
    },
  });
  return (
    <form
      className="space-y-3"
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        const parsed = studioNameSchema.safeParse({ name: new FormData(e.currentTarget).get("name") });
        if (!parsed.success) return setFields(fieldErrors(parsed.error.issues));
        setFields({});
        m.mutate(parsed.data.name);
      }}
    >
      <h2>New studio</h2>
      <Field label="Studio name" name="name" required maxLength={120} error={fields.name} />
      {m.isError && <Message kind="error">{errText(m.error)}</Message>}
      <button className="btn-primary" disabled={m.isPending}>Create studio</button>
    </form>
  );
}

export function RenameStudioForm({ studioId, name }: { studioId: string; name: string }) {
  const router = useRouter();
  const [fields, setFields] = useState<Record<string, string>>({});
  const m = useMutation({
    mutationFn: (n: string) => api(`/api/studios/${studioId}`, { method: "PATCH", body: { name: n } }),
    onSuccess: () => router.refresh(),
  });
  return (
    <form
      className="flex items-end gap-2"
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        const parsed = studioNameSchema.safeParse({ name: new FormData(e.currentTarget).get("name") });
        if (!parsed.success) return setFields(fieldErrors(parsed.error.issues));
        setFields({});
        m.mutate(parsed.data.name);
      }}
    >
      <div className="flex-1"><Field label="Studio name" name="name" defaultValue={name} error={fields.name ?? (m.isError ? errText(m.error) : undefined)} /></div>
      <button className="btn-quiet" disabled={m.isPending}>{m.isSuccess ? "Saved" : "Rename"}</button>
    </form>
  );
}

export function InviteForm({ studioId }: { studioId: string }) {
  const router = useRouter();
  const [fields, setFields] = useState<Record<string, string>>({});
  const [sentTo, setSentTo] = useState<string | null>(null);
  const m = useMutation({
    mutationFn: (body: { email: string; role: Role }) => api(`/api/studios/${studioId}/invitations`, { body }),
    onSuccess: (_d, v) => {
      setSentTo(v.email);
      router.refresh();
    },
  });
  return (
    <form
      className="space-y-3"
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        const f = new FormData(e.currentTarget);
        const parsed = inviteSchema.safeParse({ email: f.get("email"), role: f.get("role") });
        if (!parsed.success) return setFields(fieldErrors(parsed.error.issues));
        setFields({});
        setSentTo(null);
        m.mutate(parsed.data);
        e.currentTarget.reset();
      }}
    >
      <h2>Invite someone</h2>
      <Field label="E-mail" name="email" type="email" required error={fields.email} />
      <div>
        <label className="label" htmlFor="invite-role">Role</label>
        <select id="invite-role" name="role" className="field" defaultValue={DEFAULT_INVITE_ROLE}>
          {ROLES.map((r) => <option key={r} value={r}>{r}</option>)}
        </select>
        <p className="mt-1 text-xs text-muted">{rolesInWords()}</p>
      </div>
      {m.isError && <Message kind="error">{errText(m.error)}</Message>}
      {sentTo && <Message kind="ok">Invitation sent to {sentTo}.</Message>}
      <button className="btn-primary" disabled={m.isPending}>Send invitation</button>
    </form>
  );
}

export function MemberControls({ studioId, userId, role, name }: { studioId: string; userId: string; role: Role; name: string }) {
  const router = useRouter();
  const change = useMutation({
    mutationFn: (r: Role) => api(`/api/studios/${studioId}/members/${userId}`, { method: "PATCH", body: { role: r } }),
    onSuccess: () => router.refresh(),
  });
  const remove = useMutation({
    mutationFn: () => api(`/api/studios/${studioId}/members/${userId}`, { method: "DELETE" }),
    onSuccess: () => router.refresh(),
  });
  const error = change.error ?? remove.error;
  return (
    <div className="flex flex-wrap items-center justify-end gap-2">
      <select aria-label={`Role of ${name}`} className="field w-28 py-1" value={role} disabled={change.isPending} onChange={(e) => change.mutate(e.target.value as Role)}>
        {ROLES.map((r) => <option key={r} value={r}>{r}</option>)}
      </select>
      <button
        type="button"
        className="btn-danger py-1"
        disabled={remove.isPending}
        onClick={() => {
          if (window.confirm(`Remove ${name} from this studio? They lose access at once.`)) remove.mutate();
        }}
      >
        Remove
      </button>
      {error && <p role="alert" className="basis-full text-right text-xs text-bad">{errText(error)}</p>}
    </div>
  );
}

export function RevokeInvitationButton({ studioId, invitationId, email }: { studioId: string; invitationId: string; email: string }) {
  const router = useRouter();
  const m = useMutation({
    mutationFn: () => api(`/api/studios/${studioId}/invitations/${invitationId}`, { method: "DELETE" }),
    onSuccess: () => router.refresh(),
  });
  return (
    <button type="button" className="btn-quiet py-1" aria-label={`Withdraw the invitation to ${email}`} disabled={m.isPending} onClick={() => m.mutate()}>
      Withdraw
    </button>
  );
}

export function AcceptInvitationButton({ token }: { token: string }) {
  const router = useRouter();
  const m = useMutation({
    mutationFn: () => api<{ studioId: string }>("/api/invitations/accept", { body: { token } }),
    onSuccess: (out) => {
      router.push(`/s/${out.studioId}`);
      router.refresh();
    },
  });
  return (
    <div className="space-y-2">
      <button type="button" className="btn-primary" disabled={m.isPending} onClick={() => m.mutate()}>Accept invitation</button>
      {m.isError && <Message kind="error">{errText(m.error)}</Message>}
    </div>
  );
}
