// GET /api/studios/:studioId/audits/compare?before=&after= – what changed between two audits of one layout.
import { route } from "@/lib/server/route";
import { compareAudits } from "@/lib/server/kits/audits";
import { studioParams } from "@/lib/validation/studio";
import { compareQuery } from "@/lib/validation/kit";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: studioParams, query: compareQuery }, async ({ studio, query }) => compareAudits({ studioId: studio.id, before: query.before, after: query.after }));
