// GET /api/studios/:studioId/libraries/:libraryId/plots – loudness ladders per group and the feature map points.
import { route } from "@/lib/server/route";
import { libraryPlots } from "@/lib/server/catalogue/reports";
import { libraryParams } from "@/lib/validation/library";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: libraryParams }, async ({ studio, params }) => libraryPlots({ studioId: studio.id, libraryId: params.libraryId }));
