// What a member who may not change a thing sees instead of inputs: a "view only" note saying who can change it,
// and values shown as plain text (never disabled inputs that look editable).
import type { ReactNode } from "react";
import { whoCan, type Permission } from "@/lib/permissions";

export function ViewOnlyNote({ what, permission = "studio:write", className = "" }: { what: string; permission?: Permission; className?: string }) {
  return (
    <p role="note" className={`text-sm text-muted ${className}`} data-testid="view-only-note">
      <span className="tag mr-2 border-line bg-paper text-ink">view only</span>
      {whoCan(permission, { capital: true })} can change {what}.
    </p>
  );
}

/** A read-only value with its label, laid out like a form field's label and value. */
export function ReadOnlyValue({ label, children, testId, className }: { label: string; children: ReactNode; testId?: string; className?: string }) {
  return (
    <div className={className}>
      <dt className="label text-muted">{label}</dt>
      <dd className="text-sm" data-testid={testId}>{children}</dd>
    </div>
  );
}
