// Every colour token of app/globals.css has a light and a dark value, and the pairs the interface draws text
// with keep enough contrast in both themes. Contrast ratio and relative luminance as defined by WCAG 2.2
// (W3C Recommendation, "contrast ratio" and "relative luminance" in the glossary; success criteria 1.4.3 for
// text, 4.5:1, and 1.4.11 for graphical objects, 3:1).
import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";

const css = fs.readFileSync(path.resolve(import.meta.dirname, "../../app/globals.css"), "utf8");

function block(selector: RegExp): Record<string, string> {
  const m = css.match(selector);
  if (!m) throw new Error(`no block ${selector}`);
  const out: Record<string, string> = {};
  for (const d of m[1].matchAll(/--color-([a-z0-9-]+):\s*(#[0-9a-f]{6})\s*;/gi)) out[d[1]] = d[2].toLowerCase();
  return out;
}
const light = block(/@theme\s*{([^}]*)}/);
const dark = block(/:root\[data-theme="dark"\]\s*{([^}]*)}/);

function luminance(hex: string): number {
  const c = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255).map((v) => (v <= 0.04045 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4));
  return 0.2126 * c[0] + 0.7152 * c[1] + 0.0722 * c[2];
}
export function contrast(a: string, b: string): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

describe("colour tokens", () => {
  it("computes contrast as WCAG does (black on white 21:1; #767676 on white just passes 4.5:1, #777777 just fails — WebAIM's widely quoted greys)", () => {
    expect(contrast("#000000", "#ffffff")).toBeCloseTo(21, 5);
    expect(contrast("#767676", "#ffffff")).toBeGreaterThanOrEqual(4.5);
    expect(contrast("#777777", "#ffffff")).toBeLessThan(4.5);
  });

  it("has a dark value for every light token and no dark-only token", () => {
    expect(Object.keys(light).length).toBeGreaterThan(20);
    expect(Object.keys(dark).sort()).toEqual(Object.keys(light).sort());
  });

  const text = ["ink", "muted", "brand", "warn", "bad", "good"];
  const grounds = ["paper", "card", "field"];
  for (const [name, t] of [["light", light], ["dark", dark]] as const) {
    it(`${name}: text colours reach 4.5:1 on every background they are drawn on`, () => {
      const low: string[] = [];
      const check = (fg: string, bg: string, min: number) => {
        const r = contrast(t[fg], t[bg]);
        if (r < min) low.push(`${fg} on ${bg}: ${r.toFixed(2)}`);
      };
      for (const fg of text) for (const bg of grounds) check(fg, bg, 4.5);
      for (const k of ["brand", "warn", "bad", "good"]) check(k, `${k}-soft`, 4.5);
      check("ink", "brand-soft", 4.5);
      check("on-brand", "brand", 4.5);
      check("on-brand", "brand-strong", 4.5);
      expect(low).toEqual([]);
    });
    it(`${name}: plot colours and the field border reach 3:1 on a card`, () => {
      const low = Object.keys(t).filter((k) => k.startsWith("chart-")).filter((k) => contrast(t[k], t.card) < 3);
      expect(low).toEqual([]);
      expect(contrast(t["line-strong"], t.field)).toBeGreaterThanOrEqual(3);
    });
  }
});
