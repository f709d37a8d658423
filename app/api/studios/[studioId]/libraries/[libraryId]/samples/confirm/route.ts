// POST /api/studios/:studioId/libraries/:libraryId/samples/confirm – confirm the current labels of samples.
import { route } from "@/lib/server/route";
import { confirmSamples } from "@/lib/server/catalogue/sample-labels";
import { confirmSchema, libraryParams } from "@/lib/validation/library";

export const POST = route({ access: { kind: "studio", permission: "studio:write" }, params: libraryParams, body: confirmSchema }, async ({ studio, user, params, body }) =>
  confirmSamples({ studioId: studio.id, libraryId: params.libraryId, actorId: user.id, sampleIds: body.sampleIds }),
);
