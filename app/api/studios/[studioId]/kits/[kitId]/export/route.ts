// GET /api/studios/:studioId/kits/:kitId/export – the kit as a kitwright.kit/v2 file (attachment), with the studio's
// own strokes its stroke maps name.
import { route } from "@/lib/server/route";
import { getKit } from "@/lib/server/kits/kits";
import { kitToFile } from "@/lib/audit/schema";
import { kitParams } from "@/lib/validation/kit";
import { attachment } from "@/lib/server/kits/download";
import { loadStudioStrokes } from "@/lib/server/strokes";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: kitParams }, async ({ studio, params }) => {
  const [k, strokes] = await Promise.all([getKit({ studioId: studio.id, kitId: params.kitId }), loadStudioStrokes(studio.id)]);
  return attachment(JSON.stringify(kitToFile(k.kit, strokes), null, 2), "application/json", `${k.name}.kit.json`);
});
