// Demo kits and layouts for Harbour Lane Studio (the invented demo scenario): the layouts "General MIDI
// percussion map" and "Five-piece trigger kit" from lib/audit's templates, and the kit "Harbour Lane Session"
// built with buildDefaultKit from the studio's catalogued instruments, plus one audit of each layout. Every
// row (and its activity entry) is written by the app's own services in lib/server/kits (createLayout,
// createKit, updateKit, runAndSaveAudit), as the owner.
//
// Run after db/seed-demo.ts (and ideally after the demo library has been catalogued):
//   node --conditions=react-server --import tsx db/seed-demo-kits.ts
//
// Idempotent: layouts and the kit are found by name and never duplicated; audits are only added for a layout
// that has none. When the catalogue is not ready yet (no instruments), the layouts are still created and the
// kit is created with the slots the templates expect but every slot empty; running the script again once the
// catalogue is there fills the still-empty kit and adds the audits. A kit with any filled slot is left alone.
import { closeDb } from "../lib/server/db";
import { getTemplate } from "../lib/audit/templates";
import { buildDefaultKit } from "../lib/audit/kits";
import { loadStudioCatalogue } from "../lib/server/kits/catalogue-for-audit";
import { createKit, getKit, listKits, updateKit } from "../lib/server/kits/kits";
import type { KitRecord } from "../lib/api-types/kits";
import { createLayout, listLayouts } from "../lib/server/kits/layouts";
import { listAudits, runAndSaveAudit } from "../lib/server/kits/audits";
import { DEMO_STUDIO } from "./demo-accounts";
import { findDemoStudio } from "./demo-studio";

export const DEMO_KIT_NAME = "Harbour Lane Session";
const LAYOUT_TEMPLATES = ["gm-percussion", "trigger-five"] as const;

const say = (s: string) => process.stdout.write(`demo kits: ${s}\n`);
const filled = (k: KitRecord) => k.kit.slots.filter((s) => s.instrumentId).length;

export async function seedDemoKits(): Promise<void> {
  const demo = await findDemoStudio();
  if (!demo) {
    say(`no studio "${DEMO_STUDIO}" yet; run db/seed-demo.ts first. Nothing done.`);
    return;
  }
  const { studioId, ownerId: actorId } = demo;
  const catalogue = await loadStudioCatalogue({ studioId });
  say(`${catalogue.length} catalogued instruments in "${DEMO_STUDIO}"`);

  // layouts from the templates
  const layouts: { id: string; name: string }[] = [];
  const existingLayouts = await listLayouts({ studioId });
  for (const name of LAYOUT_TEMPLATES) {
    const t = getTemplate(name)!;
    const row = existingLayouts.find((l) => l.name === t.name);
    if (row) {
      layouts.push(row);
      say(`layout "${t.name}" already there`);
      continue;
    }
    const created = await createLayout({ studioId, actorId, name: t.name, template: name });
    layouts.push(created);
    say(`layout "${t.name}" created`);
  }

  // the kit: slots the GM map expects (a superset of the trigger kit's), filled from the catalogue
  const existingKit = (await listKits({ studioId })).find((k) => k.name === DEMO_KIT_NAME);
  let kit: KitRecord;
  if (!existingKit) {
    kit = await createKit({ studioId, actorId, name: DEMO_KIT_NAME, template: "gm-percussion" });
    say(`kit "${DEMO_KIT_NAME}" created with ${filled(kit)} of ${kit.kit.slots.length} slots filled`);
  } else {
    kit = await getKit({ studioId, kitId: existingKit.id });
    if (filled(kit) === 0 && catalogue.length) {
      const built = buildDefaultKit(getTemplate("gm-percussion")!, catalogue, DEMO_KIT_NAME);
      kit = await updateKit({ studioId, actorId, kitId: kit.id, slots: built.slots });
      say(`kit "${DEMO_KIT_NAME}" was empty; filled ${filled(kit)} of ${kit.kit.slots.length} slots`);
    } else {
      say(`kit "${DEMO_KIT_NAME}" already there, left as it is`);
    }
  }

  if (!catalogue.length) {
    say("the catalogue is not ready yet (no instruments): kit slots stay empty and no audit is run. Run this again after the demo library is catalogued.");
    return;
  }
  for (const layout of layouts) {
    if ((await listAudits({ studioId, layoutId: layout.id, limit: 1 })).length) { say(`"${layout.name}" already has an audit`); continue; }
    const audit = await runAndSaveAudit({ studioId, actorId, layoutId: layout.id, kitId: kit.id });
    say(`audited "${layout.name}": score ${audit.score}, ${audit.silentPads} silent pads`);
  }
}

if (process.argv[1] && /seed-demo-kits\.ts$/.test(process.argv[1])) {
  seedDemoKits()
    .catch((e) => {
      process.stderr.write(`demo kits seed failed: ${e instanceof Error ? e.message : String(e)}\n`);
      process.exitCode = 1;
    })
    .finally(() => closeDb());
}
