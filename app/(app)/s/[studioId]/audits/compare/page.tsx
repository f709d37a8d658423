import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requireStudio } from "@/lib/server/session";
import { compareAudits } from "@/lib/server/kits/audits";
import { AppError } from "@/lib/server/errors";
import { OutcomeBadge } from "@/components/audit/outcome-icon";
import type { Articulation, Outcome } from "@/lib/audit/types";
import { conflictTitle, strokeName } from "@/components/audit/words";

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
  const when = (s: string) => s.replace("T", " ").slice(0, 16);
  const sb = d.summaryBefore;
  const sa = d.summaryAfter;
  const delta = d.scoreDelta > 0 ? `▲ ${d.scoreDelta} point${d.scoreDelta === 1 ? "" : "s"} better` : d.scoreDelta < 0 ? `▼ ${-d.scoreDelta} point${d.scoreDelta === -1 ? "" : "s"} worse` : "= the same score";
  const side = (o: Outcome, plays: string | null) => <span className="inline-flex flex-wrap items-center gap-1"><OutcomeBadge outcome={o} />{plays && o !== "silent" ? <span>{strokeName(null, plays as Articulation)}</span> : null}</span>;
  return (
    <div className="space-y-6">
      <p className="text-sm"><Link href={`/s/${studio.id}/audits?layoutId=${data.after.layoutId}`}>← Audits of “{data.after.layoutName}”</Link></p>
      <h2 className="text-xl [overflow-wrap:anywhere]">What changed in “{data.after.layoutName}”</h2>
      <div className="grid grid-cols-1 gap-4 md:grid-cols-3">
        <div className="card space-y-1 text-sm" data-testid="compare-before"><p className="text-muted">Before</p><p><Link href={`/s/${studio.id}/audits/${data.before.id}`} className="num">{when(data.before.createdAt)}</Link> UTC</p><p>Kit “{data.before.kitName}”</p><p className="num text-lg font-semibold">{d.scoreBefore}/100</p><p className="text-muted">{d.sentenceBefore}</p></div>
        <div className="card space-y-1 text-sm" data-testid="compare-after"><p className="text-muted">After</p><p><Link href={`/s/${studio.id}/audits/${data.after.id}`} className="num">{when(data.after.createdAt)}</Link> UTC</p><p>Kit “{data.after.kitName}”</p><p className="num text-lg font-semibold">{d.scoreAfter}/100</p><p className="text-muted">{d.sentenceAfter}</p></div>
        <div className="card text-sm" data-testid="compare-score"><p className="text-muted">Score</p><p className="num text-2xl font-semibold">{d.scoreBefore}/100 → {d.scoreAfter}/100</p><p>{delta}</p>
          <table className="mt-3 text-sm">
            <thead className="text-left text-muted"><tr><th className="pr-6 font-medium"><span className="sr-only">Pads</span></th><th className="pr-6 font-medium">before</th><th className="font-medium">after</th></tr></thead>
            <tbody className="num">
              <tr><td className="pr-6 font-sans">as recorded</td><td>{sb.direct}</td><td>{sa.direct}</td></tr>
              <tr><td className="pr-6 font-sans">stand-ins</td><td>{sb.standIn}</td><td>{sa.standIn}</td></tr>
              <tr><td className="pr-6 font-sans">silent</td><td>{sb.silent}</td><td>{sa.silent}</td></tr>
              <tr><td className="pr-6 font-sans">problems</td><td>{sb.conflicts}</td><td>{sa.conflicts}</td></tr>
            </tbody>
          </table>
        </div>
      </div>
      {(d.emptySlotsFilled.length > 0 || d.emptySlotsAdded.length > 0) && (
        <section className="card space-y-1 text-sm" data-testid="compare-empty-slots">
          <h2>Empty slots</h2>
          {d.emptySlotsFilled.length > 0 && <p>✓ Filled now: {d.emptySlotsFilled.map((g) => g.slotName).join(", ")}</p>}
          {d.emptySlotsAdded.length > 0 && <p className="text-bad">✕ Empty now: {d.emptySlotsAdded.map((g) => g.slotName).join(", ")}</p>}
        </section>
      )}
      <section className="card space-y-2" data-testid="compare-changes">
        <h2>Pads that play differently ({d.changes.length})</h2>
        {d.changes.length === 0 ? <p className="text-sm text-muted">Every pad plays the same as before.</p> : (
          <table className="block w-full text-sm md:table">
            <thead className="hidden text-left text-muted md:table-header-group"><tr><th className="py-1 font-medium">Pad</th><th className="font-medium">Before</th><th className="font-medium">After</th><th className="font-medium">What changed</th></tr></thead>
            <tbody className="block md:table-row-group">
              {d.changes.map((c) => (
                <tr key={c.id} className="block border-t border-line py-2 align-top md:table-row md:py-0" data-change={c.id}>
                  <td className="block py-1 pr-2 font-medium md:table-cell">{c.label}{c.change !== "changed" && <span className="ml-1 text-xs font-normal text-muted">{c.change === "added" ? "new pad" : "pad removed"}</span>}</td>
                  <td className="block py-1 pr-2 md:table-cell"><span className="mr-1 text-xs text-muted md:hidden">Before:</span>{c.before ? side(c.before.outcome as Outcome, c.before.plays) : "—"}</td>
                  <td className="block py-1 pr-2 md:table-cell"><span className="mr-1 text-xs text-muted md:hidden">After:</span>{c.after ? side(c.after.outcome as Outcome, c.after.plays) : "—"}</td>
                  <td className="block py-1 md:table-cell">{c.details.map(detailInWords).filter(Boolean).join("; ")}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
      {(d.conflictsAdded.length > 0 || d.conflictsResolved.length > 0) && (
        <section className="card space-y-1 text-sm">
          <h2>Problems in the layout or the kit</h2>
          {d.conflictsResolved.map((c, i) => <p key={`r${i}`}>✓ solved: {conflictTitle(c)}: {c.message.replace(/ -> /g, " → ")}</p>)}
          {d.conflictsAdded.map((c, i) => <p key={`a${i}`} className="text-warn">⚠ new: {conflictTitle(c)}: {c.message.replace(/ -> /g, " → ")}</p>)}
        </section>
      )}
    </div>
  );
}

/** A difference of diffAudits in a drummer's words (outcome and stroke are shown by the badges beside it). */
function detailInWords(d: string, _i: number, all: string[]): string {
  const was = (what: string) => all.some((x) => x.startsWith(`${what} `));
  const fromSilence = all.some((x) => x.startsWith("outcome silent "));
  const toSilence = all.some((x) => / -> silent$/.test(x) && x.startsWith("outcome "));
  const m = /^(outcome|plays|instrument|path|layers|velocity gaps|round robins) (.*) -> (.*)$/.exec(d);
  if (!m) return d;
  const [, what, a, b] = m as unknown as [string, string, string, string];
  const dash = (x: string) => x.replace(/(\d)-(\d)/g, "$1–$2");
  if (what === "outcome" || what === "plays") return "";
  if (what === "path") return "another stand-in answers";
  if (what === "instrument") return `instrument ${a} → ${b}`;
  // a pad that starts or stops sounding: its layers say the rest
  if ((fromSilence || toSilence) && (what === "velocity gaps" || what === "round robins")) return "";
  if (what === "layers") return fromSilence ? `now ${b} velocity layer${b === "1" ? "" : "s"}${was("velocity gaps") && / -> none$/.test(all.find((x) => x.startsWith("velocity gaps "))!) ? ", every velocity covered" : ""}` : toSilence ? "" : `velocity layers ${a} → ${b}`;
  if (what === "velocity gaps") return b === "none" ? `velocities ${dash(a)} now sound` : a === "none" ? `nothing sounds at ${dash(b)} now` : `velocities with no sound: ${dash(a)} → ${dash(b)}`;
  return `round robins ${a} → ${b}`;
}
