// Held-out floors of the sound model on the open corpus of real recordings (Debian's fluid-soundfont-gm kits,
// labelled by the General MIDI Level 1 percussion key map; npm run corpus). A regression of the features, the
// measurement or the training fails here. The check runs the committed model's own setting (FOREST, corpus and
// generator rows: since the sorted-sweep split search a cross-validation takes seconds, not minutes); its floors
// sit a little below what that setting reaches (scripts/sound-model/README.md).

import { describe, expect, it } from "vitest";
import { readCorpus } from "../corpus/corpus";
import { ARTICULATION_KEYS, outOfFoldCalibration, report } from "./evaluate";
import { crossValidated, FOREST, loadRows } from "./run";

const corpus = readCorpus();
const inCi = process.env.CI === "true";

describe("sound model on held-out real recordings (grouped 5-fold cross-validation, names hidden)", () => {
  if (!corpus && inCi) {
    it("needs the corpus (npm run corpus runs before the tests)", () => {
      throw new Error("no corpus: the test command must run npm run corpus first");
    });
    return;
  }
  it.skipIf(!corpus)("family and articulation accuracy stay above their floors; confidence is not overstated", () => {
    const rows = loadRows({ generator: true });
    const cv = crossValidated(rows, 5, FOREST);
    const r = report(cv.corpus, (p) => ARTICULATION_KEYS.has(p.row.key ?? 0));
    const sure = cv.corpus.filter((p) => p.familyShare > 0.8);
    const sureRight = sure.filter((p) => p.family === p.row.family).length / sure.length;
    console.log(`held-out corpus, the committed setting (${FOREST.trees} trees, generator rows too): family ${(100 * r.familyAccuracy).toFixed(1)} %, articulation ${(100 * r.articulationAccuracy).toFixed(1)} %, right when the vote share is over 0.8: ${(100 * sureRight).toFixed(1)} % of ${sure.length}`);
    expect(r.n).toBeGreaterThanOrEqual(140);
    expect(r.familyAccuracy).toBeGreaterThanOrEqual(FAMILY_FLOOR);
    expect(r.articulationAccuracy).toBeGreaterThanOrEqual(ARTICULATION_FLOOR);
    // of the predictions the forest is most sure of (vote share over 0.8), most are right
    expect(sureRight).toBeGreaterThanOrEqual(SURE_FLOOR);
    // the confidence the app shows, checked out of fold, is within 10 points of how often it is right (the
    // issue's target), as the file-weighted mean gap (expected calibration error). The largest gap in a single bin
    // is printed, not asserted: with 145 files a bin of 10-25 files moves 5 to 35 points from one forest seed to
    // the next whatever the calibration method (table, Platt scaling; README), so it cannot tell a regression
    // from chance.
    const cal = outOfFoldCalibration(cv.corpus, [...cv.corpus, ...cv.generator]);
    console.log(`confidence shown vs right, out of fold: expected calibration error ${(100 * cal.ece).toFixed(1)} %, largest gap ${(100 * cal.worstGap).toFixed(1)} %`);
    expect(cal.ece).toBeLessThanOrEqual(CALIBRATION_GAP);
  }, 900_000);
});

// This setting (120 trees, features drawn per node, the training varieties in, their hi-hats with a broadband rush,
// ten electronic toms per variety seed, the corpus's recordings weighted alike: run.ts trainingRows) reached family
// 87.6 %, articulation 78.6 % (33 of 42), 100 % right over a 0.8 vote share (66 of 66) on 2026-12-03 (model version
// 2026-12-03-977fb680, RESULTS.md; over forest seeds 7-12 it averages 86.1 % / 79.4 %). Before the weights and the
// extra electronic toms it reached 86.2 %, 81.0 % and 62 of 62 (seeds 7-12: 84.8 % / 79.8 %) and was checked
// against 84 %, 78 % and 95 %. Without the rush: 83.4 %, 73.8 % and 60 of 60 (seeds 7-12: 85.2 % / 75.4 %), checked
// against 81 %, 73 % and 95 %. With 60 trees: 82.1 %, 76.2 %, 63 of 63, checked against 79 %, 73 %, 95 %. The
// setting before that (features per tree, no varieties) reached 80.7 %, 69.0 % and 61 of 61, and was checked against
// 78 %, 66 % and 95 %; before that, a cheaper one (20 trees, no generator rows) against 74 %, 60 % and 90 %.
const FAMILY_FLOOR = 0.86;
const ARTICULATION_FLOOR = 0.78;
const SURE_FLOOR = 0.95;
// Out of fold, the confidence shown was off by 4.6 % on average (ECE; before the recording weights 7.4 %, without the
// hi-hats' rush 4.2 %, with 60 trees 7.5 %, scripts/sound-model/README.md); the issue asks for 10 points at most.
const CALIBRATION_GAP = 0.1;
