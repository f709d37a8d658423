import "server-only";
// What the studio holds, read for lib/next-step.ts nextStep(): libraries with their sample and instrument counts,
// kits with their filled slots, layouts with their audit counts, the newest audit. Small counting queries only.
import { cache } from "react";
import { db } from "./db";
import { jsonColumn } from "./json-column";
import { nextStep, type NextStep, type StudioProgress } from "@/lib/next-step";
import { can, type Role } from "@/lib/permissions";
import type { Kit } from "@/lib/audit/types";

export async function studioProgress({ studioId }: { studioId: string }): Promise<StudioProgress> {
  const k = db();
  const [libs, samples, instruments, kits, layouts, audits, latest, changed] = await Promise.all([
    k("libraries as l").leftJoin("library_health as h", "h.library_id", "l.id").where("l.studio_id", studioId).orderBy("l.name").select("l.id", "l.name", "h.computed_at"),
    k("samples").where({ studio_id: studioId }).groupBy("library_id", "state").select("library_id", "state").count({ n: "*" }),
    k("instruments").where({ studio_id: studioId }).groupBy("library_id").select("library_id").count({ n: "*" }),
    k("kits").where({ studio_id: studioId }).orderBy([{ column: "updated_at", order: "desc" }, { column: "name" }]).select("id", "name", "body"),
    k("layouts").where({ studio_id: studioId }).orderBy([{ column: "updated_at", order: "desc" }, { column: "name" }]).select("id", "name"),
    k("audits").where({ studio_id: studioId }).groupBy("layout_id").select("layout_id").count({ n: "*" }),
    k("audits").where({ studio_id: studioId }).orderBy("created_at", "desc").first("id", "layout_name", "kit_name"),
    // as libraryProgress tells "sorting": catalogued samples changed after the last regroup read them
    k("samples").where({ studio_id: studioId, state: "catalogued" }).groupBy("library_id").select("library_id").max({ t: "updated_at" }),
  ]);
  const lastChange = new Map((changed as Array<{ library_id: string; t: unknown }>).map((r) => [r.library_id, r.t ? new Date(r.t as string).getTime() : null]));
  const total = new Map<string, number>();
  const pending = new Map<string, number>();
  for (const r of samples as Array<{ library_id: string; state: string; n: number | string }>) {
    total.set(r.library_id, (total.get(r.library_id) ?? 0) + Number(r.n));
    if (r.state === "queued" || r.state === "measuring") pending.set(r.library_id, (pending.get(r.library_id) ?? 0) + Number(r.n));
  }
  const inst = new Map((instruments as Array<{ library_id: string; n: number | string }>).map((r) => [r.library_id, Number(r.n)]));
  const audited = new Map((audits as Array<{ layout_id: string; n: number | string }>).map((r) => [r.layout_id, Number(r.n)]));
  return {
    libraries: libs.map((l) => {
      const t = lastChange.get(l.id) ?? null;
      const sorting = t !== null && (!l.computed_at || t > new Date(l.computed_at).getTime());
      return { id: l.id, name: l.name, samples: total.get(l.id) ?? 0, pending: pending.get(l.id) ?? 0, instruments: inst.get(l.id) ?? 0, sorting };
    }),
    kits: kits.map((r) => {
      const body = jsonColumn(r.body) as Kit;
      return { id: r.id, name: r.name, slots: body.slots.length, filled: body.slots.filter((s) => s.instrumentId).length };
    }),
    layouts: layouts.map((l) => ({ id: l.id, name: l.name, audits: audited.get(l.id) ?? 0 })),
    latestAudit: latest ? { id: latest.id, layoutName: latest.layout_name, kitName: latest.kit_name } : null,
  };
}

/** The next step for this member of the studio (one reading per request). */
export const studioNextStep = cache(async (studioId: string, role: Role): Promise<NextStep> =>
  nextStep(await studioProgress({ studioId }), { base: `/s/${studioId}`, canWrite: can(role, "studio:write") }),
);
