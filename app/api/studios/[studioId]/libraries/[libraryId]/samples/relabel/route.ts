// POST /api/studios/:studioId/libraries/:libraryId/samples/relabel – set family / articulation / mic /
// instrument on many samples (labels become the member's: source "person"); logged; catalogues the library again.
import { route } from "@/lib/server/route";
import { relabelSamples } from "@/lib/server/catalogue/sample-labels";
import { libraryParams, relabelSchema } from "@/lib/validation/library";

export const POST = route({ access: { kind: "studio", permission: "studio:write" }, params: libraryParams, body: relabelSchema }, async ({ studio, user, params, body }) =>
  relabelSamples({ studioId: studio.id, libraryId: params.libraryId, actorId: user.id, input: body }),
);
