// PATCH /api/studios/:studioId/strokes/:strokeId – change a stroke of the studio's own (a new name is a new id: when
// something uses it, 409 with the uses unless `moveUses` is true); DELETE (?moveTo=<stroke>) – remove it (when
// something uses it, 409 with the uses unless moveTo says where they go).
import { route } from "@/lib/server/route";
import { deleteStroke, updateStroke } from "@/lib/server/strokes";
import { deleteStrokeQuery, strokeParams, updateStrokeSchema } from "@/lib/validation/strokes";

export const PATCH = route({ access: { kind: "studio", permission: "studio:write" }, params: strokeParams, body: updateStrokeSchema }, async ({ studio, user, params, body }) => {
  const { moveUses, ...input } = body;
  return { stroke: await updateStroke({ studioId: studio.id, actorId: user.id, strokeId: params.strokeId, input, moveUses }) };
});

export const DELETE = route({ access: { kind: "studio", permission: "studio:write" }, params: strokeParams, query: deleteStrokeQuery }, async ({ studio, user, params, query }) => {
  const r = await deleteStroke({ studioId: studio.id, actorId: user.id, strokeId: params.strokeId, moveTo: query.moveTo });
  return { moved: r.moved };
});
