// GET /api/studios – the studios I belong to; POST /api/studios – create one (I become its owner).
import { route } from "@/lib/server/route";
import { createStudio, listStudiosForUser } from "@/lib/server/studios";
import { studioNameSchema } from "@/lib/validation/studio";

export const GET = route({ access: { kind: "user" } }, async ({ user }) => ({ studios: await listStudiosForUser(user.id) }));

export const POST = route({ access: { kind: "user" }, body: studioNameSchema }, async ({ user, body }) => createStudio({ userId: user.id, name: body.name }));
