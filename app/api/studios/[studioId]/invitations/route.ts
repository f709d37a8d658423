// GET /api/studios/:studioId/invitations – pending invitations; POST – invite someone by e-mail with a role (owners).
import { route } from "@/lib/server/route";
import { createInvitation, listInvitations } from "@/lib/server/studios";
import { inviteSchema, studioParams } from "@/lib/validation/studio";

export const GET = route({ access: { kind: "studio", permission: "members:manage" }, params: studioParams }, async ({ studio }) => ({
  invitations: await listInvitations({ studioId: studio.id }),
}));

export const POST = route(
  { access: { kind: "studio", permission: "members:manage" }, params: studioParams, body: inviteSchema },
  async ({ studio, user, body }) => createInvitation({ studioId: studio.id, actorId: user.id, email: body.email, role: body.role }),
);
