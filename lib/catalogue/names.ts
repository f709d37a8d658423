// Over 300 lines: the trade vocabulary tables and the one parser that reads them, each rule beside its words.
// Name tokens: what a file name and its folders say about a sample (family, instrument stem, articulation,
// velocity hint, round-robin index, microphone position).
//
// The synonym tables are trade vocabulary (common practice of drum sample libraries, no published source).
// Pure: takes a path string, returns a plain object; parseNames() reads a whole library's paths, so a counter in a
// name can be judged by its folder.
//
// Counters (our rule; common practice, no published source). Explicit round-robin words with a number (rr2, robin 3,
// alt 2, var 4, seq 1) and a bare trailing number (kick_03) give the round robin, as before. A letter run with no
// trade meaning glued to a number (s139, x7, smp0042, note36) is an id, not a round robin, and a take number
// (take 3, tk12) is read as one only when nothing else is known: both become a `counter`, and parseNames() keeps
// them as the round robin only where the folder shows a series: two or more files in one folder whose names
// differ only by that counter, with distinct values starting at 0 or 1, at most 32 (drum libraries record a
// handful to about 20 round robins per layer), and at most one value in four missing (a discarded take). A
// round-robin word elsewhere in the path (a folder "Round Robins", "RR", "alternates", "variations") makes the
// counter the round robin on its own.

import type { Articulation, Family, Stroke } from "./taxonomy";
import { studioStrokeInTokens, type StrokeList } from "./strokes";

export const MIC_POSITIONS = [
  "close", "top", "bottom", "inside", "outside", "shell", "sub", "overhead", "room", "far", "ambient", "mono", "stereo", "mix",
] as const;
export type MicPosition = (typeof MIC_POSITIONS)[number];

/** How a velocity hint was written. "v": v1..v16 / vel3 / layer 2; "dynamic": ppp..fff; "word": soft/medium/hard; "number": a bare number. */
export type VelocityScheme = "v" | "dynamic" | "word" | "number";

export interface VelocityHint {
  scheme: VelocityScheme;
  /** Rank inside its scheme: higher = louder. v3 -> 3, pp -> 2, mf -> 5, soft -> 1, hard -> 3. */
  rank: number;
  raw: string;
}

export interface NameInfo {
  /** Lower-case tokens of the file name (extension removed), in order. */
  tokens: string[];
  /** Lower-case tokens of each folder, outermost first. */
  folderTokens: string[][];
  family: Family | null;
  /** Where the family came from: the file name or a folder. */
  familyFrom: "file" | "folder" | null;
  /** A built-in articulation, or a studio's own stroke whose words the name uses (studio words win). */
  articulation: Stroke | null;
  articulationFrom: "file" | "folder" | null;
  /** Descriptive words naming the instrument (canonical family words, sizes, materials, drum numbers), in order, unique. */
  stem: string[];
  velocity: VelocityHint | null;
  roundRobin: number | null;
  mic: MicPosition | null;
  /** A number in the file name that is not known to be a round robin (see the top comment). */
  counter: NameCounter | null;
}

export interface NameCounter {
  /** "take": take 3, tk12 (parseName reads it as the round robin); "id": a letter run with no trade meaning (not read) */
  kind: "take" | "id";
  /** the letters before the number, lower case */
  prefix: string;
  value: number;
  /** index of the number in `tokens` */
  at: number;
  /** the path says round robin elsewhere (rr, robin, alt, var... without a number, in a folder or the name) */
  rrWord: boolean;
}

// ---------------------------------------------------------------------------------------------------------------
// Tokenising

const DIMENSION = /(\d+(?:[.,]\d+)?)\s*(?:"|''|in(?:ch(?:es)?)?)?\s*[x×]\s*(\d+(?:[.,]\d+)?)\s*(?:"|''|in(?:ch(?:es)?)?)?/gi;
const INCHES = /(\d+(?:[.,]\d+)?)\s*(?:"|''|in(?:ch(?:es)?)?)(?![a-z])/gi;

/**
 * Splits one name (no slashes) into lower-case tokens: separators (space _ - . , + ( ) [ ] { } # ~),
 * camelCase and ALLCAPSWord boundaries, letter/digit boundaries. Sizes such as 14x6.5 or 16" stay one token
 * ("14x6.5", "16in"). Velocity and round-robin compounds such as v3 or rr02 are split into "v", "3"
 * and rejoined by the parser.
 */
export function tokenise(name: string): string[] {
  return tokeniseGlued(name).tokens;
}

/** tokenise(), also saying which tokens are digits written straight after letters in the name ("s139": "139"). */
function tokeniseGlued(name: string): { tokens: string[]; glued: boolean[] } {
  const out: string[] = [];
  const glued: boolean[] = [];
  // protect sizes first
  const protectedParts: string[] = [];
  let s = name.replace(DIMENSION, (_m, a: string, b: string) => {
    protectedParts.push(`${a.replace(",", ".")}x${b.replace(",", ".")}`);
    return ` \u0000${protectedParts.length - 1}\u0000 `;
  });
  s = s.replace(INCHES, (_m, a: string) => {
    protectedParts.push(`${a.replace(",", ".")}in`);
    return ` \u0000${protectedParts.length - 1}\u0000 `;
  });
  // fractions written 1/4, 3/4 mean openness; keep them
  s = s.replace(/(^|[^\d])([13])\/4(?!\d)/g, (_m, pre: string, n: string) => {
    protectedParts.push(n === "1" ? "quarter" : "threequarter");
    return `${pre} \u0000${protectedParts.length - 1}\u0000 `;
  });
  for (const chunk of s.split(/[\s_\-.,+()[\]{}#~&=;:'"!]+/)) {
    if (!chunk) continue;
    const prot = /^\u0000(\d+)\u0000$/.exec(chunk);
    if (prot) {
      out.push(protectedParts[Number(prot[1])]!);
      glued.push(false);
      continue;
    }
    const cleaned = chunk.replace(/\u0000/g, "");
    // hashes and ids (hex runs with digits, UUID parts) carry no words
    if (/^(?=.*\d)(?=.*[a-f])[0-9a-f]{6,}$/i.test(cleaned) || /^[0-9a-f]{12,}$/i.test(cleaned)) continue;
    // camelCase / ACRONYMWord / letter-digit boundaries
    const parts = cleaned
      .replace(/([a-z])([A-Z])/g, "$1 $2")
      .replace(/([A-Z]+)([A-Z][a-z])/g, "$1 $2")
      .replace(/([A-Za-z])(\d)/g, "$1 $2")
      .replace(/(\d)([A-Za-z])/g, "$1 $2")
      .split(/\s+/)
      .filter((p) => p.length > 0);
    parts.forEach((p, j) => {
      out.push(p.toLowerCase());
      glued.push(j > 0 && /^\d/.test(p) && /[A-Za-z]$/.test(parts[j - 1]!));
    });
  }
  return { tokens: out, glued };
}

/** Own-property lookup (so "constructor" or "toString" in a name never matches a table). */
function get<T>(o: Record<string, T>, k: string): T | undefined {
  return Object.prototype.hasOwnProperty.call(o, k) ? o[k] : undefined;
}

// ---------------------------------------------------------------------------------------------------------------
// Synonym tables (trade vocabulary, common practice)

interface FamilyWord {
  family: Family;
  /** Canonical words this token stands for in the instrument stem. */
  words: string[];
  articulation?: Articulation;
  /** Weak: only counts when nothing stronger names the family (e.g. "bass", "floor", "rack"). */
  weak?: boolean;
}

const FAMILY_WORDS: Record<string, FamilyWord> = {};
function fam(family: Family, words: string[], tokens: string[], extra: Partial<FamilyWord> = {}): void {
  for (const t of tokens) FAMILY_WORDS[t] = { family, words, ...extra };
}
fam("kick", ["kick"], ["kick", "kicks", "kik", "kck", "kd", "bd", "bassdrum", "kickdrum", "bdrum"]);
fam("kick", ["kick"], ["bass"], { weak: true });
fam("snare", ["snare"], ["snare", "snares", "snr", "sn", "sd", "snaredrum", "snre"]);
fam("snare", ["snare", "piccolo"], ["piccolo"], { weak: true });
fam("tom", ["tom"], ["tom", "toms", "tm", "tomtom"]);
fam("tom", ["rack", "tom"], ["racktom", "rt", "rtom", "hitom", "midtom"]);
fam("tom", ["floor", "tom"], ["floortom", "ft", "ftom", "lotom", "lowtom"]);
fam("tom", ["rack"], ["rack"], { weak: true });
fam("tom", ["floor"], ["floor"], { weak: true });
fam("hi-hat", ["hi-hat"], ["hh", "hat", "hats", "hihat", "hihats", "hhat", "hht"]);
fam("hi-hat", ["hi-hat"], ["hhc", "chh"], { articulation: "closed" });
fam("hi-hat", ["hi-hat"], ["hho", "ohh"], { articulation: "open" });
fam("hi-hat", ["hi-hat"], ["hhp", "phh", "hhpedal"], { articulation: "pedal" });
fam("crash", ["crash"], ["crash", "crashes", "cr", "crsh", "crs"]);
fam("ride", ["ride"], ["ride", "rides", "rd", "rde"]);
fam("china", ["china"], ["china", "chinas", "chinese", "chn", "chna", "ch", "trash"]);
fam("splash", ["splash"], ["splash", "splashes", "spl", "spsh", "splsh"]);
fam("stack", ["stack"], ["stack", "stacks", "stk", "stacker"]);
fam("cowbell", ["cowbell"], ["cowbell", "cowbells", "cb", "cbell", "cow"]);
// the agogo (a pair of bells played with a stick) sorts with the cowbell: one struck, pitched bell each
fam("cowbell", ["agogo"], ["agogo", "agogos"]);
fam("hand-drum", ["conga"], ["conga", "congas", "tumba", "quinto"]);
fam("hand-drum", ["bongo"], ["bongo", "bongos"]);
fam("hand-drum", ["djembe"], ["djembe"]);
fam("hand-drum", ["cajon"], ["cajon"]);
fam("hand-drum", ["timbale"], ["timbale", "timbales", "timb"]);
fam("hand-drum", ["darbuka"], ["darbuka", "doumbek", "dumbek", "tabla", "frame"]);
fam("shaker", ["shaker"], ["shaker", "shakers", "shk", "shkr", "egg"]);
fam("shaker", ["maraca"], ["maraca", "maracas", "cabasa"]);
fam("shaker", ["tambourine"], ["tambourine", "tamb", "tambo", "tamborine"]);
fam("other", ["clap"], ["clap", "claps", "handclap"]);
fam("other", ["clave"], ["clave", "claves"]);
fam("other", ["woodblock"], ["woodblock", "block", "wb"]);
fam("other", ["triangle"], ["triangle", "tri"]);
fam("other", ["snap"], ["snap", "fingersnap"]);
fam("other", ["guiro"], ["guiro", "guiros"]);
fam("other", ["vibraslap"], ["vibraslap"]);
fam("other", ["cuica"], ["cuica", "cuicas"]);
fam("other", ["castanets"], ["castanet", "castanets"]);

/** Two-token family names ("bass drum", "hi hat", "floor tom"); checked before single tokens. */
const FAMILY_BIGRAMS: Record<string, FamilyWord> = {
  "bass drum": { family: "kick", words: ["kick"] },
  "kick drum": { family: "kick", words: ["kick"] },
  "hi hat": { family: "hi-hat", words: ["hi-hat"] },
  "high hat": { family: "hi-hat", words: ["hi-hat"] },
  "hi hats": { family: "hi-hat", words: ["hi-hat"] },
  "floor tom": { family: "tom", words: ["floor", "tom"] },
  "rack tom": { family: "tom", words: ["rack", "tom"] },
  "hi tom": { family: "tom", words: ["high", "tom"] },
  "high tom": { family: "tom", words: ["high", "tom"] },
  "mid tom": { family: "tom", words: ["mid", "tom"] },
  "low tom": { family: "tom", words: ["low", "tom"] },
  "lo tom": { family: "tom", words: ["low", "tom"] },
  "cow bell": { family: "cowbell", words: ["cowbell"] },
  "snare drum": { family: "snare", words: ["snare"] },
  "hand clap": { family: "other", words: ["clap"] },
  "wood block": { family: "other", words: ["woodblock"] },
  "chinese cymbal": { family: "china", words: ["china"] },
};

const ARTICULATION_WORDS: Record<string, Articulation> = {};
function art(a: Articulation, tokens: string[]): void {
  for (const t of tokens) ARTICULATION_WORDS[t] = a;
}
art("centre", ["center", "centre", "ctr", "cntr", "ctre", "cen", "cent", "middle", "head", "centerhit"]);
art("half-edge", ["halfedge", "offcenter", "offcentre", "offctr"]);
art("edge", ["edge", "edg", "edges"]);
art("rim-shot", ["rimshot", "rimshots", "rim", "rs", "rmsht", "rimsht"]);
art("rim-click", ["rimclick", "click"]);
art("cross-stick", ["sidestick", "xstick", "crossstick", "cross", "ss", "xs", "stick", "sstick"]);
art("flam", ["flam", "flams"]);
art("drag", ["drag", "drags", "ruff"]);
art("roll", ["roll", "rolls", "swell"]);
art("buzz", ["buzz", "press", "pressroll"]);
art("mute", ["mute", "mutes", "muted", "muffled", "muffle", "dead", "damp", "damped", "dampened"]);
art("slap", ["slap", "slaps"]);
art("open-tone", ["tone", "opentone"]);
// A cowbell's "mouth" stroke: the stick's shaft across the open end, the full, ringing open sound, as against the
// dry stroke on its closed neck (common practice); it is the cowbell's open-tone.
art("open-tone", ["mouth"]);
art("heel", ["heel"]);
art("toe", ["toe"]);
art("bell", ["bell", "cup", "bl", "bel"]);
art("bow", ["bow", "ping", "body"]);
art("tip", ["tip", "tips"]);
art("shank", ["shank", "shoulder", "shk2"]);
art("choke", ["choke", "choked", "grab", "grabbed", "chk", "stopped", "chokes"]);
art("closed", ["closed", "cl", "clsd", "cls", "tight", "shut", "clsed", "closd"]);
art("quarter-open", ["quarter", "qtr", "loose", "slightly", "semiopen", "semi", "threequarter"]);
art("half-open", ["half", "halfopen", "ho", "hlf", "hopen"]);
art("open", ["open", "op", "opn", "opened", "wide"]);
art("foot-splash", ["footsplash", "splashfoot", "fsplash"]);
art("pedal", ["pedal", "foot", "chick", "ped", "pdl", "pedl", "chic"]);
art("hit", ["hit", "hits", "shot", "oneshot", "strike", "normal", "norm", "std"]);
// hand drums: the bass stroke (palm in the middle), finger strokes, and strokes on the rim (fitArticulation
// turns a "rim" on a hand drum into its rim stroke); brushes on a snare or tom: a tap and a sweep (common practice)
art("finger", ["finger", "fingers", "fingertip", "fingertips"]);
art("brush", ["brush", "brushes", "brushed", "brsh"]);
art("sweep", ["sweep", "sweeps", "swish", "stir", "swirl"]);

const ARTICULATION_BIGRAMS: Record<string, Articulation> = {
  "half edge": "half-edge",
  "off center": "half-edge",
  "off centre": "half-edge",
  "rim shot": "rim-shot",
  "rim click": "rim-click",
  "side stick": "cross-stick",
  "cross stick": "cross-stick",
  "x stick": "cross-stick",
  "half open": "half-open",
  "quarter open": "quarter-open",
  "semi open": "quarter-open",
  "slightly open": "quarter-open",
  "foot splash": "foot-splash",
  "pedal splash": "foot-splash",
  "foot closed": "pedal",
  "open tone": "open-tone",
  "press roll": "buzz",
  "buzz roll": "buzz",
  "bass tone": "bass",
  "bass stroke": "bass",
  "brush tap": "brush",
  "brush sweep": "sweep",
};

const MIC_WORDS: Record<string, MicPosition> = {};
function mic(m: MicPosition, tokens: string[]): void {
  for (const t of tokens) MIC_WORDS[t] = m;
}
mic("close", ["close", "closemic", "spot", "dir", "direct", "near"]);
mic("top", ["top", "tp"]);
mic("bottom", ["bottom", "btm", "bot", "under", "bttm", "reso"]);
mic("inside", ["inside", "in", "ins"]);
mic("outside", ["outside", "out", "outs"]);
mic("shell", ["shell"]);
mic("sub", ["sub", "subkick"]);
mic("overhead", ["overhead", "overheads", "oh", "ohs", "ovh", "ovhd", "ovhds", "ohl", "ohr"]);
mic("room", ["room", "rooms", "rm", "rmm", "hall"]);
mic("far", ["far", "distant"]);
mic("ambient", ["ambient", "amb", "ambience", "ambiance", "ambi"]);
mic("mono", ["mono", "mon"]);
mic("stereo", ["stereo", "st", "stereomix"]);
mic("mix", ["mix", "mixed", "full", "fullmix", "allmics"]);

const MIC_BIGRAMS: Record<string, MicPosition> = {
  "close mic": "close",
  "close mics": "close",
  "room mic": "room",
  "room mics": "room",
  "over head": "overhead",
  "full mix": "mix",
};

const DYNAMICS: Record<string, number> = { ppp: 1, pp: 2, p: 3, mp: 4, mf: 5, f: 6, ff: 7, fff: 8 };
/** The same marks written out in full (Italian dynamics). */
const DYNAMIC_NAMES: Record<string, number> = { pianissimo: 2, piano: 3, mezzopiano: 4, mezzoforte: 5, forte: 6, fortissimo: 7 };
/** A ghost note: a very soft stroke, on a drum at its centre (common practice). */
const GHOST_WORDS = new Set(["ghost", "ghosts", "ghosted", "ghostnote", "ghostnotes"]);
const DYNAMIC_WORDS: Record<string, number> = {
  whisper: 1, soft: 1, softer: 1, light: 1, gentle: 1, quiet: 1, lo: 1, low: 1,
  medium: 2, med: 2, mid: 2, moderate: 2, normalvel: 2,
  hard: 3, loud: 3, strong: 3, heavy: 3, accent: 3, hi: 3, high: 3,
  harder: 4, max: 4,
};
const VEL_PREFIX = new Set(["v", "vel", "velo", "velocity", "vl", "layer", "lay", "lyr", "dyn", "dynamic"]);
const RR_PREFIX = new Set(["rr", "rob", "robin", "roundrobin", "alt", "take", "tk", "var", "variation", "seq", "r"]);
const RR_WORDS_NO_NUMBER = new Set(["alt", "alternate"]);
/** Words saying a folder or name holds round robins (they make a counter in the name the round robin). */
const RR_CONTEXT = new Set([
  "rr", "rrs", "robin", "robins", "roundrobin", "roundrobins", "alt", "alts", "alternate", "alternates", "var", "vars", "variation", "variations",
]);
const TAKE_PREFIX = new Set(["take", "tk"]);

/** Words that carry no instrument identity (file and folder boilerplate). */
const NOISE_WORDS = new Set([
  "wav", "wave", "samples", "sample", "drums", "drum", "kit", "kits", "oneshot", "oneshots", "one", "shots", "multisample",
  "multisamples", "velocities", "velocity", "layers", "layer", "round", "robin", "robins", "rr", "mics", "mic", "stereo",
  "the", "and", "of", "a", "with", "new", "final", "take", "takes", "cymbal", "cymbals", "set", "library", "pack",
  "hits", "hit", "articulations", "processed", "raw", "clean", "v", "vel", "x", "l", "r", "left", "right",
  "dynamic", "dynamics", "mixed", "all", "misc", "various", "audio", "untitled", "file", "files", "track", "recording", "rec",
  "percussion", "perc", "bounce", "export", "exported", "copy", "edit", "edited", "sound", "sounds", "sfx", "wavs", "tmp", "temp", "folder",
  "note", "notes",
]);

/** Families where several instruments of one kind are usual, so "tom 2" or "crash 1" names the instrument. */
const CYMBALS = new Set<Family | null>(["crash", "ride", "china", "splash", "stack", "hi-hat"]);
const NUMBERED_INSTRUMENTS = new Set<Family>(["tom", "crash", "splash", "china", "ride", "stack", "cowbell", "hand-drum", "snare", "kick"]);

// ---------------------------------------------------------------------------------------------------------------
// Parsing

interface Parsed {
  family: Family | null;
  familyWeak: Family | null;
  familyArticulation: Articulation | null;
  /** Further family words after the first (e.g. "ride crash": crash names an articulation of the ride). */
  laterFamilies: Family[];
  articulation: Articulation | null;
  articulationWords: Articulation[];
  stem: string[];
  velocity: VelocityHint | null;
  rr: number | null;
  /** the round robin came from a bare "alt" (read as the second take) */
  rrFromAltWord: boolean;
  counter: NameCounter | null;
  ghost: boolean;
  mic: MicPosition | null;
  ambiguous: string[];
}

const isNum = (t: string | undefined): boolean => t !== undefined && /^\d+$/.test(t);

/** A word of the trade (any table above): a number written straight after it keeps its usual reading. */
function isTradeWord(t: string): boolean {
  return (
    get(FAMILY_WORDS, t) !== undefined || get(ARTICULATION_WORDS, t) !== undefined || get(MIC_WORDS, t) !== undefined ||
    get(DYNAMICS, t) !== undefined || get(DYNAMIC_NAMES, t) !== undefined || get(DYNAMIC_WORDS, t) !== undefined ||
    VEL_PREFIX.has(t) || RR_PREFIX.has(t) || GHOST_WORDS.has(t) || t === "round" || t === "robin"
  );
}

function parseTokens(tokens: string[], isFile: boolean, glued: boolean[] = []): Parsed {
  const p: Parsed = {
    family: null, familyWeak: null, familyArticulation: null, laterFamilies: [], articulation: null, articulationWords: [],
    stem: [], velocity: null, rr: null, rrFromAltWord: false, counter: null, ghost: false, mic: null, ambiguous: [],
  };
  const used = new Array<boolean>(tokens.length).fill(false);
  const numbers: { i: number; raw: string }[] = [];
  let lastFamilyIndex = -1;

  const takeFamily = (fw: FamilyWord, i: number): void => {
    if (fw.weak) {
      if (!p.familyWeak) p.familyWeak = fw.family;
    } else if (!p.family) {
      p.family = fw.family;
      if (fw.articulation) p.familyArticulation = fw.articulation;
    } else if (fw.family !== p.family) {
      p.laterFamilies.push(fw.family);
      lastFamilyIndex = i;
      return;
    } else if (fw.articulation && !p.familyArticulation) {
      p.familyArticulation = fw.articulation;
    }
    for (const w of fw.words) if (!p.stem.includes(w)) p.stem.push(w);
    lastFamilyIndex = i;
  };

  for (let i = 0; i < tokens.length; i++) {
    if (used[i]) continue;
    const t = tokens[i]!;
    const next = tokens[i + 1];
    const bigram = next !== undefined ? `${t} ${next}` : "";

    // compounds with a number: v3, vel 3, layer 2, rr2, take 3, alt 2
    if (VEL_PREFIX.has(t) && isNum(next) && !(t === "v" && p.velocity)) {
      p.velocity = { scheme: "v", rank: Number(next), raw: `${t}${next}` };
      used[i] = used[i + 1] = true;
      i++;
      continue;
    }
    if (RR_PREFIX.has(t) && isNum(next)) {
      p.rr = Number(next);
      p.rrFromAltWord = false;
      if (TAKE_PREFIX.has(t)) p.counter = { kind: "take", prefix: t, value: Number(next), at: i + 1, rrWord: false };
      used[i] = used[i + 1] = true;
      i++;
      continue;
    }
    if (t === "round" && next === "robin" && isNum(tokens[i + 2])) {
      p.rr = Number(tokens[i + 2]);
      used[i] = used[i + 1] = used[i + 2] = true;
      i += 2;
      continue;
    }
    if (bigram && get(FAMILY_BIGRAMS, bigram)) {
      takeFamily(get(FAMILY_BIGRAMS, bigram)!, i + 1);
      used[i] = used[i + 1] = true;
      i++;
      continue;
    }
    if (bigram && get(ARTICULATION_BIGRAMS, bigram)) {
      p.articulationWords.push(get(ARTICULATION_BIGRAMS, bigram)!);
      used[i] = used[i + 1] = true;
      i++;
      continue;
    }
    if (bigram && get(MIC_BIGRAMS, bigram)) {
      p.mic = get(MIC_BIGRAMS, bigram)!;
      used[i] = used[i + 1] = true;
      i++;
      continue;
    }
    if (isNum(t) && isFile && glued[i] && /^[a-z]+$/.test(tokens[i - 1] ?? "") && !isTradeWord(tokens[i - 1]!)) {
      // letters with no trade meaning glued to a number (s139, x7, smp0042): an id, not a take number
      p.counter = { kind: "id", prefix: tokens[i - 1]!, value: Number(t), at: i, rrWord: false };
      used[i] = true;
      continue;
    }
    if (isNum(t)) {
      // a number straight after an instrument word names the instrument: a small one is its index ("tom 2",
      // "crash 1"), 6..28 is a size in inches ("crash 18", "kick 22"); zero-padded numbers are take numbers
      const prevFamily = lastFamilyIndex === i - 1 ? (p.family ?? p.familyWeak) : null;
      const isLast = i === tokens.length - 1;
      const n = Number(t);
      const padded = t.length > 1 && t.startsWith("0");
      if (prevFamily && !padded) {
        if (n >= 1 && n <= 9 && NUMBERED_INSTRUMENTS.has(prevFamily) && (!isLast || prevFamily === "tom" || !isFile)) {
          p.stem.push(t);
          used[i] = true;
          continue;
        }
        if (n >= 6 && n <= 28 && (!isLast || CYMBALS.has(prevFamily) || !isFile)) {
          p.stem.push(`${t}in`);
          used[i] = true;
          continue;
        }
      }
      numbers.push({ i, raw: t });
      continue;
    }
    if (get(FAMILY_WORDS, t)) {
      // "ch" after a hi-hat word means closed hi-hat, not china; "splash" on a hi-hat is a foot splash
      const fw = get(FAMILY_WORDS, t)!;
      // a size in inches before the instrument word ("18 crash", "22 kick")
      const prevNum = numbers[numbers.length - 1];
      if (prevNum && prevNum.i === i - 1 && !prevNum.raw.startsWith("0") && Number(prevNum.raw) >= 6 && Number(prevNum.raw) <= 28) {
        numbers.pop();
        p.stem.push(`${prevNum.raw}in`);
      }
      if (t === "ch" && p.family === "hi-hat") {
        p.articulationWords.push("closed");
      } else if ((t === "splash" || t === "spl") && p.family === "hi-hat") {
        p.articulationWords.push("foot-splash");
      } else if (t === "bass" && (next === "drum" || get(FAMILY_WORDS, next ?? "")?.family === "kick")) {
        takeFamily({ family: "kick", words: ["kick"] }, i);
      } else {
        takeFamily(fw, i);
      }
      used[i] = true;
      continue;
    }
    if (get(ARTICULATION_WORDS, t)) {
      p.articulationWords.push(get(ARTICULATION_WORDS, t)!);
      used[i] = true;
      continue;
    }
    if (get(MIC_WORDS, t) && !(t === "in" && isNum(next))) {
      if (!p.mic) p.mic = get(MIC_WORDS, t)!;
      used[i] = true;
      continue;
    }
    if (GHOST_WORDS.has(t)) {
      p.ghost = true;
      if (!p.velocity || p.velocity.scheme === "word") p.velocity = { scheme: "word", rank: 1, raw: t };
      used[i] = true;
      continue;
    }
    if (get(DYNAMIC_NAMES, t) !== undefined) {
      p.velocity = { scheme: "dynamic", rank: get(DYNAMIC_NAMES, t)!, raw: t };
      used[i] = true;
      continue;
    }
    if (get(DYNAMICS, t) !== undefined && (t.length > 1 || i > 0)) {
      p.velocity = { scheme: "dynamic", rank: get(DYNAMICS, t)!, raw: t };
      used[i] = true;
      continue;
    }
    if (get(DYNAMIC_WORDS, t) !== undefined) {
      // "hi"/"lo"/"mid"/"high"/"low" next to "tom" are drum positions, not strengths
      // (also through a second position word: "hi mid tom", "low mid tom")
      const isTom = (w: string | undefined) => get(FAMILY_WORDS, w ?? "")?.family === "tom";
      const position = (w: string | undefined) => w !== undefined && ["hi", "lo", "low", "high", "mid"].includes(w);
      const nearTom = isTom(next) || isTom(tokens[i - 1]) || (position(next) && isTom(tokens[i + 2]));
      if (nearTom && ["hi", "lo", "low", "high", "mid"].includes(t)) {
        p.stem.push(t === "hi" ? "high" : t === "lo" ? "low" : t);
      } else if (!p.velocity || p.velocity.scheme === "word") {
        p.velocity = { scheme: "word", rank: get(DYNAMIC_WORDS, t)!, raw: t };
      }
      used[i] = true;
      continue;
    }
    if (RR_WORDS_NO_NUMBER.has(t)) {
      used[i] = true;
      if (p.rr === null) {
        p.rr = 2;
        p.rrFromAltWord = true;
      }
      continue;
    }
    if (/^\d+(\.\d+)?x\d+(\.\d+)?$/.test(t) || /^\d+(\.\d+)?in$/.test(t)) {
      p.stem.push(t);
      used[i] = true;
      continue;
    }
    // unknown words name the instrument ("brass", "maple"); letter runs without a vowel are ids, not words
    if (!NOISE_WORDS.has(t) && /[a-z]/.test(t) && t.length >= 2 && /[aeiouy]/.test(t)) {
      p.stem.push(t);
    }
    used[i] = true;
  }

  // Bare numbers. Common naming conventions: "<name>_<velocity>_<rr>" when two numbers close the name,
  // a single trailing number is a take / round-robin index ("kick_03"), unless the name already carries a
  // round-robin index and no velocity, in which case it is the velocity.
  if (isFile && numbers.length > 0) {
    const trailing = numbers.filter((n) => n.i >= tokens.length - 3);
    if (trailing.length >= 2) {
      const a = trailing[trailing.length - 2]!;
      const b = trailing[trailing.length - 1]!;
      if (!p.velocity) p.velocity = { scheme: "number", rank: Number(a.raw), raw: a.raw };
      if (p.rr === null) p.rr = Number(b.raw);
    } else if (trailing.length === 1) {
      const a = trailing[0]!;
      if (p.rr === null) p.rr = Number(a.raw);
      else if (!p.velocity) p.velocity = { scheme: "number", rank: Number(a.raw), raw: a.raw };
    }
  }
  if (p.articulationWords.length) p.articulation = combineArticulations(p.articulationWords);
  return p;
}

/** "open" + "half" -> half-open; "rim" + "click" -> rim-click; "closed" + "pedal" -> pedal; otherwise the first word. */
function combineArticulations(words: Articulation[]): Articulation {
  const has = (a: Articulation) => words.includes(a);
  if (has("half-open") || (has("open") && has("half-edge"))) return "half-open";
  if (has("quarter-open")) return "quarter-open";
  if (has("foot-splash")) return "foot-splash";
  if (has("pedal")) return "pedal";
  if (has("rim-shot") && has("rim-click")) return "rim-click";
  if (has("rim-shot") && has("cross-stick")) return "cross-stick";
  if (has("half-edge")) return "half-edge";
  const specific = words.filter((w) => w !== "hit");
  return specific[0] ?? words[0]!;
}

/** Articulation words that depend on the family (e.g. "crash" on a ride is a crash hit, "half" on a snare is half-edge). */
function fitArticulation(a: Articulation | null, family: Family | null, laterFamilies: Family[]): Articulation | null {
  if (family && ["ride", "china", "stack", "splash"].includes(family) && laterFamilies.includes("crash") && !a) return "crash-hit";
  if (family === "hi-hat" && laterFamilies.includes("splash") && !a) return "foot-splash";
  if (!a || !family) return a;
  const drum = family === "snare" || family === "tom" || family === "kick" || family === "hand-drum";
  if (drum && (a === "half-open")) return "half-edge";
  if (drum && a === "open") return family === "hand-drum" ? "open-tone" : "centre";
  if (drum && a === "closed") return "mute";
  if (family === "hi-hat" && a === "choke") return "choke";
  if (family === "hi-hat" && a === "hit") return "closed";
  if (family === "hi-hat" && a === "cross-stick") return a; // keep: it will be reported as unusual by the caller
  if (family === "hi-hat" && a === "edge") return "shank";
  if ((family === "crash" || family === "china" || family === "splash") && a === "hit") return "crash-hit";
  if (family === "ride" && a === "hit") return "bow";
  if (family === "hand-drum" && (a === "rim-shot" || a === "rim-click")) return "rim";
  if (family === "cowbell" && a === "open") return "open-tone";
  if (family === "cowbell" && (a === "closed" || a === "choke")) return "mute";
  return a;
}

/** Parses a sample path ("Kit/Snare 14x6.5/Center/Snare_Center_v3_rr2.wav") into its name information. */
export function parseName(path: string, strokes?: StrokeList | null): NameInfo {
  const parts = path.split(/[\\/]+/).filter((s) => s.length > 0 && s !== ".");
  const fileName = (parts.pop() ?? "").replace(/\.(wav|wave|bwf|aif|aiff|flac)$/i, "");
  const { tokens, glued } = tokeniseGlued(fileName);
  const folderTokens = parts.map(tokenise);
  const file = parseTokens(tokens, true, glued);
  const folders = folderTokens.map((t) => parseTokens(t, false));

  // the file name wins; otherwise the innermost folder that says it
  let family: Family | null = file.family;
  let familyFrom: NameInfo["familyFrom"] = family ? "file" : null;
  if (!family) {
    for (let i = folders.length - 1; i >= 0 && !family; i--) if (folders[i]!.family) family = folders[i]!.family;
    if (family) familyFrom = "folder";
  }
  if (!family && file.familyWeak) {
    family = file.familyWeak;
    familyFrom = "file";
  }
  if (!family) {
    for (let i = folders.length - 1; i >= 0 && !family; i--) if (folders[i]!.familyWeak) family = folders[i]!.familyWeak;
    if (family) familyFrom = "folder";
  }

  let articulation: Stroke | null = file.articulation ?? file.familyArticulation;
  let articulationFrom: NameInfo["articulationFrom"] = articulation ? "file" : null;
  const laterFamilies = [...file.laterFamilies];
  if (!articulation) {
    for (let i = folders.length - 1; i >= 0 && !articulation; i--) {
      articulation = folders[i]!.articulation ?? folders[i]!.familyArticulation;
      if (folders[i]!.family && folders[i]!.family !== family) laterFamilies.push(folders[i]!.family!);
    }
    if (articulation) articulationFrom = "folder";
  }
  articulation = fitArticulation(articulation as Articulation | null, family, laterFamilies);
  if (articulation && !articulationFrom) articulationFrom = "file";
  // "bass" on a hand drum is its bass stroke, not a bass drum ("conga bass", "bass djembe")
  const bassStroke = family === "hand-drum" && (tokens.includes("bass") || folderTokens.some((ts) => ts.includes("bass")));
  if (bassStroke && (!articulation || articulationFrom === "folder" && tokens.includes("bass"))) {
    articulation = "bass";
    articulationFrom = tokens.includes("bass") ? "file" : "folder";
  }
  // a ghost note on a drum (said by the name or a folder) is a soft stroke at its centre
  const ghost = file.ghost || folders.some((f) => f.ghost);
  if (!articulation && ghost && (family === "snare" || family === "tom" || family === "kick")) {
    articulation = "centre";
    articulationFrom = file.ghost ? "file" : "folder";
  }

  let velocity = file.velocity;
  let roundRobin = file.rr;
  let micPos = file.mic;
  // a counter is the round robin when the path says round robins elsewhere (a folder "RR", a word "alt"...)
  let counter: NameCounter | null = null;
  if (file.counter) {
    const rrWord = [tokens.filter((_t, i) => i !== file.counter!.at - 1), ...folderTokens].some((ts) => ts.some((t) => RR_CONTEXT.has(t)));
    counter = { ...file.counter, rrWord };
    if (rrWord && counter.kind === "id" && (roundRobin === null || file.rrFromAltWord)) roundRobin = counter.value;
  }
  for (let i = folders.length - 1; i >= 0; i--) {
    const f = folders[i]!;
    if (!velocity && f.velocity) velocity = f.velocity;
    if (roundRobin === null && f.rr !== null) roundRobin = f.rr;
    if (!micPos && f.mic) micPos = f.mic;
  }

  // instrument stem: folder words (outermost first) then file words, canonical and unique; folders that only
  // name an articulation, a layer or a mic add nothing.
  const stem: string[] = [];
  for (const f of [...folders, file]) for (const w of f.stem) if (!stem.includes(w)) stem.push(w);
  if (bassStroke) stem.splice(0, stem.length, ...stem.filter((w) => w !== "kick"));
  // a studio's own stroke named in the file (else the innermost folder) wins over the built-in words, and its
  // words say the stroke, not the instrument
  if (strokes?.length) {
    const levels = [tokens, ...folderTokens.slice().reverse()];
    for (let k = 0; k < levels.length; k++) {
      const hit = studioStrokeInTokens(levels[k]!, strokes, family);
      if (!hit) continue;
      articulation = hit.stroke.id;
      articulationFrom = k === 0 ? "file" : "folder";
      if (!family && hit.stroke.families.length === 1) {
        family = hit.stroke.families[0]!;
        familyFrom = k === 0 ? "file" : "folder";
      }
      const used = new Set(hit.at.map((i) => levels[k]![i]!));
      stem.splice(0, stem.length, ...stem.filter((w) => !used.has(w)));
      break;
    }
  }
  // "22in" says nothing more when a size "22x18" is already there
  for (let i = stem.length - 1; i >= 0; i--) {
    const inch = /^(\d+(?:\.\d+)?)in$/.exec(stem[i]!);
    if (inch && stem.some((w) => w.startsWith(`${inch[1]}x`))) stem.splice(i, 1);
  }

  return { tokens, folderTokens, family, familyFrom, articulation, articulationFrom, stem, velocity, roundRobin, mic: micPos, counter };
}

/** Largest counter value read as a round robin in a series (see the top comment). */
export const MAX_SERIES_ROUND_ROBIN = 32;

/** True when counter values make a round-robin series: distinct, from 0 or 1, small, at most one in four missing. */
export function isRoundRobinSeries(values: readonly number[]): boolean {
  if (values.length < 2 || new Set(values).size !== values.length) return false;
  const lo = Math.min(...values), hi = Math.max(...values);
  return lo <= 1 && hi <= MAX_SERIES_ROUND_ROBIN && hi - lo + 1 - values.length <= Math.floor(values.length / 4);
}

/**
 * Parses the paths of a whole library (or any set of them), in order. Each is read as parseName() reads it; then
 * counters (take numbers, ids such as s139) are kept as round robins only where the folder shows a series: files
 * of one folder whose names differ only by the counter (see the top comment).
 */
export function parseNames(paths: readonly string[], strokes?: StrokeList | null): NameInfo[] {
  const infos = paths.map((p) => parseName(p, strokes));
  const groups = new Map<string, number[]>();
  infos.forEach((n, i) => {
    const c = n.counter;
    if (!c || c.rrWord) return;
    const folder = paths[i]!.split(/[\\/]+/).filter((x) => x.length > 0 && x !== ".").slice(0, -1).join("/");
    const shape = n.tokens.map((t, k) => (k === c.at ? "#" : t)).join(" ");
    const key = `${folder}\u0000${c.kind}\u0000${shape}`;
    const g = groups.get(key) ?? [];
    g.push(i);
    groups.set(key, g);
  });
  const out = infos.slice();
  for (const members of groups.values()) {
    const series = isRoundRobinSeries(members.map((i) => infos[i]!.counter!.value));
    for (const i of members) {
      const n = infos[i]!, c = n.counter!;
      if (series && n.roundRobin === null) out[i] = { ...n, roundRobin: c.value };
      else if (!series && c.kind === "take" && n.roundRobin === c.value) out[i] = { ...n, roundRobin: null };
    }
  }
  return out;
}
