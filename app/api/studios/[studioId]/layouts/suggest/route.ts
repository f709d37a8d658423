// POST /api/studios/:studioId/layouts/suggest – a layout suggested for a kit and a pad surface, with the reason
// for every pad. Nothing is saved (anyone who can see the kit may ask); saving goes through /layouts/import.
import { route } from "@/lib/server/route";
import { suggestForKit } from "@/lib/server/kits/suggest";
import { studioParams } from "@/lib/validation/studio";
import { suggestLayoutSchema } from "@/lib/validation/kit";

export const POST = route({ access: { kind: "studio", permission: "studio:read" }, params: studioParams, body: suggestLayoutSchema, creates: false }, async ({ studio, body }) =>
  suggestForKit({ studioId: studio.id, kitId: body.kitId, surface: body.surface, standIns: body.standIns, name: body.name }),
);
