// DELETE /api/studios/:studioId/invitations/:invitationId – withdraw a pending invitation (owners).
import { route } from "@/lib/server/route";
import { revokeInvitation } from "@/lib/server/studios";
import { invitationParams } from "@/lib/validation/studio";

export const DELETE = route({ access: { kind: "studio", permission: "members:manage" }, params: invitationParams }, async ({ studio, user, params }) => {
  await revokeInvitation({ studioId: studio.id, actorId: user.id, invitationId: params.invitationId });
  return null;
});
