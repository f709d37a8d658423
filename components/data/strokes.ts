// A studio's own strokes: the list (with the built-ins per family), adding, changing and removing one, and what
// uses a stroke. Query keys, queries and mutations; components call these hooks.
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "./api";
import { paths } from "./paths";
import type { StudioStroke } from "@/lib/catalogue/strokes";
import type { StrokeInput, StrokeListAnswer, StrokeUses, UpdateStrokeRequest } from "@/lib/api-types/strokes";

export const strokeKeys = {
  /** The list and every uses answer of a studio (invalidated together after a change). */
  all: (studioId: string) => ["strokes", studioId] as const,
  list: (studioId: string) => ["strokes", studioId] as const,
  uses: (studioId: string, strokeId: string) => ["strokes", studioId, "uses", strokeId] as const,
};

export function useStrokes(studioId: string, initial?: StrokeListAnswer) {
  return useQuery({ queryKey: strokeKeys.list(studioId), queryFn: () => api<StrokeListAnswer>(paths.strokes(studioId)), initialData: initial });
}

export function useStrokeUses(studioId: string, strokeId: string | null) {
  return useQuery({
    queryKey: strokeKeys.uses(studioId, strokeId ?? ""),
    queryFn: async () => (await api<{ uses: StrokeUses }>(paths.strokeUses(studioId, strokeId!))).uses,
    enabled: !!strokeId,
  });
}

function useStrokesChanged(studioId: string) {
  const qc = useQueryClient();
  return () => void qc.invalidateQueries({ queryKey: strokeKeys.all(studioId) });
}

export function useAddStroke(studioId: string) {
  const changed = useStrokesChanged(studioId);
  return useMutation({ mutationFn: async (body: StrokeInput) => (await api<{ stroke: StudioStroke }>(paths.strokes(studioId), { body })).stroke, onSuccess: changed });
}

/** Change a stroke; renaming one in use answers 409 (ApiError.details: { uses, moveTo }) until moveUses is true. */
export function useUpdateStroke(studioId: string) {
  const changed = useStrokesChanged(studioId);
  return useMutation({
    mutationFn: async ({ strokeId, body }: { strokeId: string; body: UpdateStrokeRequest }) => (await api<{ stroke: StudioStroke }>(paths.stroke(studioId, strokeId), { method: "PATCH", body })).stroke,
    onSuccess: changed,
  });
}

/** Remove a stroke; one in use answers 409 (ApiError.details: { uses }) until moveTo says where its uses go. */
export function useDeleteStroke(studioId: string) {
  const changed = useStrokesChanged(studioId);
  return useMutation({
    mutationFn: ({ strokeId, moveTo }: { strokeId: string; moveTo?: string }) => api<{ moved: number }>(paths.stroke(studioId, strokeId, moveTo), { method: "DELETE" }),
    onSuccess: changed,
  });
}
