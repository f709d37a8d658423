// Instruments of a library: the list, renaming one (kept across cataloguings), merging several into one. Query keys,
// queries and mutations; components call these hooks.
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "./api";
import { paths } from "./paths";
import { sampleKeys } from "./samples";
import type { InstrumentList, MergedInstruments, MergeInstrumentsBody, RenamedInstrument } from "@/lib/api-types/instruments";

export const instrumentKeys = {
  library: (libraryId: string) => ["instruments", libraryId] as const,
};

export function useInstruments(studioId: string, libraryId: string) {
  return useQuery({ queryKey: instrumentKeys.library(libraryId), queryFn: async () => (await api<InstrumentList>(paths.instruments(studioId, libraryId))).instruments });
}

export function useRenameInstrument(studioId: string, libraryId: string, instrumentId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (name: string) => api<RenamedInstrument>(paths.instrument(studioId, libraryId, instrumentId), { method: "PATCH", body: { name } }),
    onSuccess: () => void qc.invalidateQueries({ queryKey: instrumentKeys.library(libraryId) }),
  });
}

export function useMergeInstruments(studioId: string, libraryId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: MergeInstrumentsBody) => api<MergedInstruments>(paths.mergeInstruments(studioId, libraryId), { body }),
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: instrumentKeys.library(libraryId) });
      void qc.invalidateQueries({ queryKey: sampleKeys.library(libraryId) });
    },
  });
}
