// GET/POST /api/auth/* – next-auth's own endpoints (sign-in, sign-out, session, CSRF token).
import NextAuth from "next-auth";
import { authOptions } from "@/lib/server/auth/options";
import type { NextRequest } from "next/server";

type Ctx = { params: Promise<{ nextauth: string[] }> };
const handle = (req: NextRequest, ctx: Ctx) => NextAuth(req as never, ctx as never, authOptions()) as Promise<Response>;
export const GET = Object.assign(handle, { meta: { access: { kind: "public" as const }, external: true } });
export const POST = Object.assign(handle, { meta: { access: { kind: "public" as const }, external: true } });
