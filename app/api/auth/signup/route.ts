// POST /api/auth/signup – create an account; mails a verification link, or, with a matching invitation
// token, confirms the address and joins the studio at once.
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
    if (invite) {
      const joined = await acceptInvitationForNewAccount({ token: invite, userId: id, email: input.email });
      return { id, verified: !!joined, studioId: joined?.studioId ?? null };
    }
    return { id, verified: false, studioId: null };
  },
);
