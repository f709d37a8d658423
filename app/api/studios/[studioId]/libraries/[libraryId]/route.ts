// GET /api/studios/:studioId/libraries/:libraryId – one library with its counts.
// PATCH – rename / describe (editors and owners). DELETE – delete with its stored files (owners; body
// { confirmName } must repeat the library's name).
import { route } from "@/lib/server/route";
import { deleteLibrary, getLibrary, updateLibrary } from "@/lib/server/catalogue/libraries";
import { deleteLibrarySchema, libraryParams, updateLibrarySchema } from "@/lib/validation/library";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: libraryParams }, async ({ studio, params }) => getLibrary({ studioId: studio.id, libraryId: params.libraryId }));

export const PATCH = route({ access: { kind: "studio", permission: "studio:write" }, params: libraryParams, body: updateLibrarySchema }, async ({ studio, user, params, body }) => {
  await updateLibrary({ studioId: studio.id, actorId: user.id, libraryId: params.libraryId, name: body.name, description: body.description, velocityCurve: body.velocityCurve });
  return getLibrary({ studioId: studio.id, libraryId: params.libraryId });
});

export const DELETE = route({ access: { kind: "studio", permission: "studio:manage" }, params: libraryParams, body: deleteLibrarySchema }, async ({ studio, user, params, body }) => {
  await deleteLibrary({ studioId: studio.id, actorId: user.id, libraryId: params.libraryId, confirmName: body.confirmName });
  return null;
});
