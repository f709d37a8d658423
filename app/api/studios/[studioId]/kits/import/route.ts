// POST /api/studios/:studioId/kits/import – body: a kitwright.kit/v2 (or v1) file; creates a new kit from it (its own strokes the studio lacks join the studio).
import { route } from "@/lib/server/route";
import { importKit } from "@/lib/server/kits/kits";
import { studioParams } from "@/lib/validation/studio";
import { kitFileStrictSchema } from "@/lib/validation/kit";
import type { Kit } from "@/lib/audit/types";

export const POST = route({ access: { kind: "studio", permission: "studio:write" }, params: studioParams, body: kitFileStrictSchema }, async ({ studio, user, body }) => ({
  kit: await importKit({ studioId: studio.id, actorId: user.id, kit: body.kit as Kit }),
}));
