// POST /api/invitations/accept – accept an invitation as the signed-in person ({ token }).
import { route } from "@/lib/server/route";
import { acceptInvitation } from "@/lib/server/studios";
import { tokenSchema } from "@/lib/validation/auth";

export const POST = route({ access: { kind: "user" }, body: tokenSchema }, async ({ user, body }) => acceptInvitation({ token: body.token, userId: user.id }));
