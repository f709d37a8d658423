// GET /api/studios/:studioId/audits/:auditId/export?format=<id> – the findings as an attachment in one of the
// export formats of lib/audit/export-formats.ts (CSV, kitwright.audit/v3 JSON, a Standard MIDI File that plays
// every pad at every layer).
import { route } from "@/lib/server/route";
import { getAudit } from "@/lib/server/kits/audits";
import { exportFileName, exportFormat } from "@/lib/audit/export-formats";
import { auditParams, exportQuery } from "@/lib/validation/kit";
import { attachment } from "@/lib/server/kits/download";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: auditParams, query: exportQuery }, async ({ studio, params, query }) => {
  const a = await getAudit({ studioId: studio.id, auditId: params.auditId });
  const format = exportFormat(query.format);
  return attachment(format.serialize(a.result), format.mediaType, exportFileName(format, `audit-${a.layoutName}-${a.createdAt.slice(0, 10)}`));
});
