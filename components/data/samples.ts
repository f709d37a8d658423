// Samples of a library: one page of the browser (sorted, filtered and paged on the server), one sample's
// detail, its stored audio, and bulk relabel / confirm. Query keys, queries and mutations; components call
// these hooks.
import { useCallback } from "react";
import { keepPreviousData, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api, apiBytes } from "./api";
import { paths } from "./paths";
import type { ConfirmAnswer, RelabelAnswer, RelabelBody, SampleDetail, SamplesPage } from "@/lib/api-types/samples";

export const sampleKeys = {
  /** Every page of a library's samples (what a change of labels or states makes stale). */
  library: (libraryId: string) => ["samples", libraryId] as const,
  page: (libraryId: string, search: string) => ["samples", libraryId, search] as const,
  detail: (sampleId: string) => ["sample", sampleId] as const,
};

/** One page of the browser; `search` is the URL query the page keeps its sorting, filters and page in. */
export function useSamplesPage(studioId: string, libraryId: string, search: string) {
  return useQuery({
    queryKey: sampleKeys.page(libraryId, search),
    queryFn: () => api<SamplesPage>(paths.samples(studioId, libraryId, search)),
    placeholderData: keepPreviousData,
  });
}

export function useSample(studioId: string, libraryId: string, sampleId: string) {
  return useQuery({ queryKey: sampleKeys.detail(sampleId), queryFn: () => api<SampleDetail>(paths.sample(studioId, libraryId, sampleId)) });
}

/** The stored WAV of a sample, for playback in the browser. */
export function loadSampleAudio(studioId: string, libraryId: string, sampleId: string): Promise<ArrayBuffer> {
  return apiBytes(paths.sampleAudio(studioId, libraryId, sampleId), "the sample audio");
}

/** Ask for the library's sample pages again now. */
export function useRefreshSamples(libraryId: string) {
  const qc = useQueryClient();
  return useCallback(() => void qc.invalidateQueries({ queryKey: sampleKeys.library(libraryId) }), [qc, libraryId]);
}

/** After labels change the library is catalogued again: pages are read now and once more 3 s later. */
function useRefreshAfterLabels(libraryId: string) {
  const refresh = useRefreshSamples(libraryId);
  return useCallback(() => {
    refresh();
    setTimeout(refresh, 3000);
  }, [refresh]);
}

export function useRelabelSamples(studioId: string, libraryId: string) {
  const onSuccess = useRefreshAfterLabels(libraryId);
  return useMutation({ mutationFn: (body: RelabelBody) => api<RelabelAnswer>(paths.relabelSamples(studioId, libraryId), { body }), onSuccess });
}

export function useConfirmSamples(studioId: string, libraryId: string) {
  const onSuccess = useRefreshAfterLabels(libraryId);
  return useMutation({ mutationFn: (sampleIds: string[]) => api<ConfirmAnswer>(paths.confirmSamples(studioId, libraryId), { body: { sampleIds } }), onSuccess });
}
