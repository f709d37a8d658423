// GET/PATCH/DELETE /api/studios/:studioId/kits/:kitId – read, rename or change the slots, delete.
import { route } from "@/lib/server/route";
import { deleteKit, getKit, updateKit } from "@/lib/server/kits/kits";
import { kitParams, updateKitSchema } from "@/lib/validation/kit";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: kitParams }, async ({ studio, params }) => ({ kit: await getKit({ studioId: studio.id, kitId: params.kitId }) }));

export const PATCH = route({ access: { kind: "studio", permission: "studio:write" }, params: kitParams, body: updateKitSchema }, async ({ studio, user, params, body }) => ({
  kit: await updateKit({ studioId: studio.id, actorId: user.id, kitId: params.kitId, name: body.name, slots: body.slots }),
}));

export const DELETE = route({ access: { kind: "studio", permission: "studio:write" }, params: kitParams }, async ({ studio, user, params }) => {
  await deleteKit({ studioId: studio.id, actorId: user.id, kitId: params.kitId });
  return null;
});
