import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requireStudio } from "@/lib/server/session";
import { compareAudits } from "@/lib/server/kits/audits";
import { AppError } from "@/lib/server/errors";
import { OutcomeBadge } from "@/components/audit/outcome-icon";
import type { Outcome } from "@/lib/audit/types";

export const metadata: Metadata = { title: "Compare audits" };
const ID = /^[0-9a-f-]{36}$/i;

export default async function ComparePage({ params, searchParams }: { params: Promise<{ studioId: string }>; searchParams: Promise<{ before?: string; after?: string }> }) {
  const { studioId } = await params;
  const { before, after } = await searchParams;
  const { studio } = await requireStudio(studioId);
  if (!before || !after || !ID.test(before) || !ID.test(after)) notFound();
  let data;
  try {
    data = await compareAudits({ studioId: studio.id, before, after });
  } catch (e) {
    if (e instanceof AppError && e.status === 404) notFound();
    if (e instanceof AppError) return <p className="card text-bad">✕ {e.message}</p>;
    throw e;
  }
  const { diff: d } = data;
  const when = (s: string) => s.replace("T", " ").slice(0, 19);
  const sb = d.summaryBefore;
  const sa = d.summaryAfter;
  return (
    <div className="space-y-6">
      <p className="text-sm"><Link href={`/s/${studio.id}/audits?layoutId=${data.after.layoutId}`}>← Audits of “{data.after.layoutName}”</Link></p>
      <h2 className="text-xl">What changed in “{data.after.layoutName}”</h2>
      <div className="grid gap-4 md:grid-cols-3">
        <div className="card text-sm"><p className="text-muted">Before</p><p><Link href={`/s/${studio.id}/audits/${data.before.id}`} className="num">{when(data.before.createdAt)}</Link></p><p>kit {data.before.kitName}</p></div>
        <div className="card text-sm"><p className="text-muted">After</p><p><Link href={`/s/${studio.id}/audits/${data.after.id}`} className="num">{when(data.after.createdAt)}</Link></p><p>kit {data.after.kitName}</p></div>
        <div className="card text-sm" data-testid="compare-score"><p className="text-muted">Score</p><p className="num text-2xl font-semibold">{d.scoreBefore.toFixed(1)} → {d.scoreAfter.toFixed(1)}</p><p className="num">{d.scoreDelta > 0 ? "▲ +" : d.scoreDelta < 0 ? "▼ " : "= "}{d.scoreDelta.toFixed(1)}</p></div>
      </div>
      <div className="card table-scroll w-fit max-w-full"><table className="text-sm">
        <thead className="text-left text-muted"><tr><th className="pr-6 font-medium" /><th className="pr-6 font-medium">before</th><th className="font-medium">after</th></tr></thead>
        <tbody className="num">
          <tr><td className="pr-6">direct</td><td>{sb.direct}</td><td>{sa.direct}</td></tr>
          <tr><td className="pr-6">stand-in</td><td>{sb.standIn}</td><td>{sa.standIn}</td></tr>
          <tr><td className="pr-6">silent</td><td>{sb.silent}</td><td>{sa.silent}</td></tr>
          <tr><td className="pr-6">conflicts</td><td>{sb.conflicts}</td><td>{sa.conflicts}</td></tr>
        </tbody>
      </table></div>
      <section className="card space-y-2" data-testid="compare-changes">
        <h2>Changes ({d.changes.length})</h2>
        {d.changes.length === 0 ? <p className="text-sm text-muted">Every pad plays the same as before.</p> : (
          <div className="table-scroll"><table className="w-full text-sm">
            <thead className="text-left text-muted"><tr><th className="py-1 font-medium">Pad</th><th className="font-medium">Change</th><th className="font-medium">Before</th><th className="font-medium">After</th><th className="font-medium">Details</th></tr></thead>
            <tbody>
              {d.changes.map((c) => (
                <tr key={c.id} className="border-t border-line align-top">
                  <td className="py-1 pr-2">{c.label}</td>
                  <td className="pr-2">{c.change}</td>
                  <td className="pr-2">{c.before ? <><OutcomeBadge outcome={c.before.outcome as Outcome} /> {c.before.plays ?? ""}</> : "—"}</td>
                  <td className="pr-2">{c.after ? <><OutcomeBadge outcome={c.after.outcome as Outcome} /> {c.after.plays ?? ""}</> : "—"}</td>
                  <td>{c.details.join("; ")}</td>
                </tr>
              ))}
            </tbody>
          </table></div>
        )}
      </section>
      {(d.conflictsAdded.length > 0 || d.conflictsResolved.length > 0) && (
        <section className="card space-y-1 text-sm">
          <h2>Conflicts</h2>
          {d.conflictsResolved.map((c, i) => <p key={`r${i}`}>✓ resolved: {c.message}</p>)}
          {d.conflictsAdded.map((c, i) => <p key={`a${i}`} className="text-warn">⚠ new: {c.message}</p>)}
        </section>
      )}
    </div>
  );
}
