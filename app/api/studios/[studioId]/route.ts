// GET /api/studios/:studioId – one studio and my role in it; PATCH – rename it (owners).
import { route } from "@/lib/server/route";
import { getStudio, renameStudio } from "@/lib/server/studios";
import { studioNameSchema, studioParams } from "@/lib/validation/studio";
import { notFound } from "@/lib/server/errors";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: studioParams }, async ({ studio }) => {
  const s = await getStudio({ studioId: studio.id });
  if (!s) throw notFound("The studio");
  return { ...s, role: studio.role };
});

export const PATCH = route(
  { access: { kind: "studio", permission: "studio:manage" }, params: studioParams, body: studioNameSchema },
  async ({ studio, user, body }) => {
    await renameStudio({ studioId: studio.id, actorId: user.id, name: body.name });
    return { id: studio.id, name: body.name };
  },
);
