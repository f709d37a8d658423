// Invitations: the pending ones (owners), inviting someone, withdrawing an invitation, accepting one as the
// signed-in person. Query keys, queries and mutations; components call these hooks.
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "./api";
import { paths } from "./paths";
import { memberKeys } from "./members";
import { studioKeys } from "./studios";
import type { AcceptedInvitation, CreatedInvitation, InvitationList, InviteBody } from "@/lib/api-types/invitations";

export const invitationKeys = {
  list: (studioId: string) => ["invitations", studioId] as const,
};

export function useInvitations(studioId: string) {
  return useQuery({ queryKey: invitationKeys.list(studioId), queryFn: async () => (await api<InvitationList>(paths.invitations(studioId))).invitations });
}

export function useInvite(studioId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: InviteBody) => api<CreatedInvitation>(paths.invitations(studioId), { body }),
    onSuccess: () => void qc.invalidateQueries({ queryKey: invitationKeys.list(studioId) }),
  });
}

export function useRevokeInvitation(studioId: string, invitationId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api(paths.invitation(studioId, invitationId), { method: "DELETE" }),
    onSuccess: () => void qc.invalidateQueries({ queryKey: invitationKeys.list(studioId) }),
  });
}

export function useAcceptInvitation(token: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api<AcceptedInvitation>(paths.acceptInvitation(), { body: { token } }),
    onSuccess: (out) => {
      void qc.invalidateQueries({ queryKey: studioKeys.all() });
      void qc.invalidateQueries({ queryKey: memberKeys.list(out.studioId) });
    },
  });
}
