import type { Metadata } from "next";
import { requireStudio } from "@/lib/server/session";
import { listMembers } from "@/lib/server/studios";
import { can, ROLE_PERMISSIONS } from "@/lib/permissions";
import { RenameStudioForm } from "@/components/studio-forms";

export const metadata: Metadata = { title: "Studio" };

const WORDS: Record<string, string> = {
  "studio:read": "view libraries, samples, kits, layouts and audits; listen; export",
  "studio:write": "upload, label and confirm samples; edit kits and layouts; run audits",
  "studio:manage": "rename the studio and delete libraries",
  "members:manage": "invite people, change roles, remove members",
  "activity:read": "read the activity log",
};

export default async function StudioOverview({ params }: { params: Promise<{ studioId: string }> }) {
  const { studioId } = await params;
  const { studio } = await requireStudio(studioId);
  const members = await listMembers({ studioId: studio.id });
  return (
    <div className="grid gap-6 md:grid-cols-2">
      <section className="card space-y-3">
        <h2>Your role: {studio.role}</h2>
        <p className="text-sm text-muted">In this studio you can:</p>
        <ul className="list-disc space-y-1 pl-5 text-sm" data-testid="my-permissions">
          {ROLE_PERMISSIONS[studio.role].map((p) => <li key={p}>{WORDS[p]}</li>)}
        </ul>
      </section>
      <section className="card space-y-3">
        <h2>Members</h2>
        <p className="text-sm"><span className="num">{members.length}</span> {members.length === 1 ? "person" : "people"}: {members.map((m) => m.name).join(", ")}</p>
        {can(studio.role, "studio:manage") && <RenameStudioForm studioId={studio.id} name={studio.name} />}
      </section>
    </div>
  );
}
