// Factories shared by the demo seed and the integration tests: they write rows directly (no mail, no HTTP).
import crypto from "node:crypto";
import bcrypt from "bcryptjs";
import type { Knex } from "knex";
import { encode } from "next-auth/jwt";
import { CREATOR_ROLE, type Role } from "../lib/permissions";

export type { Role };

export async function createUser(
  k: Knex,
  u: { email: string; name: string; password: string; verified?: boolean },
): Promise<{ id: string; email: string; name: string; password: string }> {
  const id = crypto.randomUUID();
  await k("users").insert({
    id,
    email: u.email.toLowerCase(),
    name: u.name,
    password_hash: await bcrypt.hash(u.password, 10),
    email_verified_at: u.verified === false ? null : new Date(),
  });
  return { id, email: u.email.toLowerCase(), name: u.name, password: u.password };
}

/**
 * A session of the user and its cookie (`name=value`), as signing in makes them (lib/server/auth/sessions.ts,
 * lib/server/auth/options.ts): a `sessions` row, and a next-auth JWT naming the user and that row.
 */
export async function createSessionCookie(k: Knex, userId: string, secret: string): Promise<string> {
  const sid = crypto.randomUUID();
  await k("sessions").insert({ id: sid, user_id: userId, expires_at: new Date(Date.now() + 7 * 24 * 3600_000) });
  return `next-auth.session-token=${await encode({ token: { uid: userId, sid, sub: userId }, secret })}`;
}

export async function createStudio(k: Knex, s: { name: string; ownerId: string }): Promise<{ id: string; name: string }> {
  const id = crypto.randomUUID();
  await k("studios").insert({ id, name: s.name, created_by: s.ownerId });
  await k("memberships").insert({ studio_id: id, user_id: s.ownerId, role: CREATOR_ROLE });
  await k("activity").insert({ studio_id: id, actor_id: s.ownerId, action: "studio.created", subject_type: "studio", subject_id: id, details: JSON.stringify({ name: s.name }) });
  return { id, name: s.name };
}

export async function addMember(k: Knex, m: { studioId: string; userId: string; role: Role }): Promise<void> {
  await k("memberships").insert({ studio_id: m.studioId, user_id: m.userId, role: m.role });
}
