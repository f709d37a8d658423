// GET /api/studios/:studioId/strokes – the built-in strokes per family and the studio's own (?download=1: the
// studio's list as a kitwright.strokes/v1 file, for `kitwright … --strokes`); POST – add a stroke of the studio's own.
import { route } from "@/lib/server/route";
import { createStroke, loadStudioStrokes } from "@/lib/server/strokes";
import { attachment } from "@/lib/server/kits/download";
import { studioParams } from "@/lib/validation/studio";
import { strokeInputSchema, strokeListQuery } from "@/lib/validation/strokes";
import { strokeFile } from "@/lib/catalogue/strokes";
import { FAMILY_ARTICULATIONS } from "@/lib/catalogue/taxonomy";
import type { StrokeListAnswer } from "@/lib/api-types/strokes";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: studioParams, query: strokeListQuery }, async ({ studio, query }) => {
  const strokes = await loadStudioStrokes(studio.id);
  if (query.download) return attachment(JSON.stringify(strokeFile(strokes), null, 2), "application/json", "studio.strokes.json");
  const builtIn = Object.fromEntries(Object.entries(FAMILY_ARTICULATIONS).map(([f, list]) => [f, [...list]])) as StrokeListAnswer["builtIn"];
  return { builtIn, strokes } satisfies StrokeListAnswer;
});

export const POST = route({ access: { kind: "studio", permission: "studio:write" }, params: studioParams, body: strokeInputSchema }, async ({ studio, user, body }) => ({
  stroke: await createStroke({ studioId: studio.id, actorId: user.id, input: body }),
}));
