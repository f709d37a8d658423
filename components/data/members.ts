// Members of a studio: the list, changing a role, removing someone (owners). Query keys, queries and
// mutations; components call these hooks.
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "./api";
import { paths } from "./paths";
import type { Role } from "@/lib/permissions";
import type { MemberList, RoleChanged } from "@/lib/api-types/members";

export const memberKeys = {
  list: (studioId: string) => ["members", studioId] as const,
};

export function useMembers(studioId: string) {
  return useQuery({ queryKey: memberKeys.list(studioId), queryFn: async () => (await api<MemberList>(paths.members(studioId))).members });
}

export function useChangeRole(studioId: string, userId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (role: Role) => api<RoleChanged>(paths.member(studioId, userId), { method: "PATCH", body: { role } }),
    onSuccess: () => void qc.invalidateQueries({ queryKey: memberKeys.list(studioId) }),
  });
}

export function useRemoveMember(studioId: string, userId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api(paths.member(studioId, userId), { method: "DELETE" }),
    onSuccess: () => void qc.invalidateQueries({ queryKey: memberKeys.list(studioId) }),
  });
}
