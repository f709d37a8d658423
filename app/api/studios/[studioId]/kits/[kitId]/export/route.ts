// GET /api/studios/:studioId/kits/:kitId/export – the kit as a kitwright.kit/v1 file (attachment).
import { route } from "@/lib/server/route";
import { getKit } from "@/lib/server/kits/kits";
import { kitToFile } from "@/lib/audit/schema";
import { kitParams } from "@/lib/validation/kit";
import { attachment } from "@/lib/server/kits/download";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: kitParams }, async ({ studio, params }) => {
  const k = await getKit({ studioId: studio.id, kitId: params.kitId });
  return attachment(JSON.stringify(kitToFile(k.kit), null, 2), "application/json", `${k.name}.kit.json`);
});
