"use client";
// A file input that looks like our buttons: the real <input type="file"> stays in the page (visually hidden,
// still labelled and focusable), a button-styled label opens it, and the chosen file's name is shown as is.
import { useState, type InputHTMLAttributes } from "react";

export function FilePicker({ id, label, buttonText = "Choose a file…", hint, onChange, ...input }: InputHTMLAttributes<HTMLInputElement> & { id: string; label: string; buttonText?: string; hint?: string }) {
  const [picked, setPicked] = useState<string | null>(null);
  return (
    <div>
      <span className="label" id={`${id}-label`}>{label}</span>
      <div className="flex flex-wrap items-center gap-2">
        <input
          id={id}
          type="file"
          aria-labelledby={`${id}-label`}
          className="peer sr-only"
          {...input}
          onChange={(e) => {
            setPicked(e.target.files?.[0]?.name ?? null);
            onChange?.(e);
          }}
        />
        <label htmlFor={id} className="btn-quiet cursor-pointer peer-focus-visible:outline-2 peer-focus-visible:outline-offset-2 peer-focus-visible:outline-brand peer-disabled:cursor-not-allowed peer-disabled:opacity-50">
          <svg viewBox="0 0 16 16" className="h-4 w-4" fill="none" stroke="currentColor" strokeWidth="1.6" aria-hidden><path d="M8 11V3M4.5 6.5L8 3l3.5 3.5M3 13h10" /></svg>
          {buttonText}
        </label>
        <span className="min-w-0 break-all text-sm text-muted" aria-live="polite">{picked ?? "no file chosen"}</span>
      </div>
      {hint && <p className="mt-1 text-xs text-muted">{hint}</p>}
    </div>
  );
}
