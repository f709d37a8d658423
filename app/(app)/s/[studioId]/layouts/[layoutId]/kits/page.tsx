import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requireStudio } from "@/lib/server/session";
import { kitMatrix } from "@/lib/server/kits/kit-matrix";
import { AppError } from "@/lib/server/errors";

export const metadata: Metadata = { title: "Layout on every kit" };

export default async function KitMatrixPage({ params }: { params: Promise<{ studioId: string; layoutId: string }> }) {
  const { studioId, layoutId } = await params;
  const { studio } = await requireStudio(studioId);
  if (!/^[0-9a-f-]{36}$/i.test(layoutId)) notFound();
  const m = await kitMatrix({ studioId: studio.id, layoutId }).catch((e) => { if (e instanceof AppError && e.status === 404) notFound(); throw e; });
  return (
    <div className="space-y-4">
      <p className="text-sm"><Link href={`/s/${studio.id}/layouts/${layoutId}`}>← {m.layoutName}</Link></p>
      <div>
        <h2 className="text-xl">Which kit suits &ldquo;{m.layoutName}&rdquo;?</h2>
        <p className="text-sm text-muted">The layout audited against every kit of the studio, best first. Nothing is saved until you open a full audit.</p>
      </div>
      {m.kits.length === 0 ? <p className="card text-sm">No kits yet — <Link href={`/s/${studio.id}/kits`}>make a kit</Link> to see how this layout plays on it.</p> : (
        <section className="card overflow-x-auto p-0">
          <table className="w-full text-sm" data-testid="kit-matrix">
            <thead className="text-left text-muted"><tr><th className="px-4 py-2 font-medium">Kit</th><th className="px-2 py-2 font-medium">Score</th><th className="px-2 py-2 font-medium">Plays as asked</th><th className="px-2 py-2 font-medium">Stand-ins</th><th className="px-2 py-2 font-medium">Silent</th><th className="px-4 py-2 font-medium"><span className="sr-only">Audit</span></th></tr></thead>
            <tbody>
              {m.kits.map((k) => (
                <tr key={k.kitId} className="border-t border-line" data-testid="kit-matrix-row">
                  <td className="px-4 py-2"><Link href={`/s/${studio.id}/kits/${k.kitId}`}>{k.kitName}</Link></td>
                  <td className="px-2 py-2">
                    <div className="flex items-center gap-2">
                      <div className="h-2 w-24 overflow-hidden rounded bg-paper" aria-hidden><div className="h-full bg-brand" style={{ width: `${Math.max(0, Math.min(100, k.score))}%` }} /></div>
                      <span className="num">{Math.round(k.score)}/100</span>
                    </div>
                  </td>
                  <td className="num px-2 py-2">{k.direct} of {k.pads}</td>
                  <td className="num px-2 py-2">{k.standIn}</td>
                  <td className={`num px-2 py-2 ${k.silent ? "font-semibold text-bad" : ""}`}>{k.silent}{k.pedalZonesSilent ? ` + ${k.pedalZonesSilent} pedal zone${k.pedalZonesSilent > 1 ? "s" : ""}` : ""}</td>
                  <td className="px-4 py-2"><Link href={`/s/${studio.id}/audits?layoutId=${layoutId}&kitId=${k.kitId}`}>Full audit</Link></td>
                </tr>
              ))}
            </tbody>
          </table>
        </section>
      )}
    </div>
  );
}
