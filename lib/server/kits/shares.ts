import "server-only";
// Shared layouts: publish a layout at an unguessable link (read-only, no account needed), count its views, revoke
// it (the link answers 404 at once), and import a shared layout into a studio. What a shared page shows is the
// layout alone (pads, notes, channels, targets by slot family and stroke, pedal, description): never the
// publisher's kits, samples, studio or people.
import { db } from "../db";
import { newToken } from "../ids";
import { logActivity } from "../activity";
import { notFound } from "../errors";
import { jsonColumn } from "../json-column";
import { getLayout, importLayout } from "./layouts";
import { loadStudioStrokes } from "../strokes";
import { layoutStrokeUses, strokesToCarry } from "@/lib/audit/schema";
import type { Layout } from "@/lib/audit/types";
import type { LayoutRecord, LayoutShare, SharedLayoutView } from "@/lib/api-types/layouts";

const sharePath = (token: string) => `/shared/${token}`;

function toShare(r: Record<string, unknown>): LayoutShare {
  return { token: r.token as string, path: sharePath(r.token as string), description: r.description as string, views: Number(r.views), publishedAt: new Date(r.created_at as string).toISOString() };
}

/** The layout's share link, or null when it is not published. */
export async function getShare({ studioId, layoutId }: { studioId: string; layoutId: string }): Promise<LayoutShare | null> {
  await getLayout({ studioId, layoutId });
  const r = await db()("layout_shares").where({ studio_id: studioId, layout_id: layoutId }).first();
  return r ? toShare(r) : null;
}

/** Publish (or update the description of) a layout; `newLink` replaces the token, so the old link stops working. */
export async function publishLayout({ studioId, actorId, layoutId, description, newLink }: { studioId: string; actorId: string; layoutId: string; description: string; newLink?: boolean }): Promise<LayoutShare> {
  const layout = await getLayout({ studioId, layoutId });
  await db().transaction(async (trx) => {
    const old = await trx("layout_shares").where({ layout_id: layoutId }).forUpdate().first();
    if (old) {
      await trx("layout_shares").where({ layout_id: layoutId }).update({ description, ...(newLink ? { token: newToken(), views: 0 } : {}), updated_at: trx.fn.now(3) });
    } else {
      await trx("layout_shares").insert({ layout_id: layoutId, studio_id: studioId, token: newToken(), description, created_by: actorId });
      await logActivity(trx, { studioId, actorId, action: "layout.published", subjectType: "layout", subjectId: layoutId, details: { name: layout.name } });
    }
  });
  return (await getShare({ studioId, layoutId }))!;
}

export async function unpublishLayout({ studioId, actorId, layoutId }: { studioId: string; actorId: string; layoutId: string }): Promise<void> {
  const layout = await getLayout({ studioId, layoutId });
  await db().transaction(async (trx) => {
    const n = await trx("layout_shares").where({ studio_id: studioId, layout_id: layoutId }).delete();
    if (n) await logActivity(trx, { studioId, actorId, action: "layout.unpublished", subjectType: "layout", subjectId: layoutId, details: { name: layout.name } });
  });
}

const TOKEN_SHAPE = /^[A-Za-z0-9_-]{43}$/;

async function shareRow(token: string) {
  if (!TOKEN_SHAPE.test(token)) throw notFound("That shared layout");
  const r = await db()("layout_shares as s").join("layouts as l", "l.id", "s.layout_id").where("s.token", token).first("s.layout_id", "s.studio_id", "s.description", "s.views", "s.created_at", "l.name", "l.body");
  if (!r) throw notFound("That shared layout");
  return r;
}

/** What anyone with the link sees: the layout (its id replaced), its description and views. `count` adds a view. */
export async function viewSharedLayout(token: string, { count }: { count: boolean }): Promise<SharedLayoutView> {
  const r = await shareRow(token);
  if (count) await db()("layout_shares").where({ token }).increment("views", 1);
  const body = jsonColumn<Layout>(r.body);
  // the layout alone: the shared copy gets a neutral id; slot ids and names are the layout's own words
  // the studio's own strokes it aims at travel with it (an importing studio adopts them)
  const carried = strokesToCarry(layoutStrokeUses(body).map((u) => u.stroke), await loadStudioStrokes(r.studio_id as string));
  const layout: Layout = { ...body, id: "shared", name: r.name as string, ...(carried.length ? { strokes: carried } : {}) };
  return { name: r.name as string, description: r.description as string, views: Number(r.views) + (count ? 1 : 0), publishedAt: new Date(r.created_at as string).toISOString(), layout };
}

/** Copy a shared layout into a studio (the caller's write permission there is checked by the route). */
export async function importSharedLayout({ studioId, actorId, token }: { studioId: string; actorId: string; token: string }): Promise<LayoutRecord> {
  const shared = await viewSharedLayout(token, { count: false });
  const rec = await importLayout({ studioId, actorId, layout: shared.layout, name: shared.name });
  await logActivity(db(), { studioId, actorId, action: "layout.imported-shared", subjectType: "layout", subjectId: rec.id, details: { name: rec.name } });
  return rec;
}
