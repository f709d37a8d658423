// POST /api/studios/:studioId/layouts/import – body: a kitwright.layout/v2 (or v1) file; creates a new layout from it (the file's own strokes the studio lacks are added to the studio).
import { route } from "@/lib/server/route";
import { importLayout } from "@/lib/server/kits/layouts";
import { studioParams } from "@/lib/validation/studio";
import { layoutFileStrictSchema } from "@/lib/validation/kit";
import type { Layout } from "@/lib/audit/types";

export const POST = route({ access: { kind: "studio", permission: "studio:write" }, params: studioParams, body: layoutFileStrictSchema }, async ({ studio, user, body }) => ({
  layout: await importLayout({ studioId: studio.id, actorId: user.id, layout: body.layout as Layout }),
}));
