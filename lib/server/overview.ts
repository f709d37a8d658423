import "server-only";
// The studio's home page in numbers: libraries with their sample states, kits, layouts and the latest audits.
import { db } from "./db";
import { upgradeStoredAudits } from "./kits/audits";
import type { StudioOverview } from "@/lib/api-types/studios";

export async function studioOverview({ studioId }: { studioId: string }): Promise<StudioOverview> {
  await upgradeStoredAudits({ studioId });
  const [libs, counts, kits, layouts, audits] = await Promise.all([
    db()("libraries").where({ studio_id: studioId }).orderBy("name").select("id", "name"),
    db()("samples").where({ studio_id: studioId }).groupBy("library_id", "state").select("library_id", "state").count({ n: "*" }),
    db()("kits").where({ studio_id: studioId }).count({ n: "*" }).first(),
    db()("layouts").where({ studio_id: studioId }).count({ n: "*" }).first(),
    db()("audits").where({ studio_id: studioId }).orderBy("created_at", "desc").limit(5).select("id", "layout_name", "kit_name", "score", "silent_pads", "created_at"),
  ]);
  const by = new Map<string, Record<string, number>>();
  for (const c of counts as { library_id: string; state: string; n: number | string }[]) {
    const m = by.get(c.library_id) ?? {};
    m[c.state] = Number(c.n);
    by.set(c.library_id, m);
  }
  return {
    libraries: libs.map((l) => {
      const m = by.get(l.id) ?? {};
      const catalogued = m.catalogued ?? 0;
      const rejected = m.rejected ?? 0;
      // waiting: to be measured, or measured and waiting for the cataloguing
      const pending = (m.queued ?? 0) + (m.measuring ?? 0) + (m.measured ?? 0);
      return { id: l.id, name: l.name, total: catalogued + rejected + pending, catalogued, pending, rejected };
    }),
    kits: Number(kits?.n ?? 0),
    layouts: Number(layouts?.n ?? 0),
    audits: audits.map((a) => ({ id: a.id, layoutName: a.layout_name, kitName: a.kit_name, score: Number(a.score), silentPads: a.silent_pads, createdAt: new Date(a.created_at).toISOString() })),
  };
}
