// Progress of a library: counts per sample state, polled every 1.5 s while samples are queued or measuring, or
// while the library is being catalogued after a change. Query keys and the query; components call it.
import { useCallback } from "react";
import { useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "./api";
import { paths } from "./paths";
import type { LibraryProgress } from "@/lib/api-types/libraries";

export const progressKeys = {
  library: (libraryId: string) => ["progress", libraryId] as const,
};

export function useProgress(studioId: string, libraryId: string, initial?: LibraryProgress) {
  return useQuery({
    queryKey: progressKeys.library(libraryId),
    queryFn: () => api<LibraryProgress>(paths.libraryProgress(studioId, libraryId)),
    initialData: initial,
    refetchInterval: (q) => ((q.state.data?.pending ?? 1) > 0 || (q.state.data?.cataloguing ?? true) ? 1500 : false),
  });
}

/** Ask for the progress again now (after files were sent). */
export function useRefreshProgress(libraryId: string) {
  const qc = useQueryClient();
  return useCallback(() => void qc.invalidateQueries({ queryKey: progressKeys.library(libraryId) }), [qc, libraryId]);
}
