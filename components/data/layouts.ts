// Layouts of a studio: the list, one layout, and creating, saving, renaming, copying, importing and deleting.
// Query keys, queries and mutations; components call these hooks.
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "./api";
import { paths } from "./paths";
import type { CreateLayoutBody, LayoutAnswer, LayoutList, LayoutRecord, LayoutShareAnswer, PublishLayoutBody, SuggestLayoutAnswer, SuggestLayoutBody, UpdateLayoutBody } from "@/lib/api-types/layouts";

export const layoutKeys = {
  list: (studioId: string) => ["layouts", studioId] as const,
  detail: (layoutId: string) => ["layout", layoutId] as const,
  share: (layoutId: string) => ["layout-share", layoutId] as const,
};

export function useLayouts(studioId: string) {
  return useQuery({ queryKey: layoutKeys.list(studioId), queryFn: async () => (await api<LayoutList>(paths.layouts(studioId))).layouts });
}

export function useLayout(studioId: string, layoutId: string) {
  return useQuery({ queryKey: layoutKeys.detail(layoutId), queryFn: async () => (await api<LayoutAnswer>(paths.layout(studioId, layoutId))).layout });
}

/** After a write: the layout (when one is named) and the studio's list are read again. */
function useLayoutChanged(studioId: string) {
  const qc = useQueryClient();
  return (layout?: LayoutRecord) => {
    if (layout) qc.setQueryData(layoutKeys.detail(layout.id), layout);
    void qc.invalidateQueries({ queryKey: layoutKeys.list(studioId) });
  };
}

const layoutOf = async (p: Promise<LayoutAnswer>) => (await p).layout;

export function useCreateLayout(studioId: string) {
  const changed = useLayoutChanged(studioId);
  return useMutation({ mutationFn: (body: CreateLayoutBody) => layoutOf(api<LayoutAnswer>(paths.layouts(studioId), { body })), onSuccess: changed });
}

/** Saves the pads, pedal and slots (the whole layout; the server keeps the row id). */
export function useSaveLayout(studioId: string, layoutId: string) {
  const changed = useLayoutChanged(studioId);
  return useMutation({ mutationFn: (layout: NonNullable<UpdateLayoutBody["layout"]>) => layoutOf(api<LayoutAnswer>(paths.layout(studioId, layoutId), { method: "PATCH", body: { layout } })), onSuccess: changed });
}

export function useRenameLayout(studioId: string, layoutId: string) {
  const changed = useLayoutChanged(studioId);
  return useMutation({ mutationFn: (name: string) => layoutOf(api<LayoutAnswer>(paths.layout(studioId, layoutId), { method: "PATCH", body: { name } })), onSuccess: changed });
}

export function useCopyLayout(studioId: string, layoutId: string) {
  const changed = useLayoutChanged(studioId);
  return useMutation({ mutationFn: (name: string) => layoutOf(api<LayoutAnswer>(paths.layoutCopy(studioId, layoutId), { body: { name } })), onSuccess: changed });
}

/** Creates a layout from a kitwright.layout/v1 file's content (checked by the server). */
export function useImportLayout(studioId: string) {
  const changed = useLayoutChanged(studioId);
  return useMutation({ mutationFn: (file: unknown) => layoutOf(api<LayoutAnswer>(paths.layoutImport(studioId), { body: file })), onSuccess: changed });
}

/** A layout suggested for a kit and a surface (nothing saved: accept it with useImportLayout). */
export function useSuggestLayout(studioId: string) {
  return useMutation({ mutationFn: (body: SuggestLayoutBody) => api<SuggestLayoutAnswer>(paths.layoutSuggest(studioId), { body }) });
}

/** Deletes the layout and its saved audits. */
export function useDeleteLayout(studioId: string, layoutId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api(paths.layout(studioId, layoutId), { method: "DELETE" }),
    onSuccess: () => {
      qc.removeQueries({ queryKey: layoutKeys.detail(layoutId) });
      void qc.invalidateQueries({ queryKey: layoutKeys.list(studioId) });
    },
  });
}

/** The layout's share link (null when not published); publishing, a new link and revoking update it. */
export function useLayoutShare(studioId: string, layoutId: string) {
  return useQuery({ queryKey: layoutKeys.share(layoutId), queryFn: async () => (await api<LayoutShareAnswer>(paths.layoutShare(studioId, layoutId))).share });
}

export function usePublishLayout(studioId: string, layoutId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: async (body: PublishLayoutBody) => (await api<LayoutShareAnswer>(paths.layoutShare(studioId, layoutId), { method: "PUT", body })).share,
    onSuccess: (share) => qc.setQueryData(layoutKeys.share(layoutId), share),
  });
}

export function useRevokeShare(studioId: string, layoutId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api(paths.layoutShare(studioId, layoutId), { method: "DELETE" }),
    onSuccess: () => qc.setQueryData(layoutKeys.share(layoutId), null),
  });
}

/** Copies a shared layout (by its link's token) into one of the person's studios. */
export function useImportShared() {
  return useMutation({ mutationFn: ({ studioId, token }: { studioId: string; token: string }) => layoutOf(api<LayoutAnswer>(paths.sharedImport(studioId), { body: { token } })) });
}
