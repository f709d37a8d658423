// POST /api/auth/signup – create an account; mails a verification link, or, with a matching invitation
// token, confirms the address and joins the studio at once. A taken address gets the same answer as a new
// one (its owner is told by mail), so the answer never says whether an address has an account.
// With the caught-mail page on (local profiles), the browser gets a key that lets it see, signed out, the
// verification mail of the account it just created, and nothing else (lib/server/mail-catcher.ts).
import { NextResponse } from "next/server";
import { z } from "zod";
import { route } from "@/lib/server/route";
import { env } from "@/lib/server/env";
import { isMailKey, MAIL_KEY_COOKIE, MAIL_KEY_HEADER, MAIL_KEY_MAX_AGE_S, mailKeyTag, mailPageEnabled, newMailKey } from "@/lib/server/mail-catcher";
import { signUp } from "@/lib/server/auth/accounts";
import { acceptInvitationForNewAccount } from "@/lib/server/studios";
import { signUpSchema } from "@/lib/validation/auth";

export const POST = route(
  { access: { kind: "public" }, body: signUpSchema.extend({ invite: z.string().min(20).max(200).optional() }) },
  async ({ body, req }) => {
    const { invite, ...input } = body;
    const sent = req.cookies.get(MAIL_KEY_COOKIE)?.value;
    const key = mailPageEnabled() ? (isMailKey(sent) ? sent : newMailKey()) : null;
    const mailHeaders = key ? { [MAIL_KEY_HEADER]: mailKeyTag(key) } : undefined;
    const { id } = await signUp(input, { sendVerification: !invite, mailHeaders });
    const joined = invite && id ? await acceptInvitationForNewAccount({ token: invite, userId: id, email: input.email, mailHeaders }) : null;
    const res = NextResponse.json({ verified: !!joined, studioId: joined?.studioId ?? null }, { status: 201 });
    if (key) res.cookies.set(MAIL_KEY_COOKIE, key, { httpOnly: true, sameSite: "lax", secure: env().KW_APP_URL.startsWith("https://"), path: "/", maxAge: MAIL_KEY_MAX_AGE_S });
    return res;
  },
);
