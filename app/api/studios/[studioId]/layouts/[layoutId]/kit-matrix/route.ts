// GET /api/studios/:studioId/layouts/:layoutId/kit-matrix – the layout audited against every kit of the studio.
import { route } from "@/lib/server/route";
import { kitMatrix } from "@/lib/server/kits/kit-matrix";
import { layoutParams } from "@/lib/validation/kit";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: layoutParams }, async ({ studio, params }) => kitMatrix({ studioId: studio.id, layoutId: params.layoutId }));
