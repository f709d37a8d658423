// GET /api/studios/:studioId/libraries/:libraryId/samples?page&pageSize&sort&dir&q&family&articulation&state&instrument&flag
// – one page of the library's samples, sorted and filtered on the server.
import { route } from "@/lib/server/route";
import { listSamples } from "@/lib/server/catalogue/samples";
import { libraryParams, samplesQuery } from "@/lib/validation/library";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: libraryParams, query: samplesQuery }, async ({ studio, params, query }) =>
  listSamples({ studioId: studio.id, libraryId: params.libraryId, query }),
);
