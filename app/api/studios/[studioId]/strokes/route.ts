// GET /api/studios/:studioId/strokes – the built-in strokes per family and the studio's own (?download=1: the
// studio's list as a kitwright.strokes/v1 file, for `kitwright … --strokes`); POST – add a stroke of the studio's own.
import { route } from "@/lib/server/route";
import { createStroke, strokeListAnswer } from "@/lib/server/strokes";
import { attachment } from "@/lib/server/kits/download";
import { studioParams } from "@/lib/validation/studio";
import { strokeInputSchema, strokeListQuery } from "@/lib/validation/strokes";
import { strokeFile } from "@/lib/catalogue/strokes";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: studioParams, query: strokeListQuery }, async ({ studio, query }) => {
  const answer = await strokeListAnswer(studio.id);
  if (query.download) return attachment(JSON.stringify(strokeFile(answer.strokes), null, 2), "application/json", "studio.strokes.json");
  return answer;
});

export const POST = route({ access: { kind: "studio", permission: "studio:write" }, params: studioParams, body: strokeInputSchema }, async ({ studio, user, body }) => ({
  stroke: await createStroke({ studioId: studio.id, actorId: user.id, input: body }),
}));
