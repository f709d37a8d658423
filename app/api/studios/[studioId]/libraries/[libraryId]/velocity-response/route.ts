// GET /api/studios/:studioId/libraries/:libraryId/velocity-response?curve=dls|dannenberg&rangeDb=N[&format=csv|json]
// Every layer group of two or more layers against the velocity curve, with the per-layer trims; with `format`,
// the trims as a download.
import { route } from "@/lib/server/route";
import { attachment } from "@/lib/server/kits/download";
import { libraryVelocityResponse, velocityTrimsFile } from "@/lib/server/catalogue/velocity-response";
import { libraryParams, velocityResponseQuery } from "@/lib/validation/library";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: libraryParams, query: velocityResponseQuery }, async ({ studio, params, query }) => {
  const view = await libraryVelocityResponse({ studioId: studio.id, libraryId: params.libraryId, curve: query.curve, rangeDb: query.rangeDb });
  if (!query.format) return view;
  const f = velocityTrimsFile(view, query.format);
  return attachment(f.body, f.type, f.name);
});
