// POST /api/auth/password-reset – mail a reset link (always 202, at once: the lookup and the mail happen after the
// answer, so neither the answer nor its time reveals whether an account exists).
import { NextResponse } from "next/server";
import { route } from "@/lib/server/route";
import { requestPasswordReset } from "@/lib/server/auth/accounts";
import { emailOnlySchema } from "@/lib/validation/auth";

export const POST = route({ access: { kind: "public" }, body: emailOnlySchema }, async ({ body }) => {
  requestPasswordReset(body.email);
  return NextResponse.json({ message: "If that address has an account, a reset link is on its way." }, { status: 202 });
});
