// Kits of a studio: the list, one kit, the instruments a slot can hold, and creating, saving, renaming,
// copying, importing and deleting. Query keys, queries and mutations; components call these hooks.
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "./api";
import { paths } from "./paths";
import type { CreateKitBody, InstrumentChoiceList, KitAnswer, KitList, KitRecord } from "@/lib/api-types/kits";
import type { KitSlot } from "@/lib/audit/types";

export const kitKeys = {
  list: (studioId: string) => ["kits", studioId] as const,
  detail: (kitId: string) => ["kit", kitId] as const,
  instrumentChoices: (studioId: string) => ["kits", studioId, "instruments"] as const,
};

export function useKits(studioId: string) {
  return useQuery({ queryKey: kitKeys.list(studioId), queryFn: async () => (await api<KitList>(paths.kits(studioId))).kits });
}

export function useKit(studioId: string, kitId: string) {
  return useQuery({ queryKey: kitKeys.detail(kitId), queryFn: async () => (await api<KitAnswer>(paths.kit(studioId, kitId))).kit });
}

/** The catalogued instruments of every library of the studio that a kit slot can hold. */
export function useInstrumentChoices(studioId: string) {
  return useQuery({ queryKey: kitKeys.instrumentChoices(studioId), queryFn: async () => (await api<InstrumentChoiceList>(paths.kitInstruments(studioId))).instruments });
}

/** After a write: the kit (when one is named) and the studio's list are read again. */
function useKitChanged(studioId: string) {
  const qc = useQueryClient();
  return (kit?: KitRecord) => {
    if (kit) qc.setQueryData(kitKeys.detail(kit.id), kit);
    void qc.invalidateQueries({ queryKey: kitKeys.list(studioId) });
  };
}

const kitOf = async (p: Promise<KitAnswer>) => (await p).kit;

export function useCreateKit(studioId: string) {
  const changed = useKitChanged(studioId);
  return useMutation({ mutationFn: (body: CreateKitBody) => kitOf(api<KitAnswer>(paths.kits(studioId), { body })), onSuccess: changed });
}

export function useSaveKitSlots(studioId: string, kitId: string) {
  const changed = useKitChanged(studioId);
  return useMutation({ mutationFn: (slots: KitSlot[]) => kitOf(api<KitAnswer>(paths.kit(studioId, kitId), { method: "PATCH", body: { slots } })), onSuccess: changed });
}

export function useRenameKit(studioId: string, kitId: string) {
  const changed = useKitChanged(studioId);
  return useMutation({ mutationFn: (name: string) => kitOf(api<KitAnswer>(paths.kit(studioId, kitId), { method: "PATCH", body: { name } })), onSuccess: changed });
}

export function useCopyKit(studioId: string, kitId: string) {
  const changed = useKitChanged(studioId);
  return useMutation({ mutationFn: (name: string) => kitOf(api<KitAnswer>(paths.kitCopy(studioId, kitId), { body: { name } })), onSuccess: changed });
}

/** Creates a kit from a kitwright.kit/v1 file's content (checked by the server). */
export function useImportKit(studioId: string) {
  const changed = useKitChanged(studioId);
  return useMutation({ mutationFn: (file: unknown) => kitOf(api<KitAnswer>(paths.kitImport(studioId), { body: file })), onSuccess: changed });
}

export function useDeleteKit(studioId: string, kitId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api(paths.kit(studioId, kitId), { method: "DELETE" }),
    onSuccess: () => {
      qc.removeQueries({ queryKey: kitKeys.detail(kitId) });
      void qc.invalidateQueries({ queryKey: kitKeys.list(studioId) });
    },
  });
}
