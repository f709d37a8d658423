// GET /api/studios/:studioId/layouts/:layoutId/export – the layout as a kitwright.layout/v1 file (attachment).
import { route } from "@/lib/server/route";
import { getLayout } from "@/lib/server/kits/layouts";
import { layoutToFile } from "@/lib/audit/schema";
import { layoutParams } from "@/lib/validation/kit";
import { attachment } from "@/lib/server/kits/download";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: layoutParams }, async ({ studio, params }) => {
  const l = await getLayout({ studioId: studio.id, layoutId: params.layoutId });
  return attachment(JSON.stringify(layoutToFile(l.layout), null, 2), "application/json", `${l.name}.layout.json`);
});
