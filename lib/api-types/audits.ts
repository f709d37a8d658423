// Requests and answers of /api/studios/:id/audits (list, run), one audit, its comparison with another, its
// sounds (for audition) and its export formats. Types only, shared by lib/server and components/data.
import type { z } from "zod";
import type { AuditDiff } from "@/lib/audit/export";
import type { AuditResult, CatalogueInstrument } from "@/lib/audit/types";
import type { exportQuery, runAuditSchema } from "@/lib/validation/kit";

export interface AuditSummaryRow {
  id: string;
  layoutId: string;
  kitId: string | null;
  layoutName: string;
  kitName: string;
  score: number;
  silentPads: number;
  standInPads: number;
  conflicts: number;
  createdAt: string;
  createdBy: string | null;
}
export interface AuditRecord extends AuditSummaryRow { result: AuditResult }

/** GET /api/studios/:id/audits[?layoutId=] */
export interface AuditList {
  audits: AuditSummaryRow[];
}
/** GET /api/studios/:id/audits/:auditId and POST /api/studios/:id/audits */
export interface AuditAnswer {
  audit: AuditRecord;
}
/** POST /api/studios/:id/audits: run the audit against the studio's current catalogue and save it. */
export type RunAuditBody = z.input<typeof runAuditSchema>;

/** GET /api/studios/:id/audits/compare?before=&after= */
export interface AuditComparison {
  before: AuditSummaryRow;
  after: AuditSummaryRow;
  diff: AuditDiff;
}

/** The catalogue instrument plus the library it belongs to (the audition fetches sample audio per library). */
export interface StudioCatalogueInstrument extends CatalogueInstrument {
  libraryId: string;
}
/** GET /api/studios/:id/audits/:auditId/sounds: the instruments the audit's findings name. */
export interface AuditSounds {
  instruments: StudioCatalogueInstrument[];
}

/** GET /api/studios/:id/audits/:auditId/export?format= */
export type AuditExportFormat = z.input<typeof exportQuery>["format"];
