import "server-only";
// Session helpers for server components: who is signed in, and their role in a studio (read from the
// database on every request). Pages call these; route handlers use lib/server/route.ts.
import { getServerSession } from "next-auth";
import { notFound, redirect } from "next/navigation";
import { authOptions } from "./auth/options";
import { findUserById } from "./auth/accounts";
import { getMembershipRole, getStudio } from "./studios";
import type { Role } from "@/lib/permissions";

export async function currentUser(): Promise<{ id: string; email: string; name: string } | null> {
  const s = await getServerSession(authOptions());
  if (!s?.user?.id) return null;
  const u = await findUserById(s.user.id);
  return u ? { id: u.id, email: u.email, name: u.name } : null;
}

export async function requireUser(next?: string) {
  const u = await currentUser();
  if (!u) redirect(next ? `/sign-in?next=${encodeURIComponent(next)}` : "/sign-in");
  return u;
}

/** The studio and my role in it; 404 when I am not a member (its existence is not admitted). Pages check finer permissions themselves and show <NotAllowed>. */
export async function requireStudio(studioId: string): Promise<{ user: { id: string; email: string; name: string }; studio: { id: string; name: string; role: Role } }> {
  const user = await requireUser(`/s/${studioId}`);
  if (!/^[0-9a-f-]{36}$/i.test(studioId)) notFound();
  const role = await getMembershipRole({ studioId, userId: user.id });
  if (!role) notFound();
  const s = await getStudio({ studioId });
  if (!s) notFound();
  return { user, studio: { id: s.id, name: s.name, role } };
}
