// Demo kits and layouts for Harbour Lane Studio (the invented demo scenario): the layouts "General MIDI
// percussion map" and "Five-piece trigger kit" from lib/audit's templates, and the kit "Harbour Lane Session"
// built with buildDefaultKit from the studio's catalogued instruments, plus one audit of each layout.
//
// Run after db/seed-demo.ts (and ideally after the demo library has been catalogued):
//   node --conditions=react-server --import tsx db/seed-demo-kits.ts
//
// Idempotent: layouts and the kit are found by name and never duplicated; audits are only added for a layout
// that has none. When the catalogue is not ready yet (no instruments), the layouts are still created and the
// kit is created with the slots the templates expect but every slot empty; running the script again once the
// catalogue is there fills the still-empty kit and adds the audits. A kit with any filled slot is left alone.
import crypto from "node:crypto";
import knexFactory, { type Knex } from "knex";
import config from "../knexfile";
import { DEMO_STUDIO } from "./demo-accounts";
import { getTemplate } from "../lib/audit/templates";
import { buildDefaultKit } from "../lib/audit/kits";
import { runAudit } from "../lib/audit/audit";
import type { Kit, Layout } from "../lib/audit/types";
import { loadStudioCatalogue } from "../lib/server/kits/catalogue-for-audit";
import { jsonColumn } from "../lib/server/json-column";
import { CREATOR_ROLE } from "../lib/permissions";

export const DEMO_KIT_NAME = "Harbour Lane Session";
const LAYOUT_TEMPLATES = ["gm-percussion", "trigger-five"] as const;

const say = (s: string) => process.stdout.write(`demo kits: ${s}\n`);

async function activity(k: Knex, studioId: string, actorId: string, action: string, subjectType: string, subjectId: string, details: Record<string, unknown>) {
  await k("activity").insert({ studio_id: studioId, actor_id: actorId, action, subject_type: subjectType, subject_id: subjectId, details: JSON.stringify(details) });
}

export async function seedDemoKits(k: Knex): Promise<void> {
  const studio = await k("studios").where({ name: DEMO_STUDIO }).first("id");
  if (!studio) {
    say(`no studio "${DEMO_STUDIO}" yet; run db/seed-demo.ts first. Nothing done.`);
    return;
  }
  const studioId = studio.id as string;
  const owner = await k("memberships").where({ studio_id: studioId, role: CREATOR_ROLE }).first("user_id");
  const actorId = (owner?.user_id as string) ?? null;
  const catalogue = await loadStudioCatalogue({ studioId }, k);
  say(`${catalogue.length} catalogued instruments in "${DEMO_STUDIO}"`);

  // layouts from the templates
  const layouts: Layout[] = [];
  for (const name of LAYOUT_TEMPLATES) {
    const t = getTemplate(name)!;
    const row = await k("layouts").where({ studio_id: studioId, name: t.name }).first("id", "body");
    if (row) {
      layouts.push({ ...(jsonColumn(row.body) as Layout), id: row.id });
      say(`layout "${t.name}" already there`);
      continue;
    }
    const id = crypto.randomUUID();
    const body: Layout = { ...t, id };
    await k.transaction(async (trx) => {
      await trx("layouts").insert({ id, studio_id: studioId, name: t.name, body: JSON.stringify(body), created_by: actorId });
      await activity(trx, studioId, actorId, "layout.created", "layout", id, { name: t.name, template: name });
    });
    layouts.push(body);
    say(`layout "${t.name}" created`);
  }

  // the kit: slots the GM map expects (a superset of the trigger kit's), filled from the catalogue
  const gm = getTemplate("gm-percussion")!;
  const built = buildDefaultKit(gm, catalogue, DEMO_KIT_NAME);
  const kitRow = await k("kits").where({ studio_id: studioId, name: DEMO_KIT_NAME }).first("id", "body");
  let kit: Kit;
  if (!kitRow) {
    const id = crypto.randomUUID();
    kit = { ...built, id, name: DEMO_KIT_NAME };
    await k.transaction(async (trx) => {
      await trx("kits").insert({ id, studio_id: studioId, name: DEMO_KIT_NAME, body: JSON.stringify(kit), created_by: actorId });
      await activity(trx, studioId, actorId, "kit.created", "kit", id, { name: DEMO_KIT_NAME, slots: kit.slots.length });
    });
    say(`kit "${DEMO_KIT_NAME}" created with ${kit.slots.filter((s) => s.instrumentId).length} of ${kit.slots.length} slots filled`);
  } else {
    kit = { ...(jsonColumn(kitRow.body) as Kit), id: kitRow.id };
    const empty = kit.slots.every((s) => !s.instrumentId);
    if (empty && catalogue.length) {
      kit = { ...built, id: kitRow.id, name: DEMO_KIT_NAME };
      await k.transaction(async (trx) => {
        await trx("kits").where({ id: kitRow.id }).update({ body: JSON.stringify(kit), updated_at: trx.fn.now(3) });
        await activity(trx, studioId, actorId, "kit.updated", "kit", kitRow.id, { name: DEMO_KIT_NAME, slots: kit.slots.length });
      });
      say(`kit "${DEMO_KIT_NAME}" was empty; filled ${kit.slots.filter((s) => s.instrumentId).length} of ${kit.slots.length} slots`);
    } else {
      say(`kit "${DEMO_KIT_NAME}" already there, left as it is`);
    }
  }

  if (!catalogue.length) {
    say("the catalogue is not ready yet (no instruments): kit slots stay empty and no audit is run. Run this again after the demo library is catalogued.");
    return;
  }
  for (const layout of layouts) {
    const has = await k("audits").where({ studio_id: studioId, layout_id: layout.id }).first("id");
    if (has) { say(`"${layout.name}" already has an audit`); continue; }
    const result = runAudit(layout, kit, catalogue);
    const id = crypto.randomUUID();
    await k.transaction(async (trx) => {
      await trx("audits").insert({
        id, studio_id: studioId, layout_id: layout.id, kit_id: kit.id, layout_name: layout.name, kit_name: kit.name,
        score: result.score.value, silent_pads: result.summary.silent, stand_in_pads: result.summary.standIn, conflicts: result.summary.conflicts,
        result: JSON.stringify(result), created_by: actorId,
      });
      await activity(trx, studioId, actorId, "audit.run", "audit", id, { layout: layout.name, kit: kit.name, score: result.score.value, silent: result.summary.silent });
    });
    say(`audited "${layout.name}": score ${result.score.value}, ${result.summary.silent} silent pads`);
  }
}

if (process.argv[1] && /seed-demo-kits\.ts$/.test(process.argv[1])) {
  const k = knexFactory(config);
  seedDemoKits(k)
    .then(() => k.destroy())
    .catch(async (e) => {
      process.stderr.write(`demo kits seed failed: ${e instanceof Error ? e.message : String(e)}\n`);
      await k.destroy();
      process.exit(1);
    });
}
