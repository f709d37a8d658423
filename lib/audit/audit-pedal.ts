// Pedal zones: what the hi-hat pedal plays across its controller range (each zone's articulation resolved
// like a pad's), the controller values no zone covers, zones that overlap or leave 0-127, and the pedal's
// chick note (the slot's 'pedal' articulation). Pure.

import { isInt, type ConflictLog } from "./audit-conflicts";
import { auditPad, clonePlay, uncoveredRanges, type Play } from "./audit-pads";
import type { HiHatPedal, PadFinding, PedalFinding, PedalZoneFinding } from "./types";

export function auditPedal(hh: HiHatPedal, play: Play, log: ConflictLog): PedalFinding {
  // MIDI 1.0: control change numbers 0-119 (120-127 are channel mode messages)
  if (!isInt(hh.controller, 0, 119)) {
    log.add("controller-out-of-range", `pedal controller ${hh.controller} is not a control change number 0-119`, [], null, hh.channel);
  }
  const zones: PedalZoneFinding[] = hh.zones.map((z, i) => {
    if (!isInt(z.low, 0, 127) || !isInt(z.high, 0, 127) || z.low > z.high) {
      log.add("pedal-zone-out-of-range", `pedal zone ${i + 1} (${z.low}-${z.high}) is not a range inside 0-127`, [`pedal-zone-${i + 1}`]);
    }
    const p = clonePlay(play(hh.slotId, z.articulation, `pedal-zone-${i + 1}`, `pedal ${z.low}-${z.high} (${z.articulation})`));
    return Object.assign({ zoneIndex: i, low: z.low, high: z.high, recorded: p.outcome === "direct" }, p);
  });
  for (let i = 0; i < hh.zones.length; i++) {
    for (let j = i + 1; j < hh.zones.length; j++) {
      const a = hh.zones[i]!;
      const b = hh.zones[j]!;
      if (a.low <= b.high && b.low <= a.high) {
        log.add("pedal-zone-overlap", `pedal zones ${i + 1} and ${j + 1} overlap`, [`pedal-zone-${i + 1}`, `pedal-zone-${j + 1}`]);
      }
    }
  }
  let chick: PadFinding | null = null;
  if (hh.chickNote !== null) {
    chick = auditPad(
      {
        id: "pedal-chick",
        label: "Hi-hat pedal chick",
        note: hh.chickNote,
        channel: hh.channel,
        target: { slotId: hh.slotId, articulation: "pedal" },
      },
      play,
      log,
    );
  }
  return {
    controller: hh.controller,
    channel: hh.channel,
    closedAt: hh.closedAt,
    zones,
    uncovered: uncoveredRanges(hh.zones, 0, 127),
    chick,
  };
}
