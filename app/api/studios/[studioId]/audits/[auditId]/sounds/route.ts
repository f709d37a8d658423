// GET /api/studios/:studioId/audits/:auditId/sounds – the catalogue entries (layers with sample ids, library)
// of the instruments the audit's findings name, for auditioning pads in the browser.
import { route } from "@/lib/server/route";
import { auditSounds } from "@/lib/server/kits/audits";
import { auditParams } from "@/lib/validation/kit";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: auditParams }, async ({ studio, params }) => ({ instruments: await auditSounds({ studioId: studio.id, auditId: params.auditId }) }));
