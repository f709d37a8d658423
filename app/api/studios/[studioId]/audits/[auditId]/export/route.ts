// GET /api/studios/:studioId/audits/:auditId/export?format=csv|json|midi – the findings as CSV, as
// kitwright.audit/v1 JSON, or a Standard MIDI File that plays every pad at every layer (attachments).
import { route } from "@/lib/server/route";
import { getAudit } from "@/lib/server/kits/audits";
import { auditToCsv, auditToJson } from "@/lib/audit/export";
import { auditToSmf } from "@/lib/audit/smf";
import { auditParams, exportQuery } from "@/lib/validation/kit";
import { attachment } from "@/lib/server/kits/download";

export const GET = route({ access: { kind: "studio", permission: "studio:read" }, params: auditParams, query: exportQuery }, async ({ studio, params, query }) => {
  const a = await getAudit({ studioId: studio.id, auditId: params.auditId });
  const base = `audit-${a.layoutName}-${a.createdAt.slice(0, 10)}`;
  if (query.format === "csv") return attachment(auditToCsv(a.result), "text/csv; charset=utf-8", `${base}.csv`);
  if (query.format === "json") return attachment(JSON.stringify(auditToJson(a.result), null, 2), "application/json", `${base}.json`);
  return attachment(auditToSmf(a.result), "audio/midi", `${base}.mid`);
});
