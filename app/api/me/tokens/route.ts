// GET /api/me/tokens – my personal API tokens (never a secret); POST – make one (the answer holds the secret,
// shown this once). Signed-in sessions only: a token cannot make or list tokens.
import { route } from "@/lib/server/route";
import { createApiToken, listApiTokens } from "@/lib/server/auth/api-tokens";
import { createTokenSchema } from "@/lib/validation/token";

export const GET = route({ access: { kind: "user" } }, async ({ user }) => ({ tokens: await listApiTokens({ userId: user.id }) }));

export const POST = route({ access: { kind: "user" }, body: createTokenSchema }, async ({ user, body }) => createApiToken({ userId: user.id, input: body }));
