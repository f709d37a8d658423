import "server-only";
// The kit matrix: one layout audited against every kit of the studio at once ("which of my kits does this setup
// suit?"), with the studio's current catalogue. Nothing is saved; each row links to a full audit.
import { runAudit } from "@/lib/audit/audit";
import type { KitMatrix } from "@/lib/api-types/layouts";
import { loadStudioCatalogue } from "./catalogue-for-audit";
import { getKit, listKits } from "./kits";
import { getLayout } from "./layouts";
import { loadStudioStrokes } from "../strokes";

export async function kitMatrix({ studioId, layoutId }: { studioId: string; layoutId: string }): Promise<KitMatrix> {
  const layout = await getLayout({ studioId, layoutId });
  const kits = await Promise.all((await listKits({ studioId })).map((k) => getKit({ studioId, kitId: k.id })));
  const ids = [...new Set(kits.flatMap((k) => k.kit.slots.map((s) => s.instrumentId).filter((x): x is string => !!x)))];
  // one read of the studio's strokes: the catalogue reader and the audit both take them
  const strokes = await loadStudioStrokes(studioId);
  const catalogue = await loadStudioCatalogue({ studioId, instrumentIds: ids, strokes });
  const rows = kits.map((k) => {
    const a = runAudit(layout.layout, k.kit, catalogue, { strokes });
    return {
      kitId: k.id, kitName: k.name, score: a.score.value, pads: a.summary.pads, direct: a.summary.direct, standIn: a.summary.standIn, silent: a.summary.silent,
      pedalZonesSilent: a.summary.pedalZones - a.summary.pedalZonesRecorded,
    };
  });
  rows.sort((a, b) => b.score - a.score || a.silent - b.silent || a.kitName.localeCompare(b.kitName));
  return { layoutName: layout.name, kits: rows };
}
