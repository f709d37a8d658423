// GET /api/studios/:studioId/audits/:auditId – one saved audit with its whole result.
import { route } from "@/lib/server/route";
import { getAudit } from "@/lib/server/kits/audits";
import { auditParams } from "@/lib/validation/kit";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: auditParams }, async ({ studio, params }) => ({ audit: await getAudit({ studioId: studio.id, auditId: params.auditId }) }));
