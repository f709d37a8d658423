import type { Metadata } from "next";
import Link from "next/link";
import { requireStudio } from "@/lib/server/session";
import { listActivity } from "@/lib/server/activity";
import { can } from "@/lib/permissions";
import { NotAllowed } from "@/components/not-allowed";

export const metadata: Metadata = { title: "Activity" };

function describe(action: string, d: Record<string, unknown> | null): string {
  const s = (k: string) => String(d?.[k] ?? "");
  switch (action) {
    case "studio.created": return `created the studio "${s("name")}"`;
    case "studio.renamed": return `renamed the studio from "${s("from")}" to "${s("to")}"`;
    case "invitation.sent": return `invited ${s("email")} as ${s("role")}`;
    case "invitation.revoked": return `withdrew the invitation to ${s("email")}`;
    case "invitation.accepted": return `joined as ${s("role")} (${s("email")})`;
    case "member.role-changed": return `changed a member's role from ${s("from")} to ${s("to")}`;
    case "member.removed": return `removed ${s("email")} (${s("role")})`;
    case "kit.created": return `created the kit "${s("name")}"`;
    case "kit.renamed": return `renamed the kit "${s("from")}" to "${s("to")}"`;
    case "kit.updated": return `changed the slots of the kit "${s("name")}"`;
    case "kit.deleted": return `deleted the kit "${s("name")}"`;
    case "layout.created": return `created the layout "${s("name")}"`;
    case "layout.imported": return `imported the layout "${s("name")}"`;
    case "layout.renamed": return `renamed the layout "${s("from")}" to "${s("to")}"`;
    case "layout.updated": return `edited the pads of the layout "${s("name")}"`;
    case "layout.deleted": return `deleted the layout "${s("name")}"`;
    case "layout.published": return `published the layout "${s("name")}" at a share link`;
    case "layout.unpublished": return `revoked the share link of the layout "${s("name")}"`;
    case "layout.imported-shared": return `imported the shared layout "${s("name")}"`;
    case "audit.run": return `audited "${s("layout")}" against "${s("kit")}" (score ${s("score")}, ${s("silent")} silent pads)`;
    case "library.created": return `created the library "${s("name")}"`;
    case "library.renamed": return `renamed the library "${s("from")}" to "${s("to")}"`;
    case "library.curve-changed": return `mapped the library "${s("name")}" with the ${s("to") === "dannenberg" ? "Dannenberg" : "square-law (DLS)"} velocity curve`;
    case "library.described": return `changed the description of the library "${s("name")}"`;
    case "library.deleted": return `deleted the library "${s("name")}" (${s("samples")} samples)`;
    case "samples.uploaded": return `uploaded to "${s("library")}": ${s("queued")} queued, ${s("duplicate")} duplicates, ${s("refused")} refused`;
    case "samples.relabelled": return `relabelled ${s("count")} samples (${Object.entries((d?.set as Record<string, unknown>) ?? {}).map(([k, v]) => `${k}: ${v ?? "none"}`).join(", ")})`;
    case "samples.confirmed": return `confirmed the labels of ${s("count")} samples`;
    case "instrument.renamed": return `renamed the instrument "${s("from")}" to "${s("to")}"`;
    case "instruments.merged": return `merged ${((d?.from as string[]) ?? []).join(", ")} into "${s("into")}" (${s("samples")} samples)`;
    case "token.created": return `made the API token "${s("name")}" (${s("role")})`;
    case "token.revoked": return `revoked the API token "${s("name")}"`;
    case "token.used": return `used the API token "${s("name")}": ${s("method")} ${s("path")} answered ${s("status")}`;
    default: return `${action}${d ? ` ${JSON.stringify(d)}` : ""}`;
  }
}

export default async function ActivityPage({ params, searchParams }: { params: Promise<{ studioId: string }>; searchParams: Promise<{ before?: string }> }) {
  const { studioId } = await params;
  const { before } = await searchParams;
  const { studio } = await requireStudio(studioId);
  if (!can(studio.role, "activity:read")) return <NotAllowed permission="activity:read" role={studio.role} />;
  const limit = 50;
  const beforeId = before && /^\d+$/.test(before) ? Number(before) : undefined;
  const entries = await listActivity({ studioId: studio.id, before: beforeId, limit });
  return (
    <section className="card table-scroll p-0">
      <table className="table-stack w-full text-sm" data-testid="activity-table">
        <caption className="px-5 pt-4 text-left font-semibold">Activity log, newest first</caption>
        <thead className="text-left text-muted"><tr><th className="px-5 py-2 font-medium">When (UTC)</th><th className="px-2 py-2 font-medium">Who</th><th className="px-5 py-2 font-medium">What</th></tr></thead>
        <tbody>
          {entries.map((e) => (
            <tr key={e.id} className="border-t border-line">
              <td className="num whitespace-nowrap px-5 py-2 text-muted sm:text-ink">{e.createdAt.replace("T", " ").slice(0, 19)}</td>
              <td className="px-5 py-2 font-medium sm:px-2 sm:font-normal">{e.actorName ?? "a former member"}</td>
              <td className="px-5 py-2">{describe(e.action, e.details)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {entries.length === limit && (
        <p className="px-5 py-3 text-sm"><Link href={`/s/${studio.id}/activity?before=${entries[entries.length - 1].id}`}>Older entries</Link></p>
      )}
    </section>
  );
}
