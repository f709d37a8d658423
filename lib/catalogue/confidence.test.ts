// A confidence in words: whole percent with a no-break space before "%" (SI Brochure, 9th edition, 5.4.7: "a space
// separates the number and the symbol %"; ISO 80000-1 the same).
import { describe, expect, it } from "vitest";
import { formatConfidence, soundUnsure } from "./confidence";

describe("formatConfidence", () => {
  it("writes fractions as whole percentages", () => {
    expect(formatConfidence(0.29)).toBe("29\u00a0%");
    expect(formatConfidence(0.7)).toBe("70\u00a0%");
    expect(formatConfidence(1)).toBe("100\u00a0%");
    expect(formatConfidence(0)).toBe("0\u00a0%");
    // rounding half up, as Math.round does for positive numbers
    expect(formatConfidence(0.125)).toBe("13\u00a0%");
    expect(formatConfidence(0.994)).toBe("99\u00a0%");
  });
  it("clamps to 0-100 % and answers a dash when there is no number", () => {
    expect(formatConfidence(1.2)).toBe("100\u00a0%");
    expect(formatConfidence(-0.1)).toBe("0\u00a0%");
    expect(formatConfidence(null)).toBe("–");
    expect(formatConfidence(Number.NaN)).toBe("–");
  });
});

describe("soundUnsure: a label only the sound gave, under 60 % (listed for review)", () => {
  it("is unsure under 0.6 from the sound alone, never for a name's or a person's label", () => {
    expect(soundUnsure("sound", 0.59)).toBe(true);
    expect(soundUnsure("sound", 0.6)).toBe(false);
    expect(soundUnsure("name", 0.2)).toBe(false);
    expect(soundUnsure("person", 0.2)).toBe(false);
    expect(soundUnsure("sound", null)).toBe(false);
  });
});
