import { describe, expect, it } from "vitest";
import { SEARCH_RUNS_MAX, WORDS_MAX, WORD_MAX, pathWords, searchRuns } from "./path-words";

// A sample matches a search when every run of the term starts one of its words (the rule in path-words.ts).
const matches = (path: string, term: string) => {
  const words = pathWords(path);
  const runs = searchRuns(term);
  return runs.length > 0 && runs.every((r) => words.some((w) => w.startsWith(r)));
};

describe("pathWords", () => {
  it("cuts at separators, letter/digit changes and camelCase, keeping whole runs too", () => {
    expect(pathWords("Snares/SnareTop_Rim_v3-rr2.wav")).toEqual(["snares", "snaretop", "snare", "top", "rim", "v3", "v", "3", "rr2", "rr", "2", "wav"]);
    expect(pathWords("OHMic Room 01.WAV")).toEqual(["ohmic", "oh", "mic", "room", "01", "wav"]);
  });

  it("folds accents by Unicode compatibility decomposition (UAX #15: é = e + U+0301) and case", () => {
    expect(pathWords("Caisse claire é/frisée ß 01.wav")).toEqual(["caisse", "claire", "e", "frisee", "ß", "01", "wav"]);
    expect(searchRuns("FRISÉE")).toEqual(["frisee"]);
    // full-width digits and letters are compatibility characters: NFKD maps them to ASCII
    expect(pathWords("ｋｉｃｋ１")).toEqual(["kick1", "kick", "1"]);
  });

  it("keeps non-Latin scripts as words", () => {
    // й is и + U+0306 under NFKD (UnicodeData.txt), so it folds like an accent, on both sides of the search
    expect(pathWords("Барабан/малый_01.wav")).toEqual(["барабан", "малыи", "01", "wav"]);
    expect(matches("Барабан/малый_01.wav", "МАЛЫЙ")).toBe(true);
    expect(pathWords("スネア_01.wav")).toEqual(["スネア", "01", "wav"]);
  });

  it("bounds the words of a hostile path", () => {
    const long = Array.from({ length: 400 }, (_, i) => `w${i}`).join("_") + "x".repeat(2000);
    const words = pathWords(long);
    expect(words.length).toBe(WORDS_MAX);
    expect(Math.max(...words.map((w) => w.length))).toBeLessThanOrEqual(WORD_MAX);
    expect(pathWords("___---...")).toEqual([]);
    expect(searchRuns("%_\\")).toEqual([]);
    // a term of 60 words uses its first 8 distinct ones (each word is a join or a check in the query)
    expect(searchRuns(Array.from({ length: 60 }, (_, i) => `w${i % 30}`).join(" "))).toEqual(Array.from({ length: SEARCH_RUNS_MAX }, (_, i) => `w${i}`));
  });

  it("finds what a person types: word starts, glued words, several words in any order", () => {
    const p = "Kit A/Snares/SnareTop_Rim_v3-rr2.wav";
    for (const t of ["snare", "sna", "top", "rr2", "RR", "snaretop", "snare_top", "rim v3", "v3 rim", "kit a", "wav"]) expect(matches(p, t), t).toBe(true);
    for (const t of ["nare", "rr3", "kick", "v4", "rim v4"]) expect(matches(p, t), t).toBe(false);
  });
});
