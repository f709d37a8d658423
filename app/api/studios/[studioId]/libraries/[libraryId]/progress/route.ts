// GET /api/studios/:studioId/libraries/:libraryId/progress – counts per sample state (polled while work is pending).
import { route } from "@/lib/server/route";
import { libraryProgress } from "@/lib/server/catalogue/libraries";
import { libraryParams } from "@/lib/validation/library";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: libraryParams }, async ({ studio, params }) => libraryProgress({ studioId: studio.id, libraryId: params.libraryId }));
