// GET /api/studios/:studioId/activity – the studio's activity log, newest first, paged by id (owners).
import { route } from "@/lib/server/route";
import { listActivity } from "@/lib/server/activity";
import { activityQuery, studioParams } from "@/lib/validation/studio";

export const GET = route(
  { access: { kind: "studio", permission: "activity:read" }, params: studioParams, query: activityQuery },
  async ({ studio, query }) => ({ entries: await listActivity({ studioId: studio.id, before: query.before, limit: query.limit }) }),
);
