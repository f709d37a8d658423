"use client";
// Small form building blocks shared by every form: a labelled field and a message line.
import type { InputHTMLAttributes } from "react";

export function Field({ label, hint, error, ...input }: InputHTMLAttributes<HTMLInputElement> & { label: string; hint?: string; error?: string }) {
  const id = input.id ?? input.name;
  return (
    <div>
      <label htmlFor={id} className="label">{label}</label>
      <input id={id} className="field" aria-invalid={!!error} aria-describedby={error ? `${id}-err` : undefined} {...input} />
      {hint && !error && <p className="mt-1 text-xs text-muted">{hint}</p>}
      {error && <p id={`${id}-err`} className="mt-1 text-xs text-bad">{error}</p>}
    </div>
  );
}

export function Message({ kind, children }: { kind: "error" | "ok" | "info"; children: React.ReactNode }) {
  const cls = kind === "error" ? "border-bad/30 bg-bad-soft text-bad" : kind === "ok" ? "border-good/30 bg-good-soft text-good" : "border-line bg-paper text-ink";
  return (
    <p role={kind === "error" ? "alert" : "status"} className={`rounded-md border px-3 py-2 text-sm ${cls}`}>
      {children}
    </p>
  );
}

/** zod issues to a field -> message map (first message per field). */
export function fieldErrors(issues: { path: PropertyKey[]; message: string }[]): Record<string, string> {
  const out: Record<string, string> = {};
  for (const i of issues) {
    const k = String(i.path[0] ?? "");
    if (!(k in out)) out[k] = i.message;
  }
  return out;
}
