// Libraries of a studio: the list, one library, its health findings and plots, and creating, changing and
// deleting one. Query keys, queries and mutations; components call these hooks.
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "./api";
import { paths } from "./paths";
import type { CreatedLibrary, CreateLibraryBody, HealthView, LibraryList, LibraryPlots, LibrarySummary, UpdateLibraryBody, VelocityResponseView } from "@/lib/api-types/libraries";

export const libraryKeys = {
  velocity: (libraryId: string, curve: string, rangeDb: number | null) => ["velocity-response", libraryId, curve, rangeDb] as const,
  list: (studioId: string) => ["libraries", studioId] as const,
  detail: (libraryId: string) => ["library", libraryId] as const,
  health: (libraryId: string) => ["library", libraryId, "health"] as const,
  plots: (libraryId: string) => ["library", libraryId, "plots"] as const,
};

export function useLibraries(studioId: string) {
  return useQuery({ queryKey: libraryKeys.list(studioId), queryFn: async () => (await api<LibraryList>(paths.libraries(studioId))).libraries });
}

export function useLibrary(studioId: string, libraryId: string) {
  return useQuery({ queryKey: libraryKeys.detail(libraryId), queryFn: () => api<LibrarySummary>(paths.library(studioId, libraryId)) });
}

export function useLibraryHealth(studioId: string, libraryId: string) {
  return useQuery({ queryKey: libraryKeys.health(libraryId), queryFn: () => api<HealthView>(paths.libraryHealth(studioId, libraryId)) });
}

export function useLibraryPlots(studioId: string, libraryId: string) {
  return useQuery({ queryKey: libraryKeys.plots(libraryId), queryFn: () => api<LibraryPlots>(paths.libraryPlots(studioId, libraryId)) });
}

/** The velocity response against a curve (the library's own until the page picks another); `initial` from the server render. */
export function useVelocityResponse(studioId: string, libraryId: string, curve: "dls" | "dannenberg", rangeDb: number | null, initial?: VelocityResponseView) {
  const q = new URLSearchParams({ curve, ...(curve === "dannenberg" && rangeDb !== null ? { rangeDb: String(rangeDb) } : {}) });
  return useQuery({
    queryKey: libraryKeys.velocity(libraryId, curve, curve === "dannenberg" ? rangeDb : null),
    queryFn: () => api<VelocityResponseView>(`${paths.velocityResponse(studioId, libraryId)}?${q}`),
    initialData: initial && initial.curve.kind === curve && (curve === "dls" || rangeDb === null) ? initial : undefined,
    placeholderData: (prev) => prev,
  });
}

export function useCreateLibrary(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateLibraryBody) => api<CreatedLibrary>(paths.libraries(studioId), { body }),
    onSuccess: () => void qc.invalidateQueries({ queryKey: libraryKeys.list(studioId) }),
  });
}

/** Rename, describe or change the velocity curve (a new curve sorts the library again). */
export function useUpdateLibrary(studioId: string, libraryId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: UpdateLibraryBody) => api<LibrarySummary>(paths.library(studioId, libraryId), { method: "PATCH", body }),
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: libraryKeys.list(studioId) });
      void qc.invalidateQueries({ queryKey: libraryKeys.detail(libraryId) });
    },
  });
}

/** Deletes the library with its stored files (owners); `confirmName` repeats the library's name. */
export function useDeleteLibrary(studioId: string, libraryId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (confirmName: string) => api(paths.library(studioId, libraryId), { method: "DELETE", body: { confirmName } }),
    onSuccess: () => {
      qc.removeQueries({ queryKey: libraryKeys.detail(libraryId) });
      void qc.invalidateQueries({ queryKey: libraryKeys.list(studioId) });
    },
  });
}
