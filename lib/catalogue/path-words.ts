// Words of a sample's path, for the samples table's search. A library of 100,000 files cannot be searched
// with "path contains" fast enough (every path is read), so each sample's path is cut into words once, when it
// is recorded, and the words go into an index; a search then reads only the index entries that start with what
// was typed.
//
// How a path is cut (names in drum libraries glue words with _ - . spaces, letter/digit changes and
// camelCase: "SnareTop_Rim_v3-rr2.wav"):
//  - case and accents are folded: NFKD, combining marks dropped, lower case ("Frisée" -> "frisee");
//  - a run is a stretch of letters and digits between any other characters ("snaretop", "rim", "v3", "rr2", "wav");
//  - every run is a word, and so is every part of it where letters meet digits or a lower-case letter meets an
//    upper-case one ("snaretop" -> "snare", "top"; "v3" -> "v", "3"; "OHmic" -> "oh", "mic").
// A search term matches a sample when each of its runs is the start of one of the sample's words, so "snare",
// "sna", "top", "rr2", "snaretop", "snare_top" and "rim v3" all find the file above.
export const WORD_MAX = 40; // characters kept of a word (and of a search run); longer words match on their start
export const WORDS_MAX = 64; // words kept per path (a 1,000-character path does not make 500 index rows)
export const SEARCH_RUNS_MAX = 8; // words of a search term used (each is one more index read per candidate)

const RUN = /[\p{L}\p{N}]+/gu;
// a boundary inside a run: letter|digit, digit|letter, lower|Upper, and UPPER|Upperlower ("OHMic" -> OH|Mic)
// (letters without case, as in kana or CJK, stay together)
const PART = /\p{Lu}+(?=\p{Lu}\p{Ll})|\p{Lu}?\p{Ll}+|\p{Lu}+|\p{N}+|[^\p{Lu}\p{Ll}\p{N}]+/gu;

/** NFKD with the combining marks dropped ("Frisée" -> "Frisee"); case is kept for the camelCase parts. */
const stripMarks = (s: string) => s.normalize("NFKD").replace(/\p{M}+/gu, "");

/** Case- and accent-folded text (marks dropped, lower case): both sides of every comparison. */
export function foldText(s: string): string {
  return stripMarks(s).toLowerCase();
}

function runsOf(s: string): string[] {
  // accents are dropped before the runs are found, so "é" does not split a word in two
  return stripMarks(s).match(RUN) ?? [];
}

/** The distinct words of a path, in order of first appearance, at most WORDS_MAX, each at most WORD_MAX long. */
export function pathWords(path: string): string[] {
  const out = new Set<string>();
  const add = (w: string) => {
    if (out.size < WORDS_MAX && w) out.add(w.toLowerCase().slice(0, WORD_MAX));
  };
  for (const run of runsOf(path)) {
    add(run);
    const parts = run.match(PART) ?? [];
    if (parts.length > 1) for (const p of parts) add(p);
    if (out.size >= WORDS_MAX) break;
  }
  return [...out];
}

/**
 * The runs of a search term, folded, each cut to WORD_MAX, the first SEARCH_RUNS_MAX distinct ones; empty when
 * the term has no letters or digits.
 */
export function searchRuns(term: string): string[] {
  return [...new Set(runsOf(term).map((r) => r.toLowerCase().slice(0, WORD_MAX)))].slice(0, SEARCH_RUNS_MAX);
}
