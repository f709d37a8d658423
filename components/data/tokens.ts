// Personal API tokens of the signed-in person: the list (with last use), making one (the answer holds the
// secret, shown once) and revoking one. Query keys, queries and mutations; components call these hooks.
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "./api";
import { paths } from "./paths";
import type { ApiTokenList, CreatedToken, CreateTokenBody } from "@/lib/api-types/tokens";

export const tokenKeys = {
  list: () => ["tokens", "mine"] as const,
};

export function useApiTokens() {
  return useQuery({ queryKey: tokenKeys.list(), queryFn: async () => (await api<ApiTokenList>(paths.apiTokens())).tokens });
}

export function useCreateApiToken() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateTokenBody) => api<CreatedToken>(paths.apiTokens(), { body }),
    onSuccess: () => void qc.invalidateQueries({ queryKey: tokenKeys.list() }),
  });
}

export function useRevokeApiToken(tokenId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api(paths.apiToken(tokenId), { method: "DELETE" }),
    onSuccess: () => void qc.invalidateQueries({ queryKey: tokenKeys.list() }),
  });
}
