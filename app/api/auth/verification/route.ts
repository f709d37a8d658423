// POST /api/auth/verification – confirm an address with its token ({ token }) or ask for a new link ({ email }).
import { NextResponse } from "next/server";
import { z } from "zod";
import { route } from "@/lib/server/route";
import { resendVerification, verifyEmail } from "@/lib/server/auth/accounts";
import { email, tokenSchema } from "@/lib/validation/auth";

export const POST = route(
  { access: { kind: "public" }, body: z.union([tokenSchema, z.strictObject({ email })]) },
  async ({ body }) => {
    if ("token" in body) {
      await verifyEmail(body.token);
      return NextResponse.json({ verified: true });
    }
    resendVerification(body.email);
    return NextResponse.json({ message: "If that address has an unconfirmed account, a new link is on its way." }, { status: 202 });
  },
);
