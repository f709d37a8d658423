// Requests and answers of /api/studios/:id/invitations(/:invitationId) and /api/invitations/accept, and what an
// invitation link shows. Types only.
import type { z } from "zod";
import type { Role } from "@/lib/permissions";
import type { inviteSchema } from "@/lib/validation/studio";

/** A pending invitation as owners see it. */
export interface Invitation {
  id: string;
  email: string;
  role: Role;
  invitedBy: string;
  expiresAt: string;
  createdAt: string;
}

/** GET /api/studios/:id/invitations */
export interface InvitationList {
  invitations: Invitation[];
}

/** What the invitation page shows for a token. */
export type InvitationView =
  | { state: "pending"; studioName: string; email: string; role: Role; inviter: string }
  | { state: "invalid" | "accepted" | "revoked" | "expired" };

/** POST /api/studios/:id/invitations */
export type InviteBody = z.input<typeof inviteSchema>;
export interface CreatedInvitation {
  id: string;
}

/** POST /api/invitations/accept { token } */
export interface AcceptedInvitation {
  studioId: string;
}
