// POST /api/auth/password-reset/confirm – set a new password with a single-use reset token.
import { NextResponse } from "next/server";
import { route } from "@/lib/server/route";
import { resetPassword } from "@/lib/server/auth/accounts";
import { resetConfirmSchema } from "@/lib/validation/auth";

export const POST = route({ access: { kind: "public" }, body: resetConfirmSchema }, async ({ body }) => {
  await resetPassword(body.token, body.password);
  return NextResponse.json({ reset: true });
});
