import type { Metadata } from "next";
import Link from "next/link";
import { currentUser } from "@/lib/server/session";
import { viewInvitation } from "@/lib/server/studios";
import { AcceptInvitationButton } from "@/components/studio-forms";

export const metadata: Metadata = { title: "Invitation" };
export const dynamic = "force-dynamic";

const GONE: Record<string, string> = {
  invalid: "This invitation link is not valid.",
  accepted: "This invitation has already been accepted.",
  revoked: "This invitation was withdrawn by the studio.",
  expired: "This invitation has expired; ask the studio for a new one.",
};

export default async function InvitePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const [inv, user] = await Promise.all([viewInvitation(token), currentUser()]);
  if (inv.state !== "pending") {
    return (
      <div className="card mx-auto max-w-lg space-y-3">
        <h1>Invitation</h1>
        <p role="alert">{GONE[inv.state]}</p>
        <Link href="/studios">Your studios</Link>
      </div>
    );
  }
  return (
    <div className="card mx-auto max-w-lg space-y-4">
      <h1>Join “{inv.studioName}”</h1>
      <p>{inv.inviter} invited <strong>{inv.email}</strong> to this studio as <strong>{inv.role}</strong>.</p>
      {!user && (
        <div className="flex gap-3">
          <Link className="btn-primary" href={`/sign-up?invite=${encodeURIComponent(token)}&email=${encodeURIComponent(inv.email)}`}>Create an account</Link>
          <Link className="btn-quiet" href={`/sign-in?next=${encodeURIComponent(`/invite/${token}`)}`}>I have an account</Link>
        </div>
      )}
      {user && user.email === inv.email && <AcceptInvitationButton token={token} />}
      {user && user.email !== inv.email && (
        <p role="alert" className="text-sm text-bad">You are signed in as {user.email}, but this invitation is for {inv.email}. Sign out and sign in with that address to accept it.</p>
      )}
    </div>
  );
}
