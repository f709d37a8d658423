import { describe, expect, it } from "vitest";
import { FAMILY_GRAPHS, FOREIGN_ENTRY_COST, graphNodes, resolveArticulation } from "./fallback";
import { ARTICULATIONS, FAMILIES, FAMILY_ARTICULATIONS, type Articulation } from "../catalogue/taxonomy";

// All rules below are common practice of drum sample libraries, no published source.

describe("fallback rules (common practice, no published source)", () => {
  it("a missing half-edge plays the centre hit", () => {
    const r = resolveArticulation("snare", "half-edge", ["centre", "edge", "rim-shot"]);
    // half-edge is one step from centre and one from edge: the tie goes to centre (family order)
    expect(r).toMatchObject({ outcome: "stand-in", plays: "centre", path: ["half-edge", "centre"], cost: 1 });
    const t = resolveArticulation("tom", "half-edge", ["centre"]);
    expect(t).toMatchObject({ outcome: "stand-in", plays: "centre", path: ["half-edge", "centre"], cost: 1 });
  });

  it("a recorded articulation plays directly", () => {
    expect(resolveArticulation("snare", "centre", ["centre"])).toMatchObject({ outcome: "direct", plays: "centre", path: ["centre"], cost: 0 });
  });

  it("a missing rim click plays the cross-stick, and the reverse", () => {
    expect(resolveArticulation("snare", "rim-click", ["centre", "cross-stick"])).toMatchObject({ plays: "cross-stick", cost: 1 });
    expect(resolveArticulation("snare", "cross-stick", ["centre", "rim-click"])).toMatchObject({ plays: "rim-click", cost: 1 });
  });

  it("a cymbal with no bell plays its normal hit for a bell pad (bell two steps from bow)", () => {
    expect(resolveArticulation("ride", "bell", ["bow", "crash-hit"])).toMatchObject({ plays: "bow", path: ["bell", "bow"], cost: 2 });
    expect(resolveArticulation("crash", "bell", ["crash-hit"])).toMatchObject({
      outcome: "stand-in",
      plays: "crash-hit",
      path: ["bell", "bow", "crash-hit"],
      cost: 3,
    });
  });

  it("a crash placed in a slot meant for a ride answers both its bell and bow pads with what it has", () => {
    const bow = resolveArticulation("crash", "bow", ["crash-hit", "choke"]);
    const bell = resolveArticulation("crash", "bell", ["crash-hit", "choke"]);
    expect(bow).toMatchObject({ outcome: "stand-in", plays: "crash-hit", path: ["bow", "crash-hit"], cost: 1 });
    expect(bell).toMatchObject({ outcome: "stand-in", plays: "crash-hit" });
    // a crash recorded on its bow too answers the bow pad directly and the bell pad with the bow
    expect(resolveArticulation("crash", "bow", ["crash-hit", "bow"]).outcome).toBe("direct");
    expect(resolveArticulation("crash", "bell", ["crash-hit", "bow"])).toMatchObject({ plays: "bow", cost: 2 });
  });

  it("a china with no bell answers both bell and bow pads with its hit", () => {
    for (const req of ["bell", "bow"] as const) {
      expect(resolveArticulation("china", req, ["crash-hit"])).toMatchObject({ outcome: "stand-in", plays: "crash-hit" });
    }
  });

  it("half-open sits between closed and open", () => {
    expect(resolveArticulation("hi-hat", "half-open", ["closed", "quarter-open", "open"])).toMatchObject({ plays: "quarter-open", cost: 1 });
    // with only the two ends recorded the open end is nearer (1.5 against 2.5)
    expect(resolveArticulation("hi-hat", "half-open", ["closed", "open"])).toMatchObject({ plays: "open", cost: 1.5 });
    expect(resolveArticulation("hi-hat", "quarter-open", ["closed", "open"])).toMatchObject({ plays: "closed", cost: 1 });
  });

  it("never crosses families: the search stays inside the instrument", () => {
    // a snare with nothing recorded has nothing to play, whatever other families have
    expect(resolveArticulation("snare", "centre", [])).toMatchObject({ outcome: "silent", plays: null, path: [] });
    // a ride pad word aimed at a snare enters the snare graph at its main strike, never a cymbal
    const r = resolveArticulation("snare", "bell", ["centre", "rim-shot"]);
    expect(r).toMatchObject({ plays: "centre", path: ["bell", "centre"], cost: FOREIGN_ENTRY_COST });
    // every articulation played is one the instrument recorded
    for (const f of FAMILIES) {
      const rec = FAMILY_ARTICULATIONS[f].slice(-1);
      for (const a of ARTICULATIONS) {
        const res = resolveArticulation(f, a, rec);
        expect(rec).toContain(res.plays);
      }
    }
  });

  it("every family graph connects all its articulations (nothing recorded stays unreachable)", () => {
    for (const f of FAMILIES) {
      const nodes = graphNodes(f);
      for (const a of FAMILY_ARTICULATIONS[f]) expect(nodes).toContain(a);
      for (const from of nodes) {
        for (const to of nodes) {
          const r = resolveArticulation(f, from, [to]);
          expect(r.plays, `${f}: ${from} -> ${to}`).toBe(to);
        }
      }
    }
  });

  it("every cymbal articulation is a node of every cymbal graph", () => {
    const cymbal: Articulation[] = ["bell", "bow", "edge", "crash-hit", "tip", "shank", "choke", "roll"];
    for (const f of ["crash", "ride", "china", "splash", "stack"] as const) {
      for (const a of cymbal) expect(graphNodes(f)).toContain(a);
    }
  });

  it("ties are broken by the documented order (the family's articulation list)", () => {
    // from half-edge, centre and edge are both 1 away: centre comes first in FAMILY_ARTICULATIONS.snare
    expect(resolveArticulation("snare", "half-edge", ["edge", "centre"]).plays).toBe("centre");
    expect(resolveArticulation("snare", "half-edge", ["centre", "edge"]).plays).toBe("centre");
  });

  it("kit overrides win when they name a recorded articulation, and say so when they cannot", () => {
    const o = resolveArticulation("snare", "half-edge", ["centre", "edge"], { "half-edge": "edge" });
    expect(o).toMatchObject({ outcome: "stand-in", plays: "edge", path: ["half-edge", "edge"], source: "override" });
    const bad = resolveArticulation("snare", "half-edge", ["centre"], { "half-edge": "edge" });
    expect(bad).toMatchObject({ plays: "centre", source: "graph", overrideIgnored: "edge" });
  });

  it("edge weights are positive and finite", () => {
    for (const f of FAMILIES) for (const [, , w] of FAMILY_GRAPHS[f]) expect(w).toBeGreaterThan(0);
  });
});
