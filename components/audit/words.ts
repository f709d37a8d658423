// The audit's findings in a drummer's words: what a pad plays ("plays the closed hat instead — the nearest
// recorded stroke"), why a pad is silent, conflicts by name, and the short detail for a tooltip (where the
// closeness steps and the score's weights are named). Pure: findings in, strings out.
import type { Stroke, Family } from "@/lib/catalogue/taxonomy";
import type { Conflict, ConflictKind, PlayFinding } from "@/lib/audit/types";
import { playWeight, velocityCoverage } from "@/lib/audit/audit-score";

const STROKE: Partial<Record<Stroke, string>> = {
  centre: "centre hit", "half-edge": "half-edge hit", edge: "edge hit", "rim-shot": "rim shot", "rim-click": "rim click",
  buzz: "buzz roll", mute: "muted hit", "open-tone": "open tone", "crash-hit": "crash hit", pedal: "foot chick",
  "foot-splash": "foot splash",
};
const CYMBALS: ReadonlySet<Family> = new Set(["crash", "ride", "china", "splash", "stack"]);
const HAT_OPENNESS: ReadonlySet<Stroke> = new Set(["closed", "quarter-open", "half-open", "open"]);

/** A stroke in words: "closed hat", "rim shot", "ride bell", "centre hit". */
export function strokeName(family: Family | null, a: Stroke | null): string {
  if (!a) return "nothing";
  if (family === "hi-hat") {
    if (HAT_OPENNESS.has(a)) return `${a} hat`;
    if (a === "pedal" || a === "foot-splash") return STROKE[a]!;
    if (a === "choke") return "choked hat";
    return `hat ${STROKE[a] ?? a.replace(/-/g, " ")}`;
  }
  if (family && CYMBALS.has(family)) {
    if (a === "crash-hit") return family === "crash" ? "crash hit" : `${family} crash hit`;
    return `${family} ${STROKE[a] ?? a.replace(/-/g, " ")}`;
  }
  return STROKE[a] ?? a.replace(/-/g, " ");
}

const pct = (x: number) => `${Math.round(x * 100)} %`;

/** What a finding plays, in one short phrase. */
export function playsInWords(f: PlayFinding): string {
  if (f.outcome === "direct") return `Plays the ${strokeName(f.family, f.plays)} as recorded`;
  if (f.outcome === "stand-in") {
    const s = strokeName(f.family, f.plays);
    return f.standIn?.source === "override" ? `Plays the ${s} instead, by the kit’s stroke map` : `Plays the ${s} instead — the nearest recorded stroke${f.standIn?.edges?.some((e) => e.owner === "studio") ? " (by the studio’s own closeness)" : ""}`;
  }
  return `Silent — ${silentReason(f)}`;
}

/** Why nothing plays, in words. */
export function silentReason(f: PlayFinding): string {
  if (f.slotId === null) return "the pad is not aimed at any sound";
  if (f.slotName === null) return `the kit has no slot “${f.slotId}”`;
  if (f.instrumentId === null) return `the kit leaves “${f.slotName}” empty`;
  if (f.instrumentName === null) return `the instrument in “${f.slotName}” is no longer in the catalogue`;
  if (f.reason && /has no recorded samples/.test(f.reason)) return `nothing recorded on “${f.instrumentName}” yet`;
  return `nothing recorded on “${f.instrumentName}” comes close to the ${strokeName(f.family, f.requested)}`;
}

/** True when a silent finding is silent because its slot is empty. */
export const onEmptySlot = (f: PlayFinding) => f.outcome === "silent" && f.slotName !== null && f.instrumentId === null;

/** The detail for a tooltip: what was asked, how far the stand-in is, what the item counts in the score. */
export function playDetail(f: PlayFinding): string {
  const asked = `Asked for the ${strokeName(f.family, f.requested)}${f.slotName ? ` of “${f.slotName}”` : ""}`;
  if (f.outcome === "silent") return `${asked}. Nothing plays, so it counts 0 in the score.`;
  const cov = velocityCoverage(f);
  const counts = `counts ${pct(playWeight(f) * cov)} in the score`;
  const layers = `${f.layers.length} velocity layer${f.layers.length === 1 ? "" : "s"}, at least ${f.minRoundRobins} round robin${f.minRoundRobins === 1 ? "" : "s"} each`;
  const inst = f.instrumentName ? ` on “${f.instrumentName}”` : "";
  if (f.outcome === "direct") return `${asked}: recorded${inst}, ${layers}; ${counts}${cov < 1 ? " (some velocities find no layer)" : ""}.`;
  const steps = f.standIn?.cost ?? 0;
  const how = f.standIn?.source === "override"
    ? "the kit’s stroke map for this slot names this stroke for it"
    : `it is not recorded; the ${strokeName(f.family, f.plays)} is ${steps} step${steps === 1 ? "" : "s"} away in the ${f.family ?? "instrument"}'s closeness weights${edgesInWords(f)}`;
  return `${asked}: ${how}. Played${inst}, ${layers}; ${counts}.`;
}

/** The edges a stand-in's path used, and whose they are: " (via the studio's edge tight–closed)". */
export function edgesInWords(f: Pick<PlayFinding, "standIn">): string {
  const edges = f.standIn?.edges ?? [];
  if (!edges.length) return "";
  const mine = edges.filter((e) => e.owner === "studio");
  const word = (e: { from: string; to: string }) => `${e.from.replace(/-/g, " ")}–${e.to.replace(/-/g, " ")}`;
  if (!mine.length) return ` (via the built-in edge${edges.length === 1 ? "" : "s"} ${edges.map(word).join(", ")})`;
  const theirs = edges.filter((e) => e.owner !== "studio");
  return ` (via the studio’s edge${mine.length === 1 ? "" : "s"} ${mine.map(word).join(", ")}${theirs.length ? ` and the built-in ${theirs.map(word).join(", ")}` : ""})`;
}

/** Velocities no layer covers, in words ("61–79 and 127"); empty when none. */
export function gapsInWords(f: Pick<PlayFinding, "velocityGaps">): string {
  const parts = f.velocityGaps.map((g) => (g.low === g.high ? `${g.low}` : `${g.low}–${g.high}`));
  return parts.length <= 1 ? (parts[0] ?? "") : `${parts.slice(0, -1).join(", ")} and ${parts.at(-1)}`;
}

const CONFLICT_WORDS: Record<ConflictKind, string> = {
  "note-shared": "Two sounds on one note",
  "note-out-of-range": "Note outside MIDI's range",
  "channel-out-of-range": "Channel outside 1–16",
  "controller-out-of-range": "Pedal controller cannot be sent",
  "duplicate-pad-id": "Two pads with one id",
  "unknown-slot": "Slot missing from the kit",
  "unknown-instrument": "Instrument missing from the catalogue",
  "no-target": "Pad aimed at nothing",
  "outside-grid": "Pad outside the grid",
  "pedal-zone-out-of-range": "Pedal zone outside 0–127",
  "pedal-zone-overlap": "Pedal zones overlap",
};

/** A conflict's kind as a short title. */
export function conflictTitle(c: Pick<Conflict, "kind">): string {
  return CONFLICT_WORDS[c.kind] ?? "Problem";
}

/** A list of names in running text: "a, b and c"; past `max` names, "a, b, c and 4 more". */
export function listInWords(names: readonly string[], max = 8): string {
  if (names.length <= 1) return names[0] ?? "";
  if (names.length > max) return `${names.slice(0, max).join(", ")} and ${names.length - max} more`;
  return `${names.slice(0, -1).join(", ")} and ${names.at(-1)}`;
}
