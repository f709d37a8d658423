// GET /api/studios/:studioId/layouts/:layoutId/export – the layout as a kitwright.layout/v2 file (attachment), with
// the studio's own strokes it aims at.
import { route } from "@/lib/server/route";
import { getLayout } from "@/lib/server/kits/layouts";
import { layoutToFile } from "@/lib/audit/schema";
import { layoutParams } from "@/lib/validation/kit";
import { attachment } from "@/lib/server/kits/download";
import { loadStudioStrokes } from "@/lib/server/strokes";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: layoutParams }, async ({ studio, params }) => {
  const [l, strokes] = await Promise.all([getLayout({ studioId: studio.id, layoutId: params.layoutId }), loadStudioStrokes(studio.id)]);
  return attachment(JSON.stringify(layoutToFile(l.layout, strokes), null, 2), "application/json", `${l.name}.layout.json`);
});
