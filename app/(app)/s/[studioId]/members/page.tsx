import type { Metadata } from "next";
import { requireStudio } from "@/lib/server/session";
import { listInvitations, listMembers } from "@/lib/server/studios";
import { can } from "@/lib/permissions";
import { ViewOnlyNote } from "@/components/view-only";
import { InviteForm, MemberControls, RevokeInvitationButton } from "@/components/studio-forms";

export const metadata: Metadata = { title: "Members" };

const fmt = (iso: string) => new Date(iso).toISOString().slice(0, 10);

export default async function MembersPage({ params }: { params: Promise<{ studioId: string }> }) {
  const { studioId } = await params;
  const { studio, user } = await requireStudio(studioId);
  const manage = can(studio.role, "members:manage");
  const [members, invitations] = await Promise.all([listMembers({ studioId: studio.id }), manage ? listInvitations({ studioId: studio.id }) : Promise.resolve([])]);
  return (
    <div className="grid grid-cols-1 gap-6 lg:grid-cols-[minmax(0,1fr)_340px]">
      <section className="space-y-6">
        {!manage && <ViewOnlyNote what="roles or invite people" permission="members:manage" />}
        <div className="card table-scroll p-0">
          <table className="table-stack w-full text-sm" data-testid="members-table">
            <caption className="px-5 pt-4 text-left font-semibold">Members</caption>
            <thead className="text-left text-muted">
              <tr><th className="px-5 py-2 font-medium">Name</th><th className="px-2 py-2 font-medium">E-mail</th><th className="px-2 py-2 font-medium">Since</th><th className="px-5 py-2 text-right font-medium">Role</th></tr>
            </thead>
            <tbody>
              {members.map((m) => (
                <tr key={m.userId} className="border-t border-line">
                  <td className="px-5 py-2 font-medium sm:font-normal">{m.name}{m.userId === user.id && <span className="ml-2 text-xs text-muted">(you)</span>}</td>
                  <td className="break-all px-5 py-2 sm:px-2">{m.email}</td>
                  <td className="num px-5 py-2 sm:px-2" data-label="since">{fmt(m.since)}</td>
                  <td className="px-5 py-2 sm:text-right">
                    {manage ? <MemberControls studioId={studio.id} userId={m.userId} role={m.role} name={m.name} /> : <span className="tag border-line">{m.role}</span>}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        {manage && (
          <div className="card">
            <h2>Pending invitations</h2>
            {invitations.length === 0 ? (
              <p className="mt-2 text-sm text-muted">None.</p>
            ) : (
              <ul className="mt-3 divide-y divide-line text-sm" data-testid="invitations">
                {invitations.map((i) => (
                  <li key={i.id} className="flex items-center justify-between gap-3 py-2">
                    <span>{i.email} <span className="tag ml-1 border-line">{i.role}</span> <span className="text-xs text-muted">by {i.invitedBy}, until {fmt(i.expiresAt)}</span></span>
                    <RevokeInvitationButton studioId={studio.id} invitationId={i.id} email={i.email} />
                  </li>
                ))}
              </ul>
            )}
          </div>
        )}
      </section>
      {manage && <aside className="card h-fit"><InviteForm studioId={studio.id} /></aside>}
    </div>
  );
}
