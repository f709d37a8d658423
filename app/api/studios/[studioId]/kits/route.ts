// GET /api/studios/:studioId/kits – the studio's kits. POST – create a kit (empty, with slots, or filled from
// the catalogue of the studio or of one of its libraries for a kit template).
import { route } from "@/lib/server/route";
import { createKit, listKits } from "@/lib/server/kits/kits";
import { studioParams } from "@/lib/validation/studio";
import { createKitSchema } from "@/lib/validation/kit";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: studioParams }, async ({ studio }) => ({ kits: await listKits({ studioId: studio.id }) }));

export const POST = route({ access: { kind: "studio", permission: "studio:write" }, params: studioParams, body: createKitSchema }, async ({ studio, user, body }) => ({
  kit: await createKit({ studioId: studio.id, actorId: user.id, name: body.name, slots: body.slots, template: body.template, libraryId: body.libraryId }),
}));
