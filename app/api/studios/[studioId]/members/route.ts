// GET /api/studios/:studioId/members – who belongs to the studio, with roles.
import { route } from "@/lib/server/route";
import { listMembers } from "@/lib/server/studios";
import { studioParams } from "@/lib/validation/studio";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: studioParams }, async ({ studio }) => ({
  members: await listMembers({ studioId: studio.id }),
}));
