// POST /api/studios/:studioId/libraries/:libraryId/instruments/merge – { sourceIds, targetId }: move the
// sources' samples into the target instrument; catalogues the library again.
import { route } from "@/lib/server/route";
import { mergeInstruments } from "@/lib/server/catalogue/instruments";
import { libraryParams, mergeInstrumentsSchema } from "@/lib/validation/library";

export const POST = route({ access: { kind: "studio", permission: "studio:write" }, params: libraryParams, body: mergeInstrumentsSchema }, async ({ studio, user, params, body }) =>
  mergeInstruments({ studioId: studio.id, libraryId: params.libraryId, actorId: user.id, sourceIds: body.sourceIds, targetId: body.targetId }),
);
