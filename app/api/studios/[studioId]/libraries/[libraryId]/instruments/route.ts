// GET /api/studios/:studioId/libraries/:libraryId/instruments – the library's instruments.
import { route } from "@/lib/server/route";
import { listInstruments } from "@/lib/server/catalogue/instruments";
import { libraryParams } from "@/lib/validation/library";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: libraryParams }, async ({ studio, params }) => ({ instruments: await listInstruments({ studioId: studio.id, libraryId: params.libraryId }) }));
