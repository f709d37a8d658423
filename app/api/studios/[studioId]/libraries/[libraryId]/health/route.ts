// GET /api/studios/:studioId/libraries/:libraryId/health – the health findings with the samples they concern.
import { route } from "@/lib/server/route";
import { libraryHealth } from "@/lib/server/catalogue/reports";
import { libraryParams } from "@/lib/validation/library";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: libraryParams }, async ({ studio, params }) => libraryHealth({ studioId: studio.id, libraryId: params.libraryId }));
