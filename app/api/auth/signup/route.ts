// POST /api/auth/signup – create an account; mails a verification link, or, with a matching invitation
// token, confirms the address and joins the studio at once. A taken address gets the same answer as a new
// one (its owner is told by mail), so the answer never says whether an address has an account.
import { z } from "zod";
import { route } from "@/lib/server/route";
import { signUp } from "@/lib/server/auth/accounts";
import { acceptInvitationForNewAccount } from "@/lib/server/studios";
import { signUpSchema } from "@/lib/validation/auth";

export const POST = route(
  { access: { kind: "public" }, body: signUpSchema.extend({ invite: z.string().min(20).max(200).optional() }) },
  async ({ body }) => {
    const { invite, ...input } = body;
    const { id } = await signUp(input, { sendVerification: !invite });
    const joined = invite && id ? await acceptInvitationForNewAccount({ token: invite, userId: id, email: input.email }) : null;
    return { verified: !!joined, studioId: joined?.studioId ?? null };
  },
);
