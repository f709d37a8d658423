// POST /api/studios/:studioId/kits/:kitId/copy – a new kit with the same slots.
import { route } from "@/lib/server/route";
import { copyKit } from "@/lib/server/kits/kits";
import { copySchema, kitParams } from "@/lib/validation/kit";

export const POST = route({ access: { kind: "studio", permission: "studio:write" }, params: kitParams, body: copySchema }, async ({ studio, user, params, body }) => ({
  kit: await copyKit({ studioId: studio.id, actorId: user.id, kitId: params.kitId, name: body.name }),
}));
