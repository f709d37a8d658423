// GET /api/studios/:studioId/strokes/:strokeId/uses – what uses a stroke (built-in or the studio's): samples per
// library, kits' stroke maps, layouts' pads and pedal zones, the studio's strokes with an edge to it.
import { route } from "@/lib/server/route";
import { strokeUses } from "@/lib/server/strokes";
import { strokeParams } from "@/lib/validation/strokes";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: strokeParams }, async ({ studio, params }) => ({
  uses: await strokeUses({ studioId: studio.id, strokeId: params.strokeId }),
}));
