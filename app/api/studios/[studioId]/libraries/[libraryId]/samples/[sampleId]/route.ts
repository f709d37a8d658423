// GET /api/studios/:studioId/libraries/:libraryId/samples/:sampleId – one sample with its reasons, peaks and key measures.
import { route } from "@/lib/server/route";
import { getSample } from "@/lib/server/catalogue/samples";
import { sampleParams } from "@/lib/validation/library";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: sampleParams }, async ({ studio, params }) =>
  getSample({ studioId: studio.id, libraryId: params.libraryId, sampleId: params.sampleId }),
);
