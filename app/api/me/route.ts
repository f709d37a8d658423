// GET /api/me – the signed-in person and their studios.
import { route } from "@/lib/server/route";
import { listStudiosForUser } from "@/lib/server/studios";

export const GET = route({ access: { kind: "user" } }, async ({ user }) => ({ user, studios: await listStudiosForUser(user.id) }));
