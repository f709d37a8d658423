// POST /api/studios/:studioId/layouts/:layoutId/copy – a new layout with the same pads and pedal.
import { route } from "@/lib/server/route";
import { copyLayout } from "@/lib/server/kits/layouts";
import { copySchema, layoutParams } from "@/lib/validation/kit";

export const POST = route({ access: { kind: "studio", permission: "studio:write" }, params: layoutParams, body: copySchema }, async ({ studio, user, params, body }) => ({
  layout: await copyLayout({ studioId: studio.id, actorId: user.id, layoutId: params.layoutId, name: body.name }),
}));
