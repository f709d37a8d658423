// DELETE /api/me/tokens/:tokenId – revoke one of my personal API tokens (the next request with it answers 401).
import { route } from "@/lib/server/route";
import { revokeApiToken } from "@/lib/server/auth/api-tokens";
import { tokenParams } from "@/lib/validation/token";

export const DELETE = route({ access: { kind: "user" }, params: tokenParams }, async ({ user, params }) => {
  await revokeApiToken({ userId: user.id, tokenId: params.tokenId });
  return null;
});
