"use client";
// Forms of the studio area: create and rename a studio, invite, change roles, remove members, revoke and
// accept invitations. Each validates with the shared zod schema, calls the API, then refreshes the page.
import { useState } from "react";
import { useRouter } from "next/navigation";
import { Field, FormError, Message, errorText, useFieldCheck } from "./form-bits";
import { useCreateStudio, useRenameStudio } from "./data/studios";
import { useAcceptInvitation, useInvite, useRevokeInvitation } from "./data/invitations";
import { useChangeRole, useRemoveMember } from "./data/members";
import { inviteSchema, studioNameSchema } from "@/lib/validation/studio";
import { DEFAULT_INVITE_ROLE, ROLES, rolesInWords, type Role } from "@/lib/permissions";
import { Select } from "@/components/ui/select";
import { ConfirmDialog } from "@/components/ui/dialog";
import type { StudioNameBody } from "@/lib/api-types/studios";

/** A studio name form's submit: the name, once the shared schema accepts it, goes to `send`. */
function onStudioName(check: ReturnType<typeof useFieldCheck>["check"], send: (body: StudioNameBody) => void) {
  return (e: React.FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const body = check(studioNameSchema, { name: new FormData(e.currentTarget).get("name") });
    if (body) send(body);
  };
}

export function CreateStudioForm() {
  const router = useRouter();
  const { fields, check } = useFieldCheck();
  const m = useCreateStudio();
  return (
    <form
      className="space-y-3"
      noValidate
      onSubmit={onStudioName(check, (body) =>
        m.mutate(body, {
          onSuccess: (out) => {
            router.push(`/s/${out.id}`);
            router.refresh();
          },
        }),
      )}
    >
      <h2>New studio</h2>
      <Field label="Studio name" name="name" required maxLength={120} error={fields.name} />
      <FormError error={m.error} />
      <button className="btn-primary" disabled={m.isPending}>Create studio</button>
    </form>
  );
}

export function RenameStudioForm({ studioId, name }: { studioId: string; name: string }) {
  const router = useRouter();
  const { fields, check } = useFieldCheck();
  const m = useRenameStudio(studioId);
  return (
    <form
      className="flex items-end gap-2"
      noValidate
      onSubmit={onStudioName(check, (body) => m.mutate(body, { onSuccess: () => router.refresh() }))}
    >
      <div className="flex-1"><Field label="Studio name" name="name" defaultValue={name} error={fields.name ?? (m.isError ? errorText(m.error) : undefined)} /></div>
      <button className="btn-quiet" disabled={m.isPending}>{m.isSuccess ? "Saved" : "Rename"}</button>
    </form>
  );
}

export function InviteForm({ studioId }: { studioId: string }) {
  const router = useRouter();
  const { fields, check } = useFieldCheck();
  const [sentTo, setSentTo] = useState<string | null>(null);
  const m = useInvite(studioId);
  return (
    <form
      className="space-y-3"
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        const f = new FormData(e.currentTarget);
        const parsed = check(inviteSchema, { email: f.get("email"), role: f.get("role") });
        if (!parsed) return;
        setSentTo(null);
        m.mutate(parsed, {
          onSuccess: (_d, v) => {
            setSentTo(v.email);
            router.refresh();
          },
        });
        e.currentTarget.reset();
      }}
    >
      <h2>Invite someone</h2>
      <Field label="E-mail" name="email" type="email" required error={fields.email} />
      <div>
        <label className="label" htmlFor="invite-role">Role</label>
        <Select id="invite-role" name="role" className="field" defaultValue={DEFAULT_INVITE_ROLE}>
          {ROLES.map((r) => <option key={r} value={r}>{r}</option>)}
        </Select>
        <p className="mt-1 text-xs text-muted">{rolesInWords()}</p>
      </div>
      <FormError error={m.error} />
      {sentTo && <Message kind="ok">Invitation sent to {sentTo}.</Message>}
      <button className="btn-primary" disabled={m.isPending}>Send invitation</button>
    </form>
  );
}

export function MemberControls({ studioId, userId, role, name }: { studioId: string; userId: string; role: Role; name: string }) {
  const router = useRouter();
  const change = useChangeRole(studioId, userId);
  const remove = useRemoveMember(studioId, userId);
  const refresh = { onSuccess: () => router.refresh() };
  const [asking, setAsking] = useState(false);
  return (
    <div className="flex flex-wrap items-center justify-start gap-2 sm:justify-end">
      <Select aria-label={`Role of ${name}`} className="field w-28 py-1" value={role} disabled={change.isPending} onChange={(e) => change.mutate(e.target.value as Role, refresh)}>
        {ROLES.map((r) => <option key={r} value={r}>{r}</option>)}
      </Select>
      <ConfirmDialog
        open={asking}
        onOpenChange={setAsking}
        title={`Remove ${name}?`}
        confirmLabel="Remove from studio"
        busy={remove.isPending}
        onConfirm={() => remove.mutate(undefined, { onSuccess: () => { setAsking(false); router.refresh(); } })}
        trigger={<button type="button" className="btn-danger py-1" disabled={remove.isPending}>Remove</button>}
      >
        <p>{name} loses access to this studio at once.</p>
      </ConfirmDialog>
      <FormError error={change.error ?? remove.error} compact className="basis-full text-right" />
    </div>
  );
}

export function RevokeInvitationButton({ studioId, invitationId, email }: { studioId: string; invitationId: string; email: string }) {
  const router = useRouter();
  const m = useRevokeInvitation(studioId, invitationId);
  return (
    <>
      <button type="button" className="btn-quiet py-1" aria-label={`Withdraw the invitation to ${email}`} disabled={m.isPending} onClick={() => m.mutate(undefined, { onSuccess: () => router.refresh() })}>
        Withdraw
      </button>
      <FormError error={m.error} compact className="ml-2" />
    </>
  );
}

export function AcceptInvitationButton({ token }: { token: string }) {
  const router = useRouter();
  const m = useAcceptInvitation(token);
  const accept = () =>
    m.mutate(undefined, {
      onSuccess: (out) => {
        router.push(`/s/${out.studioId}`);
        router.refresh();
      },
    });
  return (
    <div className="space-y-2">
      <button type="button" className="btn-primary" disabled={m.isPending} onClick={accept}>Accept invitation</button>
      <FormError error={m.error} />
    </div>
  );
}
