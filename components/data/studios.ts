// Studios: the ones I belong to, one studio, creating and renaming one, and its activity log. Query keys,
// queries and mutations; components call these hooks.
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "./api";
import { paths } from "./paths";
import type { CreatedStudio, RenamedStudio, StudioInfo, StudioNameBody, StudioSummary } from "@/lib/api-types/studios";
import type { ActivityPage } from "@/lib/api-types/activity";

export const studioKeys = {
  all: () => ["studios"] as const,
  detail: (studioId: string) => ["studios", studioId] as const,
  activity: (studioId: string, before?: number) => ["studios", studioId, "activity", before ?? null] as const,
};

export function useStudios() {
  return useQuery({ queryKey: studioKeys.all(), queryFn: async () => (await api<{ studios: StudioSummary[] }>(paths.studios())).studios });
}

export function useStudio(studioId: string) {
  return useQuery({ queryKey: studioKeys.detail(studioId), queryFn: () => api<StudioInfo>(paths.studio(studioId)) });
}

/** The activity log, newest first, a page before the entry id `before` (owners). */
export function useActivity(studioId: string, before?: number) {
  return useQuery({ queryKey: studioKeys.activity(studioId, before), queryFn: () => api<ActivityPage>(paths.activity(studioId, before === undefined ? undefined : String(before))) });
}

export function useCreateStudio() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: StudioNameBody) => api<CreatedStudio>(paths.studios(), { body }),
    onSuccess: () => void qc.invalidateQueries({ queryKey: studioKeys.all() }),
  });
}

export function useRenameStudio(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: StudioNameBody) => api<RenamedStudio>(paths.studio(studioId), { method: "PATCH", body }),
    onSuccess: () => void qc.invalidateQueries({ queryKey: studioKeys.all() }),
  });
}
