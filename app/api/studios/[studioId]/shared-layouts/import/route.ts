// POST /api/studios/:studioId/shared-layouts/import – copy a shared layout (by its link's token) into this studio.
import { route } from "@/lib/server/route";
import { importSharedLayout } from "@/lib/server/kits/shares";
import { studioParams } from "@/lib/validation/studio";
import { importSharedSchema } from "@/lib/validation/kit";

export const POST = route({ access: { kind: "studio", permission: "studio:write" }, params: studioParams, body: importSharedSchema }, async ({ studio, user, body }) => ({
  layout: await importSharedLayout({ studioId: studio.id, actorId: user.id, token: body.token }),
}));
