import "server-only";
// next-auth configuration: e-mail + password credentials, JWT sessions carrying the user id and the id of a
// session row (lib/server/auth/sessions.ts). The session row, membership and role are read from the database
// on every request, so signing out, a password reset or a removal takes effect at once.
import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import { env } from "../env";
import { clientAddress } from "../client-address";
import { AppError } from "../errors";
import { checkCredentials } from "./accounts";
import { endSession, SESSION_MAX_AGE_S, startSession } from "./sessions";
import { signInSchema } from "@/lib/validation/auth";

export function authOptions(): NextAuthOptions {
  const e = env();
  const secure = e.KW_APP_URL.startsWith("https://");
  return {
    secret: e.NEXTAUTH_SECRET,
    session: { strategy: "jwt", maxAge: SESSION_MAX_AGE_S },
    useSecureCookies: secure,
    pages: { signIn: "/sign-in", error: "/sign-in" },
    events: {
      // signing out ends this device's session: a copy of its cookie no longer works
      async signOut({ token }) {
        if (typeof token?.sid === "string") await endSession(token.sid);
      },
    },
    providers: [
      CredentialsProvider({
        name: "E-mail and password",
        credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
        async authorize(credentials, req) {
          const parsed = signInSchema.safeParse({ email: credentials?.email ?? "", password: credentials?.password ?? "" });
          if (!parsed.success) throw new Error("Enter your e-mail address and password.");
          try {
            const u = await checkCredentials(parsed.data.email, parsed.data.password, clientAddress(req?.headers));
            return { id: u.id, email: u.email, name: u.name };
          } catch (err) {
            if (err instanceof AppError) throw new Error(err.message);
            throw new Error("Sign-in is unavailable right now; try again shortly.");
          }
        },
      }),
    ],
    callbacks: {
      async jwt({ token, user }) {
        if (user) {
          token.uid = user.id;
          token.sid = await startSession(user.id);
        }
        return token;
      },
      async session({ session, token }) {
        if (session.user) session.user.id = token.uid as string;
        return session;
      },
    },
  };
}
