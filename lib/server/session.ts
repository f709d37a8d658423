import "server-only";
// Session helpers for server components: who is signed in, and their role in a studio (read from the
// database on every request). Pages call these; route handlers use lib/server/route.ts.
// Each is wrapped in React's cache(): the layouts and the page of one request share one session decode, one
// user row and one list of the user's studios (with roles), instead of each asking again.
import { cache } from "react";
import { cookies, headers } from "next/headers";
import { getToken } from "next-auth/jwt";
import { notFound, redirect } from "next/navigation";
import { env } from "./env";
import { liveSessionUser } from "./auth/sessions";
import { listStudiosForUser } from "./studios";
import type { StudioSummary } from "@/lib/api-types/studios";
import type { Role } from "@/lib/permissions";

/** The signed-in user while their session is live (lib/server/auth/sessions.ts), else null. */
export const currentUser = cache(async (): Promise<{ id: string; email: string; name: string } | null> => {
  const e = env();
  const token = await getToken({ req: { cookies: await cookies(), headers: await headers() } as never, secret: e.NEXTAUTH_SECRET, secureCookie: e.KW_APP_URL.startsWith("https://") });
  return (await liveSessionUser(token))?.user ?? null;
});

/** The user's studios with their role in each (one query per request). */
export const myStudios = cache((userId: string): Promise<StudioSummary[]> => listStudiosForUser(userId));

export async function requireUser(next?: string) {
  const u = await currentUser();
  if (!u) redirect(next ? `/sign-in?next=${encodeURIComponent(next)}` : "/sign-in");
  return u;
}

/** The studio and my role in it; 404 when I am not a member (its existence is not admitted). Pages check finer permissions themselves and show <NotAllowed>. */
export async function requireStudio(studioId: string): Promise<{ user: { id: string; email: string; name: string }; studio: { id: string; name: string; role: Role } }> {
  const user = await requireUser(`/s/${studioId}`);
  if (!/^[0-9a-f-]{36}$/i.test(studioId)) notFound();
  const s = (await myStudios(user.id)).find((x) => x.id === studioId);
  if (!s) notFound();
  return { user, studio: { id: s.id, name: s.name, role: s.role } };
}
