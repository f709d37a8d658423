import { describe, expect, it } from "vitest";
import { isRoundRobinSeries, parseName, parseNames, tokenise } from "./names";

// Names invented in the style of the trade (common practice of drum sample libraries, no published source):
// separators, camelCase, abbreviations, dynamics marks, take numbers, folder structures.
type Row = [
  path: string,
  expected: {
    family?: string | null;
    articulation?: string | null;
    velocity?: [scheme: string, rank: number] | null;
    rr?: number | null;
    mic?: string | null;
    stem?: string[];
  },
];

const TABLE: Row[] = [
  ["Kick_In_v3_rr2.wav", { family: "kick", mic: "inside", velocity: ["v", 3], rr: 2 }],
  ["BD_Out_ff_03.wav", { family: "kick", mic: "outside", velocity: ["dynamic", 7], rr: 3 }],
  ["KD22_Sub_V10_RR1.wav", { family: "kick", mic: "sub", velocity: ["v", 10], rr: 1, stem: ["kick", "22in"] }],
  ["BassDrum-Hard-02.wav", { family: "kick", velocity: ["word", 3], rr: 2 }],
  ["Kick 01.wav", { family: "kick", rr: 1, velocity: null }],
  ["Snare_14x6.5_Brass_Center_v3_rr2.wav", { family: "snare", articulation: "centre", velocity: ["v", 3], rr: 2, stem: ["snare", "14x6.5", "brass"] }],
  ["SnareTop_RimShot_mf_1.wav", { family: "snare", articulation: "rim-shot", mic: "top", velocity: ["dynamic", 5], rr: 1 }],
  ["SN_Bottom_Ctr_pp_4.wav", { family: "snare", articulation: "centre", mic: "bottom", velocity: ["dynamic", 2], rr: 4 }],
  ["sd-xstick-soft-take3.wav", { family: "snare", articulation: "cross-stick", velocity: ["word", 1], rr: 3 }],
  ["Snare Side Stick V2 RR4.wav", { family: "snare", articulation: "cross-stick", velocity: ["v", 2], rr: 4 }],
  ["Snare_Rim_Click_05.wav", { family: "snare", articulation: "rim-click", rr: 5 }],
  ["Snare_HalfEdge_v4_rr1.wav", { family: "snare", articulation: "half-edge", velocity: ["v", 4], rr: 1 }],
  ["Snare_Edge_Hard_Alt.wav", { family: "snare", articulation: "edge", velocity: ["word", 3], rr: 2 }],
  ["Snr_Flam_f_2.wav", { family: "snare", articulation: "flam", velocity: ["dynamic", 6], rr: 2 }],
  ["Snare_Roll_Buzz_01.wav", { family: "snare", articulation: "roll", rr: 1 }],
  ["Snare_Center_3_2.wav", { family: "snare", articulation: "centre", velocity: ["number", 3], rr: 2 }],
  ["Tom1_Center_v2_rr3.wav", { family: "tom", articulation: "centre", velocity: ["v", 2], rr: 3, stem: ["tom", "1"] }],
  ["RackTom2_Rimshot_Vel5_Take1.wav", { family: "tom", articulation: "rim-shot", velocity: ["v", 5], rr: 1, stem: ["rack", "tom", "2"] }],
  ["FT16_Centre_mp_02.wav", { family: "tom", articulation: "centre", velocity: ["dynamic", 4], rr: 2, stem: ["floor", "tom", "16in"] }],
  ["Floor Tom 16 - OH - v1 - rr1.wav", { family: "tom", mic: "overhead", velocity: ["v", 1], rr: 1, stem: ["floor", "tom", "16in"] }],
  ["Hi Tom Edge 03.wav", { family: "tom", articulation: "edge", rr: 3, stem: ["high", "tom"] }],
  ["HH_Closed_Tip_v1_rr1.wav", { family: "hi-hat", articulation: "closed", velocity: ["v", 1], rr: 1 }],
  ["HiHat_Open_f_02.wav", { family: "hi-hat", articulation: "open", velocity: ["dynamic", 6], rr: 2 }],
  ["Hat-HalfOpen-Medium-1.wav", { family: "hi-hat", articulation: "half-open", velocity: ["word", 2], rr: 1 }],
  ["HH_Quarter_Open_v2_rr2.wav", { family: "hi-hat", articulation: "quarter-open", velocity: ["v", 2], rr: 2 }],
  ["HHC_Shank_ff_3.wav", { family: "hi-hat", articulation: "shank", velocity: ["dynamic", 7], rr: 3 }],
  ["HH_Pedal_Chick_03.wav", { family: "hi-hat", articulation: "pedal", rr: 3 }],
  ["Hi-Hat Foot Splash 02.wav", { family: "hi-hat", articulation: "foot-splash", rr: 2 }],
  ["HiHat/hh_footsplash_p_01.wav", { family: "hi-hat", articulation: "foot-splash", velocity: ["dynamic", 3], rr: 1 }],
  ["Percussion/Cowbell_22x18.wav", { family: "cowbell", stem: ["cowbell", "22x18"] }],
  ["Kick_22x18/Kick22_Centre_v4_rr2.wav", { family: "kick", stem: ["kick", "22x18"], velocity: ["v", 4], rr: 2 }],
  ["HH_Tight_ppp_1.wav", { family: "hi-hat", articulation: "closed", velocity: ["dynamic", 1], rr: 1 }],
  ["Crash18_Edge_v5_rr2.wav", { family: "crash", articulation: "edge", velocity: ["v", 5], rr: 2, stem: ["crash", "18in"] }],
  ["CR2_Choke_Hard_01.wav", { family: "crash", articulation: "choke", velocity: ["word", 3], rr: 1, stem: ["crash", "2"] }],
  ["Crash 16in Bell mf 2.wav", { family: "crash", articulation: "bell", velocity: ["dynamic", 5], rr: 2 }],
  ["Ride_Bow_Tip_v3_rr4.wav", { family: "ride", articulation: "bow", velocity: ["v", 3], rr: 4 }],
  ["RD_Bell_Cup_ff_1.wav", { family: "ride", articulation: "bell", velocity: ["dynamic", 7], rr: 1 }],
  ["Ride 22 Crash 03.wav", { family: "ride", articulation: "crash-hit", rr: 3, stem: ["ride", "22in"] }],
  ["China_Grab_v2.wav", { family: "china", articulation: "choke", velocity: ["v", 2] }],
  ["CH18_Hit_f_1.wav", { family: "china", articulation: "crash-hit", velocity: ["dynamic", 6], rr: 1 }],
  ["Spl10_Choke_02.wav", { family: "splash", articulation: "choke", rr: 2, stem: ["splash", "10in"] }],
  ["Cowbell_Open_Hard_02.wav", { family: "cowbell", articulation: "open-tone", velocity: ["word", 3], rr: 2 }],
  ["CB_Mute_v1_rr1.wav", { family: "cowbell", articulation: "mute", velocity: ["v", 1], rr: 1 }],
  ["Conga_Slap_03.wav", { family: "hand-drum", articulation: "slap", rr: 3 }],
  ["Stack_Closed_v2_rr1.wav", { family: "stack", articulation: "closed", velocity: ["v", 2], rr: 1 }],
  ["Tambourine_Hit_04.wav", { family: "shaker", articulation: "hit", rr: 4 }],
  // information in folders
  ["Kit A/Snare 14x6.5 Brass/Center/Velocity 3/RR2.wav", { family: "snare", articulation: "centre", velocity: ["v", 3], rr: 2, stem: ["kit", "snare", "14x6.5", "brass"].filter((w) => w !== "kit") }],
  ["Drums/Toms/Tom 2/Rimshot/v4_03.wav", { family: "tom", articulation: "rim-shot", velocity: ["v", 4], rr: 3, stem: ["tom", "2"] }],
  ["Close Mics/Kick/Kick_Hard_1.wav", { family: "kick", mic: "close", velocity: ["word", 3], rr: 1 }],
  ["Rooms/HiHat/Closed/hh_cl_mf_02.wav", { family: "hi-hat", articulation: "closed", mic: "room", velocity: ["dynamic", 5], rr: 2 }],
  ["Overheads/Ride/Ride_Bell_02.wav", { family: "ride", articulation: "bell", mic: "overhead", rr: 2 }],
  ["Cymbals/Crash 18/soft/take 1.wav", { family: "crash", velocity: ["word", 1], rr: 1, stem: ["crash", "18in"] }],
  // names that say nothing
  ["Audio 0012.wav", { family: null, articulation: null, rr: 12 }],
  // more spellings of the trade
  ["Cymbals/Chinese Cymbal 18/Chinese_Crash_v2.wav", { family: "china", articulation: "crash-hit", velocity: ["v", 2] }],
  ["Chinese_18_Bell_f_02.wav", { family: "china", articulation: "bell", velocity: ["dynamic", 6], rr: 2 }],
  ["Snare_Muffled_v2_rr1.wav", { family: "snare", articulation: "mute", velocity: ["v", 2], rr: 1 }],
  ["Tom 2 Muted 03.wav", { family: "tom", articulation: "mute", rr: 3 }],
  ["Cowbell_Mouth_mf_01.wav", { family: "cowbell", articulation: "open-tone", velocity: ["dynamic", 5], rr: 1 }],
  ["Cowbell/CB_Mouth_Hard_3.wav", { family: "cowbell", articulation: "open-tone", velocity: ["word", 3], rr: 3 }],
  ["Snare_Ghost_03.wav", { family: "snare", articulation: "centre", velocity: ["word", 1], rr: 3 }],
  ["Snare 14x6.5/Ghost Notes/sn_ghost_rr2.wav", { family: "snare", articulation: "centre", velocity: ["word", 1], rr: 2 }],
  ["Snare/Ghost Notes/Snare_rr3.wav", { family: "snare", articulation: "centre", velocity: ["word", 1], rr: 3 }],
  ["Snare_Rimshot_Ghost_1.wav", { family: "snare", articulation: "rim-shot", velocity: ["word", 1], rr: 1 }],
  ["HH_Closed_Ghost_2.wav", { family: "hi-hat", articulation: "closed", velocity: ["word", 1], rr: 2 }],
  ["Hi-Mid Tom 2.wav", { family: "tom", velocity: null, stem: ["high", "mid", "tom", "2"] }],
  ["Low-Mid Tom_Center_ff.wav", { family: "tom", articulation: "centre", velocity: ["dynamic", 7], stem: ["low", "mid", "tom"] }],
  ["Agogo_Low_02.wav", { family: "cowbell", stem: ["agogo"], rr: 2 }],
  ["Snare_Center_Piano_02.wav", { family: "snare", articulation: "centre", velocity: ["dynamic", 3], rr: 2 }],
  ["Kick_Fortissimo_1.wav", { family: "kick", velocity: ["dynamic", 7], rr: 1 }],
  ["Crash_Grabbed_01.wav", { family: "crash", articulation: "choke", rr: 1 }],
  ["Guiro_Long_01.wav", { family: "other", stem: ["guiro", "long"], rr: 1 }],
  ["Percussion/Vibraslap.wav", { family: "other", stem: ["vibraslap"] }],
];

describe("parseName over a table of trade-style names (common practice, no published source)", () => {
  for (const [path, exp] of TABLE) {
    it(path, () => {
      const n = parseName(path);
      if ("family" in exp) expect(n.family).toBe(exp.family);
      if ("articulation" in exp) expect(n.articulation).toBe(exp.articulation);
      if ("velocity" in exp) {
        if (exp.velocity === null) expect(n.velocity).toBeNull();
        else expect([n.velocity?.scheme, n.velocity?.rank]).toEqual(exp.velocity);
      }
      if ("rr" in exp) expect(n.roundRobin).toBe(exp.rr);
      if ("mic" in exp) expect(n.mic).toBe(exp.mic);
      if (exp.stem) expect(n.stem).toEqual(exp.stem);
    });
  }
  it("has at least 40 rows", () => expect(TABLE.length).toBeGreaterThanOrEqual(40));
});

describe("counters: a letter + number with no trade meaning is not a round robin on its own (our rule, see names.ts)", () => {
  it("s139, x7, smp0042 and note36 are ids, not round robins, in a path read alone", () => {
    for (const [path, prefix, value] of [
      ["Snares/Snare_Top_s139.wav", "s", 139],
      ["Kick_x7.wav", "x", 7],
      ["pack/smp0042.wav", "smp", 42],
      ["Kit/Snare_Center_v3_note36.wav", "note", 36],
    ] as const) {
      const n = parseName(path);
      expect(n.roundRobin, path).toBeNull();
      expect(n.counter, path).toMatchObject({ kind: "id", prefix, value });
    }
    // the velocity hint beside an id is still read
    expect(parseName("Kit/Snare_Center_v3_note36.wav").velocity).toMatchObject({ scheme: "v", rank: 3 });
  });
  it("a word of the trade glued to a number keeps its reading (rr2, v3, tom2, kd22, Hard2, Center3)", () => {
    expect(parseName("Snare_rr2.wav")).toMatchObject({ roundRobin: 2, counter: null });
    expect(parseName("Snare_v3.wav").velocity).toMatchObject({ scheme: "v", rank: 3 });
    expect(parseName("Tom2_Center_01.wav")).toMatchObject({ stem: ["tom", "2"], roundRobin: 1, counter: null });
    expect(parseName("Snare_Hard2.wav")).toMatchObject({ roundRobin: 2, counter: null });
    expect(parseName("Snare_Center3.wav")).toMatchObject({ articulation: "centre", roundRobin: 3, counter: null });
  });
  it("a take number is read as the round robin by parseName (nothing else is known) and marked as a take counter", () => {
    expect(parseName("Snare_take12.wav")).toMatchObject({ roundRobin: 12, counter: { kind: "take", prefix: "take", value: 12 } });
  });
  it("a round-robin word elsewhere in the path makes an id the round robin (folder 'Round Robins', 'RR', a name with 'alt')", () => {
    expect(parseName("Snare/Round Robins/Snare_x3.wav")).toMatchObject({ roundRobin: 3, counter: { rrWord: true } });
    expect(parseName("Snare/RR/Snare_s4.wav").roundRobin).toBe(4);
    expect(parseName("Snare/Snare_alt_x3.wav").roundRobin).toBe(3); // not the 2 a bare "alt" stands for
    expect(parseName("Snare/Alternates/smp0042.wav").roundRobin).toBe(42);
  });
});

describe("parseNames: counters become round robins only where the folder shows a series", () => {
  it("files of one folder differing only by a small counter from 1 are round robins 1..n", () => {
    const n = parseNames(["Snare/Snare_x1.wav", "Snare/Snare_x2.wav", "Snare/Snare_x3.wav"]);
    expect(n.map((x) => x.roundRobin)).toEqual([1, 2, 3]);
  });
  it("keeps input order, and groups by the rest of the name: each velocity layer is its own series", () => {
    const paths = ["K/kick_v2_s2.wav", "K/kick_v1_s1.wav", "K/kick_v2_s1.wav", "K/kick_v1_s2.wav", "K/kick_v1_s3.wav"];
    expect(parseNames(paths).map((x) => [x.velocity?.rank, x.roundRobin])).toEqual([[2, 2], [1, 1], [2, 1], [1, 2], [1, 3]]);
  });
  it("large consecutive values (s139, s140, s141) are ids: a running sample number, not round robins", () => {
    expect(parseNames(["Snare/Snare_s139.wav", "Snare/Snare_s140.wav", "Snare/Snare_s141.wav"]).map((x) => x.roundRobin)).toEqual([null, null, null]);
  });
  it("a lone take12 is not a round robin; takes 1, 2, 3 of one name are", () => {
    expect(parseNames(["Kick/Kick_Hard_take12.wav", "Kick/Kick_Soft_take3.wav"]).map((x) => x.roundRobin)).toEqual([null, null]);
    expect(parseNames(["Kick/Kick_take1.wav", "Kick/Kick_take2.wav", "Kick/Kick_take3.wav"]).map((x) => x.roundRobin)).toEqual([1, 2, 3]);
  });
  it("the same names in different folders are no series; explicit round robins and bare numbers are untouched", () => {
    expect(parseNames(["A/Snare_x1.wav", "B/Snare_x2.wav"]).map((x) => x.roundRobin)).toEqual([null, null]);
    expect(parseNames(["A/Snare_rr7.wav", "A/Kick_03.wav", "Audio 0012.wav"]).map((x) => x.roundRobin)).toEqual([7, 3, 12]);
  });
  it("isRoundRobinSeries: distinct values from 0 or 1, at most 32, at most one in four missing", () => {
    expect(isRoundRobinSeries([1, 2])).toBe(true);
    expect(isRoundRobinSeries([0, 1, 2])).toBe(true);
    expect(isRoundRobinSeries([1, 2, 4, 5])).toBe(true); // one discarded take
    expect(isRoundRobinSeries([1, 3])).toBe(false);
    expect(isRoundRobinSeries([2, 3, 4])).toBe(false);
    expect(isRoundRobinSeries([1, 1, 2])).toBe(false);
    expect(isRoundRobinSeries([1])).toBe(false);
    expect(isRoundRobinSeries(Array.from({ length: 33 }, (_, i) => i + 1))).toBe(false);
    expect(isRoundRobinSeries(Array.from({ length: 32 }, (_, i) => i + 1))).toBe(true);
  });
});

describe("tokenise", () => {
  it("splits separators, camelCase, acronyms and digit boundaries; keeps sizes", () => {
    expect(tokenise("SnareTop_RimShot-v3.rr02")).toEqual(["snare", "top", "rim", "shot", "v", "3", "rr", "02"]);
    expect(tokenise("HHClosed")).toEqual(["hh", "closed"]);
    expect(tokenise('Snare 14x6.5 and 16" crash')).toEqual(["snare", "14x6.5", "and", "16in", "crash"]);
    expect(tokenise("HH 1/4 open")).toEqual(["hh", "quarter", "open"]);
  });
  it("file family wins over folder family; folder used when the file says nothing", () => {
    expect(parseName("Snares/Kick_01.wav").family).toBe("kick");
    expect(parseName("Snares/Brass/01.wav").family).toBe("snare");
    expect(parseName("Snares/Brass/01.wav").familyFrom).toBe("folder");
  });
});

describe("robustness", () => {
  it("words that are object property names never match a table", () => {
    const n = parseName("constructor/toString_hasOwnProperty_valueOf.wav");
    expect(n.family).toBeNull();
    expect(n.articulation).toBeNull();
  });
  it("hashes and ids add no instrument words", () => {
    expect(parseName("pack/3fa9c2d1.wav").stem).toEqual([]);
    expect(parseName("pack/0b8e4c1a-77f2-4d3e-9a51-2c6b9e0f1d3a.wav").stem).toEqual([]);
    expect(parseName("pack/Snare_Maple_xkcd_01.wav").stem).toEqual(["snare", "maple"]);
  });
  it("empty and odd paths do not throw", () => {
    expect(parseName("").family).toBeNull();
    expect(parseName("___.wav").tokens).toEqual([]);
  });
});
