import "server-only";
// Studios, memberships and invitations. Every function takes the studio id explicitly and scopes by it.
import type { Knex } from "knex";
import { db } from "./db";
import { AppError, notFound } from "./errors";
import { hashToken, newId, newToken } from "./ids";
import { appUrl, sendMail } from "./mail";
import { logActivity } from "./activity";
import { sendVerificationMail } from "./auth/accounts";
import { endAllSessions } from "./auth/sessions";
import { later } from "./later";
import { can, CREATOR_ROLE, isRole, KEPT_PERMISSION, rolesWith, roleWithArticle, type Role } from "@/lib/permissions";
import type { StudioSummary } from "@/lib/api-types/studios";
import type { Member } from "@/lib/api-types/members";
import type { Invitation, InvitationView } from "@/lib/api-types/invitations";

const INVITE_TTL_MS = 7 * 24 * 3600_000;

export async function listStudiosForUser(userId: string): Promise<StudioSummary[]> {
  const rows = await db()("memberships as m").join("studios as s", "s.id", "m.studio_id").where("m.user_id", userId).orderBy("s.name").select("s.id", "s.name", "m.role");
  // a role the code does not know grants nothing (roles are data)
  return rows.filter((r) => isRole(r.role)).map((r) => ({ id: r.id, name: r.name, role: r.role }));
}

export async function getStudio({ studioId }: { studioId: string }): Promise<{ id: string; name: string; createdAt: string } | null> {
  const r = await db()("studios").where({ id: studioId }).first();
  return r ? { id: r.id, name: r.name, createdAt: new Date(r.created_at).toISOString() } : null;
}

export async function createStudio({ userId, name }: { userId: string; name: string }): Promise<{ id: string }> {
  const id = newId();
  await db().transaction(async (trx) => {
    await trx("studios").insert({ id, name, created_by: userId });
    await trx("memberships").insert({ studio_id: id, user_id: userId, role: CREATOR_ROLE });
    await logActivity(trx, { studioId: id, actorId: userId, action: "studio.created", subjectType: "studio", subjectId: id, details: { name } });
  });
  return { id };
}

export async function renameStudio({ studioId, actorId, name }: { studioId: string; actorId: string; name: string }): Promise<void> {
  await db().transaction(async (trx) => {
    const before = await trx("studios").where({ id: studioId }).first("name");
    if (!before) throw notFound("The studio");
    await trx("studios").where({ id: studioId }).update({ name });
    await logActivity(trx, { studioId, actorId, action: "studio.renamed", subjectType: "studio", subjectId: studioId, details: { from: before.name, to: name } });
  });
}

/** Members by role as ROLES lists them (the column is an ENUM in that order), then by name. */
export async function listMembers({ studioId }: { studioId: string }): Promise<Member[]> {
  const rows = await db()("memberships as m").join("users as u", "u.id", "m.user_id").where("m.studio_id", studioId).orderBy([{ column: "m.role" }, { column: "u.name" }]).select("u.id", "u.name", "u.email", "m.role", "m.created_at");
  return rows.map((r) => ({ userId: r.id, name: r.name, email: r.email, role: r.role, since: new Date(r.created_at).toISOString() }));
}

/** Members who hold KEPT_PERMISSION (the owners), their rows locked until the transaction ends. */
async function lockedKeeperCount(trx: Knex.Transaction, studioId: string): Promise<number> {
  const rows = await trx("memberships").where({ studio_id: studioId }).forUpdate().select("role");
  return rows.filter((r) => can(r.role, KEPT_PERMISSION)).length;
}

/** The role that keeps a studio manageable, named for messages ("owner"). */
const keeper = () => rolesWith(KEPT_PERMISSION).join(" or ");
const aKeeper = () => rolesWith(KEPT_PERMISSION).map(roleWithArticle).join(" or ");

export async function changeRole({ studioId, actorId, userId, role }: { studioId: string; actorId: string; userId: string; role: Role }): Promise<void> {
  await db().transaction(async (trx) => {
    const keepers = await lockedKeeperCount(trx, studioId);
    const m = await trx("memberships").where({ studio_id: studioId, user_id: userId }).first("role");
    if (!m) throw notFound("That member");
    if (m.role === role) return;
    if (can(m.role, KEPT_PERMISSION) && !can(role, KEPT_PERMISSION) && keepers <= 1) throw new AppError("conflict", `A studio needs at least one ${keeper()}: make someone else ${aKeeper()} first.`);
    await trx("memberships").where({ studio_id: studioId, user_id: userId }).update({ role });
    await logActivity(trx, { studioId, actorId, action: "member.role-changed", subjectType: "user", subjectId: userId, details: { from: m.role, to: role } });
  });
}

export async function removeMember({ studioId, actorId, userId }: { studioId: string; actorId: string; userId: string }): Promise<void> {
  await db().transaction(async (trx) => {
    const keepers = await lockedKeeperCount(trx, studioId);
    const m = await trx("memberships as m").join("users as u", "u.id", "m.user_id").where({ "m.studio_id": studioId, "m.user_id": userId }).first("m.role", "u.email");
    if (!m) throw notFound("That member");
    if (can(m.role, KEPT_PERMISSION) && keepers <= 1) throw new AppError("conflict", `The last ${keeper()} cannot be removed: make someone else ${aKeeper()} first.`);
    await trx("memberships").where({ studio_id: studioId, user_id: userId }).delete();
    // the removed person is signed out everywhere: a session is not a pass into the studio they left
    await endAllSessions(trx, userId);
    await logActivity(trx, { studioId, actorId, action: "member.removed", subjectType: "user", subjectId: userId, details: { email: m.email, role: m.role } });
  });
}

export async function listInvitations({ studioId }: { studioId: string }): Promise<Invitation[]> {
  const rows = await db()("invitations as i").join("users as u", "u.id", "i.invited_by").where("i.studio_id", studioId).whereNull("i.accepted_at").whereNull("i.revoked_at").andWhere("i.expires_at", ">", new Date()).orderBy("i.created_at", "desc").select("i.*", "u.name as inviter");
  return rows.map((r) => ({ id: r.id, email: r.email, role: r.role, invitedBy: r.inviter, expiresAt: new Date(r.expires_at).toISOString(), createdAt: new Date(r.created_at).toISOString() }));
}

export async function createInvitation({ studioId, actorId, email, role }: { studioId: string; actorId: string; email: string; role: Role }): Promise<{ id: string }> {
  const id = newId();
  const token = newToken();
  const studio = await getStudio({ studioId });
  if (!studio) throw notFound("The studio");
  await db().transaction(async (trx) => {
    const member = await trx("memberships as m").join("users as u", "u.id", "m.user_id").where({ "m.studio_id": studioId, "u.email": email }).first("m.role");
    if (member) throw new AppError("conflict", `${email} is already a member of this studio (${member.role}).`);
    // A new invitation to the same address replaces any pending one.
    await trx("invitations").where({ studio_id: studioId, email }).whereNull("accepted_at").whereNull("revoked_at").update({ revoked_at: new Date() });
    await trx("invitations").insert({ id, studio_id: studioId, email, role, token_hash: hashToken(token), invited_by: actorId, expires_at: new Date(Date.now() + INVITE_TTL_MS) });
    await logActivity(trx, { studioId, actorId, action: "invitation.sent", subjectType: "invitation", subjectId: id, details: { email, role } });
  });
  const inviter = await db()("users").where({ id: actorId }).first("name");
  await sendMail({
    to: email,
    subject: `${inviter?.name ?? "Someone"} invited you to the studio "${studio.name}" on Kitwright`,
    text: `Hello,\n\n${inviter?.name ?? "Someone"} invited you to join the studio "${studio.name}" on Kitwright as ${roleWithArticle(role)}.\n\nAccept the invitation here (you can create an account on the way):\n\n${appUrl(`/invite/${token}`)}\n\nThe invitation expires in 7 days.\n`,
  });
  return { id };
}

export async function revokeInvitation({ studioId, actorId, invitationId }: { studioId: string; actorId: string; invitationId: string }): Promise<void> {
  await db().transaction(async (trx) => {
    const inv = await trx("invitations").where({ id: invitationId, studio_id: studioId }).whereNull("accepted_at").whereNull("revoked_at").first();
    if (!inv) throw notFound("That invitation");
    await trx("invitations").where({ id: invitationId }).update({ revoked_at: new Date() });
    await logActivity(trx, { studioId, actorId, action: "invitation.revoked", subjectType: "invitation", subjectId: invitationId, details: { email: inv.email, role: inv.role } });
  });
}

export async function viewInvitation(token: string): Promise<InvitationView> {
  const r = await db()("invitations as i").join("studios as s", "s.id", "i.studio_id").join("users as u", "u.id", "i.invited_by").where("i.token_hash", hashToken(token)).first("i.*", "s.name as studio_name", "u.name as inviter");
  if (!r) return { state: "invalid" };
  if (r.accepted_at) return { state: "accepted" };
  if (r.revoked_at) return { state: "revoked" };
  if (new Date(r.expires_at).getTime() < Date.now()) return { state: "expired" };
  return { state: "pending", studioName: r.studio_name, email: r.email, role: r.role, inviter: r.inviter };
}

/** Accepts an invitation for the signed-in user, whose address must be the invited one. */
export async function acceptInvitation({ token, userId }: { token: string; userId: string }): Promise<{ studioId: string }> {
  return db().transaction(async (trx) => {
    const inv = await trx("invitations").where({ token_hash: hashToken(token) }).forUpdate().first();
    if (!inv) throw new AppError("invalid-input", "This invitation link is not valid.");
    if (inv.accepted_at) throw new AppError("invalid-input", "This invitation has already been accepted.");
    if (inv.revoked_at) throw new AppError("invalid-input", "This invitation was withdrawn by the studio.");
    if (new Date(inv.expires_at).getTime() < Date.now()) throw new AppError("invalid-input", "This invitation has expired; ask the studio for a new one.");
    const user = await trx("users").where({ id: userId }).first("email");
    if (!user || user.email !== inv.email) throw new AppError("forbidden", `This invitation is for ${inv.email}. Sign in with that address to accept it.`);
    const existing = await trx("memberships").where({ studio_id: inv.studio_id, user_id: userId }).first();
    if (!existing) await trx("memberships").insert({ studio_id: inv.studio_id, user_id: userId, role: inv.role });
    await trx("invitations").where({ id: inv.id }).update({ accepted_at: new Date(), accepted_by: userId });
    // The invitation link reached this address, which confirms it.
    await trx("users").where({ id: userId }).whereNull("email_verified_at").update({ email_verified_at: new Date() });
    await logActivity(trx, { studioId: inv.studio_id, actorId: userId, action: "invitation.accepted", subjectType: "invitation", subjectId: inv.id, details: { email: inv.email, role: inv.role } });
    return { studioId: inv.studio_id as string };
  });
}

/**
 * Right after sign-up with an invitation link: when the new account's address is the invited one, the
 * invitation is accepted (which also confirms the address). Otherwise nothing happens and the account
 * gets the usual verification mail.
 */
export async function acceptInvitationForNewAccount({ token, userId, email, mailHeaders }: { token: string; userId: string; email: string; mailHeaders?: Record<string, string> }): Promise<{ studioId: string } | null> {
  const view = await viewInvitation(token);
  if (view.state === "pending" && view.email === email) return acceptInvitation({ token, userId });
  const u = await db()("users").where({ id: userId }).first("id", "email", "name");
  later("verification mail", () => sendVerificationMail(u, mailHeaders));
  return null;
}
