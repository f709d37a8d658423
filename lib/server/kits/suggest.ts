import "server-only";
// A suggested layout for one of the studio's kits and a pad surface (lib/audit/suggest.ts does the work): the
// kit and the catalogue of its instruments are read here; nothing is written (the page saves the layout the
// user accepts through the layout import).
import { suggestLayout, type SuggestSurface } from "@/lib/audit/suggest";
import type { SuggestLayoutAnswer } from "@/lib/api-types/layouts";
import { AppError } from "../errors";
import { loadStudioCatalogue } from "./catalogue-for-audit";
import { loadStudioStrokes } from "../strokes";
import { getKit } from "./kits";

export async function suggestForKit({ studioId, kitId, surface, standIns, name }: { studioId: string; kitId: string; surface: SuggestSurface; standIns?: boolean; name?: string }): Promise<SuggestLayoutAnswer> {
  const kit = await getKit({ studioId, kitId });
  const ids = kit.kit.slots.map((s) => s.instrumentId).filter((x): x is string => !!x);
  // one read of the studio's strokes: the catalogue reader and the audit both take them
  const strokes = await loadStudioStrokes(studioId);
  const catalogue = await loadStudioCatalogue({ studioId, instrumentIds: ids, strokes });
  const s = suggestLayout(surface, kit.kit, catalogue, { standIns, strokes, name: name ?? `${kit.name} — suggested` });
  if (s.layout.pads.length === 0) {
    throw new AppError("invalid-input", `The kit "${kit.name}" has no recorded instrument in its slots yet: fill a slot first, then ask again.`);
  }
  return { kitName: kit.name, layout: s.layout, placements: s.placements, leftOut: s.leftOut };
}
