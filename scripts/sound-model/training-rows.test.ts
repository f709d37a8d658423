// The training rows' weights (run.ts trainingRows): each corpus recording enters training round(3 / its files)
// times, at least once, whatever its augmented copies; the generator's rows once each. Worked by hand.
import { describe, expect, it } from "vitest";
import type { Row } from "./dataset";
import { RECORDING_COPIES, trainingRows } from "./run";

function row(source: Row["source"], group: string, id: string, augmentation = ""): Row {
  return { id, source, group, augmentation, family: "tom", articulation: "centre", features: [1] } as unknown as Row;
}

describe("trainingRows", () => {
  it("weights the corpus's recordings alike, counting a recording's files, not its augmented copies", () => {
    expect(RECORDING_COPIES).toBe(3);
    const one = [row("corpus", "a", "a1.wav"), row("corpus", "a", "a1.wav#mono", "mono")];
    const two = [row("corpus", "b", "b1.wav"), row("corpus", "b", "b2.wav"), row("corpus", "b", "b2.wav#mono", "mono")];
    const six = Array.from({ length: 6 }, (_, i) => row("corpus", "c", `c${i}.wav`));
    const gen = [row("generator", "generator:x", "v1"), row("generator", "generator:x", "v2")];
    const out = trainingRows({ corpus: [...one, ...two, ...six], generator: gen });
    const count = (id: string) => out.filter((r) => r.id === id).length;
    // one file: round(3 / 1) = 3; two files: round(1.5) = 2; six files: round(0.5) = 0, at least 1
    expect([count("a1.wav"), count("a1.wav#mono")]).toEqual([3, 3]);
    expect([count("b1.wav"), count("b2.wav"), count("b2.wav#mono")]).toEqual([2, 2, 2]);
    expect(six.map((r) => count(r.id))).toEqual([1, 1, 1, 1, 1, 1]);
    expect([count("v1"), count("v2")]).toEqual([1, 1]);
    expect(out).toHaveLength(2 * 3 + 3 * 2 + 6 + 2);
  });
});
