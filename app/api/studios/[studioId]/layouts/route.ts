// GET /api/studios/:studioId/layouts – the studio's layouts. POST – create one: from a template, a blank grid
// (rows x cols, up to 64 pads) or a blank list of trigger zones.
import { route } from "@/lib/server/route";
import { createLayout, listLayouts } from "@/lib/server/kits/layouts";
import { studioParams } from "@/lib/validation/studio";
import { createLayoutSchema } from "@/lib/validation/kit";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: studioParams }, async ({ studio }) => ({ layouts: await listLayouts({ studioId: studio.id }) }));

export const POST = route({ access: { kind: "studio", permission: "studio:write" }, params: studioParams, body: createLayoutSchema }, async ({ studio, user, body }) => ({
  layout: await createLayout({ studioId: studio.id, actorId: user.id, ...body }),
}));
