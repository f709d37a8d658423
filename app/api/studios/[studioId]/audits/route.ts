// GET /api/studios/:studioId/audits[?layoutId=] – saved audits, newest first.
// POST { layoutId, kitId } – run the audit against the studio's current catalogue and save it (owners, editors).
import { route } from "@/lib/server/route";
import { listAudits, runAndSaveAudit } from "@/lib/server/kits/audits";
import { getLayout } from "@/lib/server/kits/layouts";
import { studioParams } from "@/lib/validation/studio";
import { auditListQuery, runAuditSchema } from "@/lib/validation/kit";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: studioParams, query: auditListQuery }, async ({ studio, query }) => {
  if (query.layoutId) await getLayout({ studioId: studio.id, layoutId: query.layoutId });
  return { audits: await listAudits({ studioId: studio.id, layoutId: query.layoutId }) };
});

export const POST = route({ access: { kind: "studio", permission: "studio:write" }, params: studioParams, body: runAuditSchema }, async ({ studio, user, body }) => ({
  audit: await runAndSaveAudit({ studioId: studio.id, actorId: user.id, layoutId: body.layoutId, kitId: body.kitId }),
}));
