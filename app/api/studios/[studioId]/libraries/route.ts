// GET /api/studios/:studioId/libraries – the studio's libraries with counts per sample state.
// POST – create a library (editors and owners).
import { route } from "@/lib/server/route";
import { createLibrary, listLibraries } from "@/lib/server/catalogue/libraries";
import { studioParams } from "@/lib/validation/studio";
import { createLibrarySchema } from "@/lib/validation/library";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: studioParams }, async ({ studio }) => ({ libraries: await listLibraries({ studioId: studio.id }) }));

export const POST = route({ access: { kind: "studio", permission: "studio:write" }, params: studioParams, body: createLibrarySchema }, async ({ studio, user, body }) =>
  createLibrary({ studioId: studio.id, actorId: user.id, name: body.name, description: body.description }),
);
