// GET /api/whoami – who the request acts for: a signed-in session, or a personal API token with its studio
// and its role now (the command line checks its token with this before it reads a folder).
import { route } from "@/lib/server/route";
import type { Whoami } from "@/lib/api-types/tokens";

export const GET = route({ access: { kind: "user" }, tokens: true }, async ({ user, token }): Promise<Whoami> => ({ user, via: token ? "token" : "session", token }));
