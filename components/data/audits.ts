// Audits of a studio: the list (of one layout or all), one audit, the comparison of two, the sounds of an
// audit's findings (for audition, read once on the first play), and running an audit. Query keys, queries and
// mutations; components call these hooks.
import { useCallback } from "react";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "./api";
import { paths } from "./paths";
import type { AuditAnswer, AuditComparison, AuditList, AuditSounds, RunAuditBody } from "@/lib/api-types/audits";

export const auditKeys = {
  list: (studioId: string, layoutId?: string) => ["audits", studioId, layoutId ?? null] as const,
  all: (studioId: string) => ["audits", studioId] as const,
  detail: (auditId: string) => ["audit", auditId] as const,
  compare: (before: string, after: string) => ["audit-compare", before, after] as const,
  sounds: (auditId: string) => ["audit", auditId, "sounds"] as const,
};

export function useAudits(studioId: string, layoutId?: string) {
  return useQuery({ queryKey: auditKeys.list(studioId, layoutId), queryFn: async () => (await api<AuditList>(paths.audits(studioId, layoutId))).audits });
}

export function useAudit(studioId: string, auditId: string) {
  return useQuery({ queryKey: auditKeys.detail(auditId), queryFn: async () => (await api<AuditAnswer>(paths.audit(studioId, auditId))).audit });
}

export function useAuditComparison(studioId: string, before: string, after: string) {
  return useQuery({ queryKey: auditKeys.compare(before, after), queryFn: () => api<AuditComparison>(paths.auditCompare(studioId, before, after)) });
}

/** A function that reads the sounds of an audit's findings the first time it is called, then from the cache
 * (a saved audit never changes). */
export function useAuditSoundsLoader(studioId: string, auditId: string) {
  const qc = useQueryClient();
  return useCallback(
    () => qc.fetchQuery({ queryKey: auditKeys.sounds(auditId), queryFn: async () => (await api<AuditSounds>(paths.auditSounds(studioId, auditId))).instruments, staleTime: Infinity, retry: false }),
    [qc, studioId, auditId],
  );
}

/** Runs the audit of a layout against a kit with the studio's current catalogue and saves it. */
export function useRunAudit(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (body: RunAuditBody) => (await api<AuditAnswer>(paths.audits(studioId), { body })).audit,
    onSuccess: (audit) => {
      qc.setQueryData(auditKeys.detail(audit.id), audit);
      void qc.invalidateQueries({ queryKey: auditKeys.all(studioId) });
    },
  });
}
