import type { Metadata } from "next";
import Link from "next/link";
import { requireStudio } from "@/lib/server/session";
import { listMembers } from "@/lib/server/studios";
import { studioOverview } from "@/lib/server/overview";
import { can, PERMISSION_INFO, ROLE_PERMISSIONS } from "@/lib/permissions";
import { RenameStudioForm } from "@/components/studio-forms";
import { ReadOnlyValue, ViewOnlyNote } from "@/components/view-only";
import { NextStepSlot } from "@/app/(app)/s/[studioId]/next-step-slot";

export const metadata: Metadata = { title: "Studio" };

export default async function StudioOverview({ params }: { params: Promise<{ studioId: string }> }) {
  const { studioId } = await params;
  const { studio } = await requireStudio(studioId);
  const [members, o] = await Promise.all([listMembers({ studioId: studio.id }), studioOverview({ studioId: studio.id })]);
  const base = `/s/${studio.id}`;
  return (
    <>
    <NextStepSlot studio={studio} always />
    <div className="grid grid-cols-1 gap-6 lg:grid-cols-3">
      <section className="card space-y-3 lg:col-span-2" data-testid="overview-libraries">
        <div className="flex items-baseline justify-between">
          <h2>Libraries</h2>
          <Link href={`${base}/libraries`} className="text-sm">All libraries</Link>
        </div>
        {o.libraries.length === 0 ? (
          <p className="text-sm text-muted">No library yet.{can(studio.role, "studio:write") ? " Create one and drop your WAV files or a zipped pack on it." : ""}</p>
        ) : (
          <div className="table-scroll"><table className="w-full text-sm">
            <thead className="text-left text-muted"><tr><th className="py-1 font-medium">Name</th><th className="py-1 pl-3 text-right font-medium">Samples</th><th className="py-1 pl-3 text-right font-medium">Catalogued</th><th className="py-1 pl-3 text-right font-medium">Waiting</th><th className="py-1 pl-3 text-right font-medium">Refused</th></tr></thead>
            <tbody>
              {o.libraries.map((l) => (
                <tr key={l.id} className="border-t border-line">
                  <td className="py-1.5"><Link href={`${base}/libraries/${l.id}`}>{l.name}</Link></td>
                  <td className="num py-1.5 pl-3 text-right">{l.total}</td>
                  <td className="num py-1.5 pl-3 text-right">{l.catalogued}</td>
                  <td className="num py-1.5 pl-3 text-right">{l.pending}</td>
                  <td className="num py-1.5 pl-3 text-right">{l.rejected}</td>
                </tr>
              ))}
            </tbody>
          </table></div>
        )}
      </section>

      <section className="card space-y-3">
        <h2>Kits and layouts</h2>
        <p className="text-sm"><Link href={`${base}/kits`}><span className="num">{o.kits}</span> {o.kits === 1 ? "kit" : "kits"}</Link> · <Link href={`${base}/layouts`}><span className="num">{o.layouts}</span> {o.layouts === 1 ? "layout" : "layouts"}</Link></p>
        <h3 className="pt-2 text-sm font-semibold">Latest audits</h3>
        {o.audits.length === 0 ? (
          <p className="text-sm text-muted">No audit yet.</p>
        ) : (
          <ul className="space-y-1 text-sm">
            {o.audits.map((a) => (
              <li key={a.id} className="flex justify-between gap-2">
                <Link href={`${base}/audits/${a.id}`}>{a.layoutName} × {a.kitName}</Link>
                <span className="num whitespace-nowrap">{a.score}/100{a.silentPads > 0 && <span className="text-bad"> · {a.silentPads} silent</span>}</span>
              </li>
            ))}
          </ul>
        )}
      </section>

      <section className="card space-y-3">
        <h2>Your role: {studio.role}</h2>
        <ul className="list-disc space-y-1 pl-5 text-sm" data-testid="my-permissions">
          {ROLE_PERMISSIONS[studio.role].map((p) => <li key={p}>{PERMISSION_INFO[p].description}</li>)}
        </ul>
      </section>
      <section className="card space-y-3 lg:col-span-2">
        <h2>Members</h2>
        <p className="text-sm"><span className="num">{members.length}</span> {members.length === 1 ? "person" : "people"}: {members.map((m) => `${m.name} (${m.role})`).join(", ")}</p>
        {can(studio.role, "studio:manage") ? <RenameStudioForm studioId={studio.id} name={studio.name} /> : (
          <div className="space-y-2" data-testid="studio-settings-view">
            <dl><ReadOnlyValue label="Studio name">{studio.name}</ReadOnlyValue></dl>
            <ViewOnlyNote what="the studio's name" permission="studio:manage" />
          </div>
        )}
      </section>
    </div>
    </>
  );
}
