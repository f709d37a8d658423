"use client";
// The account page's personal API tokens: make one (for one studio, a role at most mine there, a lifetime), see
// its secret once, list mine with their last use, revoke one. Reads and writes through components/data/tokens.
import { useState } from "react";
import { Field, FormError, Message, fieldErrors } from "../form-bits";
import { useApiTokens, useCreateApiToken, useRevokeApiToken } from "../data/tokens";
import { createTokenSchema, TOKEN_LIFETIMES_DAYS } from "@/lib/validation/token";
import { ROLES, roleWithin, type Role } from "@/lib/permissions";
import type { ApiTokenSummary } from "@/lib/api-types/tokens";
import { Select } from "@/components/ui/select";

const day = (iso: string | null) => (iso ? iso.slice(0, 10) : "");
const when = (iso: string | null) => (iso ? iso.replace("T", " ").slice(0, 16) : "");

export function ApiTokens({ studios }: { studios: { id: string; name: string; role: Role }[] }) {
  return (
    <div className="space-y-6">
      <CreateTokenForm studios={studios} />
      <TokenList />
    </div>
  );
}

function CreateTokenForm({ studios }: { studios: { id: string; name: string; role: Role }[] }) {
  const [fields, setFields] = useState<Record<string, string>>({});
  const [studioId, setStudioId] = useState(studios[0]?.id ?? "");
  const [copied, setCopied] = useState(false);
  const m = useCreateApiToken();
  const mine = studios.find((s) => s.id === studioId)?.role ?? null;
  const roles = ROLES.filter((r) => mine && roleWithin(r, mine));
  if (!studios.length) return <p className="card text-sm">Join or create a studio first: a token works in one studio.</p>;
  return (
    <form
      className="card space-y-3"
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        const form = e.currentTarget;
        const f = new FormData(form);
        const lifetime = String(f.get("expiresInDays") ?? "");
        const parsed = createTokenSchema.safeParse({ name: f.get("name"), studioId: f.get("studioId"), role: f.get("role"), expiresInDays: lifetime === "never" ? null : Number(lifetime) });
        if (!parsed.success) return setFields(fieldErrors(parsed.error.issues));
        setFields({});
        setCopied(false);
        m.mutate(parsed.data, { onSuccess: () => form.reset() });
      }}
    >
      <h2>New API token</h2>
      <p className="text-sm text-muted">
        A token lets a script (such as <code>kitwright upload</code>) act for you in one studio, with a role no higher than yours there.
        Every use is written to that studio&apos;s activity log.
      </p>
      <div className="grid grid-cols-1 gap-3 sm:grid-cols-2">
        <Field label="Name" name="name" required maxLength={120} placeholder="e.g. nightly build" error={fields.name} />
        <div>
          <label htmlFor="token-studio" className="label">Studio</label>
          <Select id="token-studio" name="studioId" className="field" value={studioId} onChange={(e) => setStudioId(e.target.value)}>
            {studios.map((s) => <option key={s.id} value={s.id}>{s.name} (you: {s.role})</option>)}
          </Select>
        </div>
        <div>
          <label htmlFor="token-role" className="label">Role of the token</label>
          <Select id="token-role" name="role" className="field" key={studioId} defaultValue={roles.includes("editor") ? "editor" : roles[roles.length - 1]}>
            {roles.map((r) => <option key={r} value={r}>{r}</option>)}
          </Select>
          {fields.role && <p className="mt-1 text-xs text-bad">{fields.role}</p>}
        </div>
        <div>
          <label htmlFor="token-lifetime" className="label">Works for</label>
          <Select id="token-lifetime" name="expiresInDays" className="field" defaultValue="90">
            {TOKEN_LIFETIMES_DAYS.map((d) => <option key={d} value={d}>{d} days</option>)}
            <option value="never">until revoked</option>
          </Select>
        </div>
      </div>
      <FormError error={m.error} />
      <button className="btn-primary" disabled={m.isPending}>Make token</button>
      {m.data && (
        <div className="space-y-2" data-testid="new-token">
          <Message kind="ok">
            Token &ldquo;{m.data.token.name}&rdquo; made. Copy it now: it is shown only this once (Kitwright keeps only a fingerprint of it).
          </Message>
          <div className="flex items-center gap-2">
            <code className="num flex-1 break-all rounded border border-line bg-paper px-3 py-2 text-sm" data-testid="new-token-secret">{m.data.secret}</code>
            <button
              type="button"
              className="btn-quiet"
              onClick={() => void navigator.clipboard?.writeText(m.data!.secret).then(() => setCopied(true), () => setCopied(false))}
            >
              {copied ? "Copied" : "Copy"}
            </button>
          </div>
          <p className="text-xs text-muted">Use it as <code>KITWRIGHT_TOKEN=&lt;token&gt; npx kitwright upload &lt;folder&gt; --library &lt;id&gt; --server &lt;address&gt;</code>.</p>
        </div>
      )}
    </form>
  );
}

function TokenList() {
  const q = useApiTokens();
  if (q.isPending) return <p className="text-sm text-muted">Loading your tokens…</p>;
  if (q.isError) return <FormError error={q.error} fallback="Your tokens could not be read; reload the page." />;
  if (!q.data.length) return <p className="card text-sm" data-testid="tokens-none">You have no API tokens.</p>;
  return (
    <section className="card overflow-x-auto p-0">
      <table className="w-full text-sm" data-testid="tokens-table">
        <caption className="px-5 pt-4 text-left font-semibold">Your API tokens</caption>
        <thead className="text-left text-muted">
          <tr>
            <th className="px-5 py-2 font-medium">Name</th>
            <th className="px-2 py-2 font-medium">Studio</th>
            <th className="px-2 py-2 font-medium">Role</th>
            <th className="px-2 py-2 font-medium">Starts</th>
            <th className="px-2 py-2 font-medium">Made</th>
            <th className="px-2 py-2 font-medium">Last used (UTC)</th>
            <th className="px-2 py-2 font-medium">Works until</th>
            <th className="px-5 py-2 font-medium"><span className="sr-only">Actions</span></th>
          </tr>
        </thead>
        <tbody>{q.data.map((t) => <TokenRow key={t.id} t={t} />)}</tbody>
      </table>
    </section>
  );
}

function TokenRow({ t }: { t: ApiTokenSummary }) {
  const revoke = useRevokeApiToken(t.id);
  const expired = !t.revokedAt && t.expiresAt !== null && new Date(t.expiresAt).getTime() <= Date.now();
  return (
    <tr className="border-t border-line" data-testid="token-row" data-token-name={t.name}>
      <td className="px-5 py-2 font-medium">{t.name}</td>
      <td className="px-2 py-2">{t.studioName}</td>
      <td className="px-2 py-2">
        {t.role}
        {t.effectiveRole !== t.role && <span className="block text-xs text-warn">{t.effectiveRole ? `acts as ${t.effectiveRole} (your role now)` : "acts as nobody: you left the studio"}</span>}
      </td>
      <td className="num px-2 py-2">{t.hint}…</td>
      <td className="num px-2 py-2">{day(t.createdAt)}</td>
      <td className="num px-2 py-2" data-testid="token-last-used">{t.lastUsedAt ? when(t.lastUsedAt) : "never"}</td>
      <td className="num px-2 py-2">{t.revokedAt ? "" : t.expiresAt ? day(t.expiresAt) : "until revoked"}</td>
      <td className="px-5 py-2 text-right">
        {t.revokedAt ? (
          <span className="tag border-line text-muted" data-testid="token-state">Revoked {day(t.revokedAt)}</span>
        ) : expired ? (
          <span className="tag border-line text-muted" data-testid="token-state">Expired</span>
        ) : (
          <>
            <button
              type="button"
              className="btn-danger py-1"
              disabled={revoke.isPending}
              onClick={() => {
                if (window.confirm(`Revoke the token "${t.name}"? Scripts using it stop working at once.`)) revoke.mutate();
              }}
            >
              Revoke
            </button>
            <FormError error={revoke.error} compact className="block" />
          </>
        )}
      </td>
    </tr>
  );
}
