// Suggest a layout for a surface of named trigger zones ("kick head", "snare rim", "tom 2 head", "ride bell"):
// each zone name is read with the file-name reader (the same words as sample names), zones are grouped by
// drum ("tom 2 head" and "tom 2 rim" are one drum), and drums are matched to the kit's slots of their family
// as a minimum-cost assignment (Hungarian method, munkres-js): numbered drums in order (tom 1 the highest
// tom, floor toms last), so "crash 2" takes the second crash slot. Each zone then asks its slot for the stroke
// its name says; a stroke the instrument never recorded is marked as a stand-in with the recording that plays.

import munkres from "munkres-js";
import { parseName } from "../catalogue/names";
import type { StrokeList } from "../catalogue/strokes";
import type { Stroke, Family } from "../catalogue/taxonomy";
import { resolveArticulation } from "./fallback";
import { mainStrike, noteFor, strokeWords } from "./suggest-rules";
import type { OfferedStroke, Placement, Suggestion } from "./suggest";
import type { Catalogue, Kit, Pad } from "./types";

interface ZoneReading {
  zone: string;
  family: Family | null;
  articulation: Stroke | null;
  /** The drum's number in its family (1-based), 1000+ for a floor tom, 0 when the name has none. */
  number: number;
}

const CYMBALS_CRASHED: readonly Family[] = ["crash", "china", "splash"];

/**
 * What a zone name asks for (a studio's own stroke too, by its words). The edge zone of a crash, china or splash is
 * where it is crashed.
 */
export function readZone(zone: string, studioStrokes?: StrokeList | null): ZoneReading {
  const info = parseName(`${zone}.wav`, studioStrokes);
  const family = info.family;
  let articulation = info.articulation;
  if (family && CYMBALS_CRASHED.includes(family) && articulation === "edge") articulation = "crash-hit";
  const m = /\b(\d{1,2})\b/.exec(zone);
  const number = m ? Number(m[1]) : /floor/i.test(zone) ? 1000 : 0;
  return { zone, family, articulation: family ? (articulation ?? mainStrike(family)) : null, number };
}

const slug = (s: string) => s.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "") || "zone";

export function suggestForZones(
  zones: readonly string[],
  kit: Kit,
  catalogue: Catalogue,
  strokes: OfferedStroke[],
  channel: number,
  studioStrokes?: StrokeList | null,
): { pads: Pad[]; placements: Placement[]; leftOut: Suggestion["leftOut"] } {
  const readings = zones.map((z) => readZone(z, studioStrokes));
  const leftOut: Suggestion["leftOut"] = [];
  // drums: zones of one family and number
  const drums = new Map<string, ZoneReading[]>();
  for (const r of readings) {
    if (!r.family) continue;
    const key = `${r.family}#${r.number}`;
    drums.set(key, [...(drums.get(key) ?? []), r]);
  }
  const drumList = [...drums.values()];
  // rank of each drum among the drums of its family, by number (unnumbered first, floor toms last)
  const rankOf = new Map<ZoneReading[], number>();
  for (const fam of new Set(drumList.map((d) => d[0]!.family))) {
    drumList.filter((d) => d[0]!.family === fam).sort((a, b) => a[0]!.number - b[0]!.number).forEach((d, i) => rankOf.set(d, i));
  }
  // one main stroke per filled slot carries its family order (toms by pitch, high first)
  const slots = strokes.filter((s) => s.copy === 0 && s.role !== "secondary");
  const BIG = 1e6;
  const costs = drumList.map((d) => slots.map((s) => (s.slot.family === d[0]!.family ? Math.abs(rankOf.get(d)! - s.ordinal) : BIG)));
  const pairs = drumList.length && slots.length ? (munkres(costs) as [number, number][]) : [];
  const slotOf = new Map<ZoneReading[], OfferedStroke>();
  for (const [di, si] of pairs) if (costs[di]![si]! < BIG) slotOf.set(drumList[di]!, slots[si]!);

  const byId = new Map(catalogue.map((i) => [i.id, i] as const));
  const pads: Pad[] = [];
  const placements: Placement[] = [];
  const notes = new Map<string, number>();
  const ids = new Set<string>();
  for (const r of readings) {
    const drum = r.family ? drums.get(`${r.family}#${r.number}`) : undefined;
    const owner = drum ? slotOf.get(drum) : undefined;
    if (!r.family || !r.articulation) {
      leftOut.push({ slotId: "", articulation: "hit", reason: `zone "${r.zone}": its name says no drum or cymbal Kitwright knows` });
      continue;
    }
    if (!owner) {
      leftOut.push({ slotId: "", articulation: r.articulation, reason: `zone "${r.zone}": the kit has no ${r.family} left for it` });
      continue;
    }
    const inst = byId.get(owner.slot.instrumentId!)!;
    const recorded = inst.articulations.map((a) => a.articulation);
    const res = resolveArticulation(inst.family, r.articulation, recorded, owner.slot.standIns, studioStrokes);
    const key = `${owner.slot.id}|${r.articulation}`;
    const stroke: OfferedStroke = { ...owner, articulation: r.articulation, standInFor: res.outcome === "stand-in" ? res.plays : null };
    if (!notes.has(key)) notes.set(key, noteFor(stroke, new Set(notes.values())));
    let id = slug(r.zone);
    for (let n = 2; ids.has(id); n++) id = `${slug(r.zone)}-${n}`;
    ids.add(id);
    pads.push({ id, label: r.zone.charAt(0).toUpperCase() + r.zone.slice(1), zone: r.zone, note: notes.get(key)!, channel, target: { slotId: owner.slot.id, articulation: r.articulation } });
    const said = `Zone "${r.zone}" plays ${owner.slot.name} ${strokeWords(r.articulation)}`;
    const reason =
      res.outcome === "direct"
        ? `${said}: recorded.`
        : res.plays
          ? `${said}: not recorded, the ${strokeWords(res.plays)} plays instead (the nearest recorded stroke).`
          : `${said}: nothing recorded is near it.`;
    placements.push({ padId: id, slotId: owner.slot.id, articulation: r.articulation, standIn: res.outcome !== "direct", reason });
  }
  return { pads, placements, leftOut };
}
