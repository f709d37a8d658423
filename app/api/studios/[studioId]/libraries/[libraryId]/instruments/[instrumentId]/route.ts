// PATCH /api/studios/:studioId/libraries/:libraryId/instruments/:instrumentId – rename (kept across cataloguings).
import { route } from "@/lib/server/route";
import { renameInstrument } from "@/lib/server/catalogue/instruments";
import { instrumentParams, renameInstrumentSchema } from "@/lib/validation/library";

export const PATCH = route({ access: { kind: "studio", permission: "studio:write" }, params: instrumentParams, body: renameInstrumentSchema }, async ({ studio, user, params, body }) => {
  await renameInstrument({ studioId: studio.id, libraryId: params.libraryId, instrumentId: params.instrumentId, actorId: user.id, name: body.name });
  return { id: params.instrumentId, name: body.name };
});
