// PATCH /api/studios/:studioId/members/:userId – change a member's role; DELETE – remove the member (owners).
// The last owner can be neither demoted nor removed.
import { route } from "@/lib/server/route";
import { changeRole, removeMember } from "@/lib/server/studios";
import { changeRoleSchema, memberParams } from "@/lib/validation/studio";

export const PATCH = route(
  { access: { kind: "studio", permission: "members:manage" }, params: memberParams, body: changeRoleSchema },
  async ({ studio, user, params, body }) => {
    await changeRole({ studioId: studio.id, actorId: user.id, userId: params.userId, role: body.role });
    return { userId: params.userId, role: body.role };
  },
);

export const DELETE = route({ access: { kind: "studio", permission: "members:manage" }, params: memberParams }, async ({ studio, user, params }) => {
  await removeMember({ studioId: studio.id, actorId: user.id, userId: params.userId });
  return null;
});
