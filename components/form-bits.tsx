"use client";
// Small form building blocks shared by every form: a labelled field, a message line, and the one way a form
// shows a write that failed. Every write is a mutation hook of components/data: the form disables its button
// while `m.isPending` and shows `<FormError error={m.error} />` (nothing when there is no error); its fields are
// checked first with the shared zod schema through `useFieldCheck`.
import { useCallback, useState, type InputHTMLAttributes } from "react";
import type { z } from "zod";
import { ApiError } from "./data/api";

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

/**
 * A form's check with its shared zod schema: `check(schema, values)` returns the parsed values, or null after
 * setting `fields` to each field's first message (cleared on the next good check).
 */
export function useFieldCheck() {
  const [fields, setFields] = useState<Record<string, string>>({});
  const check = useCallback(<S extends z.ZodType>(schema: S, values: unknown): z.output<S> | null => {
    const parsed = schema.safeParse(values);
    setFields(parsed.success ? {} : fieldErrors(parsed.error.issues));
    return parsed.success ? parsed.data : null;
  }, []);
  return { fields, check };
}

/** The words for a failed write: the server's message, or `fallback` when no answer came (network, crash). */
export function errorText(error: unknown, fallback = "Something went wrong; try again."): string {
  return error instanceof ApiError ? error.message : fallback;
}

/**
 * A failed write, in words: a message box, or with `compact` a small line for controls inside a row.
 * Renders nothing while there is no error.
 */
export function FormError({ error, fallback, compact = false, className = "" }: { error: unknown; fallback?: string; compact?: boolean; className?: string }) {
  if (!error) return null;
  if (compact) return <span role="alert" className={`text-xs text-bad ${className}`}>{errorText(error, fallback)}</span>;
  return <Message kind="error">{errorText(error, fallback)}</Message>;
}
