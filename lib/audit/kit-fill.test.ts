// Kit filling: unique slot names and the instruments a slot is offered. Kitwright's own rules (kit-fill.ts);
// numbered toms and cymbals are common practice for drum kits, no published source.
import { describe, expect, it } from "vitest";
import { choicesForSlot, slotNameKey, uniqueSlotNames, withUniqueNames } from "./kit-fill";
import { buildDefaultKit } from "./kits";
import { getTemplate } from "./templates";
import { testCatalogue } from "./test-catalogue";
import type { CatalogueInstrument } from "./types";

describe("uniqueSlotNames", () => {
  it("numbers every slot of a name that occurs twice, in kit order", () => {
    expect(uniqueSlotNames(["Kick", "Snare", "Kick"])).toEqual(["Kick 1", "Snare", "Kick 2"]);
    expect(uniqueSlotNames(["Tom", "Tom", "Tom"])).toEqual(["Tom 1", "Tom 2", "Tom 3"]);
  });

  it("treats case and runs of spaces as the same name, numbering from the first spelling", () => {
    expect(uniqueSlotNames(["Hi-hat", "Ride", "Hi-Hat"])).toEqual(["Hi-hat 1", "Ride", "Hi-hat 2"]);
    expect(uniqueSlotNames(["Snare  A ", "snare a"])).toEqual(["Snare A 1", "Snare A 2"]);
    expect(slotNameKey(" Floor  TOM ")).toBe("floor tom");
  });

  it("skips a number another slot already carries", () => {
    expect(uniqueSlotNames(["Tom", "Tom 2", "tom"])).toEqual(["Tom 1", "Tom 2", "Tom 3"]);
    expect(uniqueSlotNames(["Crash 1", "Crash", "Crash"])).toEqual(["Crash 1", "Crash 2", "Crash 3"]);
  });

  it("keeps names that do not clash exactly as given", () => {
    const names = ["Kick", "Snare A", "Snare B", "Tom 1", "Tom 2", "Hi-hat"];
    expect(uniqueSlotNames(names)).toEqual(names);
    const slots = names.map((name, i) => ({ id: `s${i}`, name }));
    expect(withUniqueNames(slots)[0]).toBe(slots[0]);
  });

  it("never leaves two equal names, whatever the input", () => {
    const names = ["a", "A", "a 1", "A 2", "a", "b", "B 1", "b"];
    const out = uniqueSlotNames(names);
    expect(new Set(out.map(slotNameKey)).size).toBe(out.length);
    expect(out).toEqual(["a 3", "a 4", "a 1", "A 2", "a 5", "b 2", "B 1", "b 3"]);
  });
});

describe("buildDefaultKit names", () => {
  it("numbers an instrument named like a slot instead of repeating the name", () => {
    // the extra kick and hat have nothing recorded, so the richer ones of the catalogue take the template's slots
    const cat = testCatalogue();
    const extra: CatalogueInstrument[] = [
      { id: "kick-2", name: "Kick", family: "kick", articulations: [] },
      { id: "hat-2", name: "Hi-Hat", family: "hi-hat", articulations: [] },
    ];
    const kit = buildDefaultKit(getTemplate("grid-24")!, [...cat, ...extra]);
    const names = kit.slots.map((s) => s.name);
    expect(new Set(names.map(slotNameKey)).size).toBe(names.length);
    expect(kit.slots.find((s) => s.id === "kick")!.name).toBe("Kick 1");
    expect(kit.slots.find((s) => s.instrumentId === "kick-2")!.name).toBe("Kick 2");
    expect(kit.slots.find((s) => s.id === "hi-hat")!.name).toBe("Hi-hat 1");
    expect(kit.slots.find((s) => s.instrumentId === "hat-2")!.name).toBe("Hi-hat 2");
  });
});

describe("choicesForSlot", () => {
  const inst = (id: string, family: CatalogueInstrument["family"], libraryId: string, pitchHz: number | null = null) => ({ id, name: id, family, libraryId, pitchHz });
  const all = [
    inst("Snare brass", "snare", "lib-a"), inst("Kick 22", "kick", "lib-a"), inst("Tom low", "tom", "lib-a", 98),
    inst("Tom high", "tom", "lib-a", 196), inst("Tom mid", "tom", "lib-b", 147), inst("Tom unpitched", "tom", "lib-a"),
    inst("Snare maple", "snare", "lib-b"), inst("Crash 18", "crash", "lib-b"),
  ];

  it("offers the expected family first, the others family by family", () => {
    const c = choicesForSlot("snare", all);
    expect(c.expected.map((i) => i.id)).toEqual(["Snare brass", "Snare maple"]);
    expect(c.others.map((g) => g.family)).toEqual(["kick", "tom", "crash"]);
  });

  it("orders toms high to low by measured pitch, unpitched last", () => {
    expect(choicesForSlot("tom", all).expected.map((i) => i.id)).toEqual(["Tom high", "Tom mid", "Tom low", "Tom unpitched"]);
  });

  it("offers only the chosen library's instruments", () => {
    const c = choicesForSlot("tom", all, "lib-b");
    expect(c.expected.map((i) => i.id)).toEqual(["Tom mid"]);
    expect(c.others.flatMap((g) => g.instruments.map((i) => i.id))).toEqual(["Snare maple", "Crash 18"]);
    expect(choicesForSlot("ride", all, "lib-a").expected).toEqual([]);
  });
});
