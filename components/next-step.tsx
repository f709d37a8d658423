"use client";
// The studio's next step (lib/next-step.ts, computed by the page on the server): where the studio stands on the
// way library → samples → kit → layout → audit, what to do next, and the one button that does it (a link, or
// running the audit itself).
import Link from "next/link";
import { useRouter } from "next/navigation";
import { FormError } from "@/components/form-bits";
import { useRunAudit } from "@/components/data/audits";
import { STEP_NAMES, type NextStep } from "@/lib/next-step";

export function NextStepCard({ studioId, step, compact = false }: { studioId: string; step: NextStep; compact?: boolean }) {
  const done = step.key === "done";
  return (
    <section className="card no-print space-y-3 border-l-4 border-l-brand" aria-labelledby="next-step-title" data-testid="next-step" data-step={step.key}>
      {!compact && <StepTrail number={step.number} />}
      <div className="flex flex-wrap items-center justify-between gap-3">
        <div className="min-w-0 space-y-1">
          <p className="text-xs font-medium uppercase tracking-wide text-muted">{done ? "All five steps done" : `Next step · ${step.number} of ${STEP_NAMES.length}`}</p>
          <h2 id="next-step-title">{step.title}</h2>
          <p className="max-w-3xl text-sm text-muted">{step.text}</p>
        </div>
        {step.action?.kind === "link" && <Link href={step.action.href} className={done ? "btn-quiet" : "btn-primary"} data-testid="next-step-action">{step.action.label} →</Link>}
        {step.action?.kind === "audit" && <AuditNow studioId={studioId} layoutId={step.action.layoutId} kitId={step.action.kitId} label={step.action.label} />}
      </div>
    </section>
  );
}

/** The five steps in a row: done ones ticked, the current one marked (in words for screen readers, not colour alone). */
function StepTrail({ number }: { number: number }) {
  return (
    <ol className="flex flex-wrap gap-x-4 gap-y-1 text-xs" aria-label="Getting started">
      {STEP_NAMES.map((name, i) => {
        const n = i + 1;
        const state = n < number ? "done" : n === number ? "current" : "later";
        return (
          <li key={name} className={`flex items-center gap-1 ${state === "later" ? "text-muted" : state === "current" ? "font-semibold text-brand" : "text-ink"}`} aria-current={state === "current" ? "step" : undefined}>
            <span aria-hidden className={`inline-flex h-5 w-5 items-center justify-center rounded-full border text-[11px] ${state === "done" ? "border-brand bg-brand text-white" : state === "current" ? "border-brand" : "border-line"}`}>{state === "done" ? "✓" : n}</span>
            {name}
            {state === "done" && <span className="sr-only"> (done)</span>}
          </li>
        );
      })}
    </ol>
  );
}

function AuditNow({ studioId, layoutId, kitId, label }: { studioId: string; layoutId: string; kitId: string; label: string }) {
  const router = useRouter();
  const run = useRunAudit(studioId);
  // stays busy after success until the audit's page replaces this one
  const busy = run.isPending || run.isSuccess;
  return (
    <div className="space-y-1">
      <button type="button" className="btn-primary" disabled={busy} data-testid="next-step-action"
        onClick={() => run.mutate({ layoutId, kitId }, { onSuccess: (a) => router.push(`/s/${studioId}/audits/${a.id}`) })}>
        {busy ? "Auditing…" : `${label} →`}
      </button>
      <FormError error={run.error} compact />
    </div>
  );
}
