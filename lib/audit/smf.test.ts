import { describe, expect, it } from "vitest";
import { parseMidi } from "midi-file";
import { auditToSmf, auditionNotes, decodeVlq, encodeVlq, middleVelocity, tempoBytes, writeSmf } from "./smf";
import { runAudit } from "./audit";
import { buildDefaultKit } from "./kits";
import { getTemplate } from "./templates";
import { testCatalogue } from "./test-catalogue";

// Variable-length quantities: the table of the Standard MIDI File 1.0 specification.
const SMF_VLQ_TABLE: Array<[number, string]> = [
  [0x00, "00"],
  [0x40, "40"],
  [0x7f, "7F"],
  [0x80, "81 00"],
  [0x2000, "C0 00"],
  [0x3fff, "FF 7F"],
  [0x4000, "81 80 00"],
  [0x100000, "C0 80 00"],
  [0x1fffff, "FF FF 7F"],
  [0x200000, "81 80 80 00"],
  [0x8000000, "C0 80 80 00"],
  [0xfffffff, "FF FF FF 7F"],
];
const hex = (b: ArrayLike<number>) => Array.from(b, (x) => x.toString(16).toUpperCase().padStart(2, "0")).join(" ");

describe("variable-length quantities (SMF 1.0 spec table, all 12 rows)", () => {
  it.each(SMF_VLQ_TABLE)("0x%s encodes as %s and decodes back", (value, bytes) => {
    expect(hex(encodeVlq(value))).toBe(bytes);
    const parsed = bytes.split(" ").map((h) => parseInt(h, 16));
    expect(decodeVlq(parsed)).toEqual({ value, length: parsed.length });
  });
  it("refuses values beyond 0x0FFFFFFF and negatives", () => {
    expect(() => encodeVlq(0x10000000)).toThrow(RangeError);
    expect(() => encodeVlq(-1)).toThrow(RangeError);
  });
});

describe("tempo and header (SMF 1.0)", () => {
  it("120 bpm is 500000 us per quarter: bytes 07 A1 20 (Standard MIDI File 1.0 specification)", () => {
    expect(hex(tempoBytes(120))).toBe("07 A1 20");
    expect(hex(tempoBytes(60))).toBe("0F 42 40"); // 1 000 000 us (computed)
  });
  it("header chunk: MThd, length 6, format 1, track count, division with bit 15 clear", () => {
    const f = writeSmf([[], []], 480);
    expect(hex(f.slice(0, 14))).toBe("4D 54 68 64 00 00 00 06 00 01 00 02 01 E0");
    // an empty track is 'MTrk', length 4, then delta 0 + end of track FF 2F 00
    expect(hex(f.slice(14, 26))).toBe("4D 54 72 6B 00 00 00 04 00 FF 2F 00");
  });
});

describe("audition file of an audit, parsed back by a general-purpose parser (npm midi-file)", () => {
  const cat = testCatalogue();
  const layout = getTemplate("trigger-five")!;
  const audit = runAudit(layout, buildDefaultKit(layout, cat), cat);
  const bytes = auditToSmf(audit, { bpm: 120, division: 480 });
  const midi = parseMidi(bytes);

  it("format 1, two tracks, 480 ticks per beat, tempo 500000 us at tick 0", () => {
    expect(midi.header).toMatchObject({ format: 1, numTracks: 2, ticksPerBeat: 480 });
    const tempo = midi.tracks[0]!.find((e) => e.type === "setTempo") as { microsecondsPerBeat: number; deltaTime: number };
    expect(tempo).toMatchObject({ microsecondsPerBeat: 500000, deltaTime: 0 });
  });

  it("one note per beat, every layer's middle velocity, on channel 10, with a marker naming the pad", () => {
    let tick = 0;
    const notes: Array<{ tick: number; note: number; velocity: number; channel: number }> = [];
    const offs: number[] = [];
    const markers: Array<{ tick: number; text: string }> = [];
    for (const e of midi.tracks[1]!) {
      tick += e.deltaTime;
      if (e.type === "noteOn") notes.push({ tick, note: e.noteNumber, velocity: e.velocity, channel: e.channel });
      if (e.type === "noteOff") offs.push(tick);
      if (e.type === "marker") markers.push({ tick, text: e.text });
    }
    // expected, from the findings: every sounding pad (and the chick note), each of its layers
    const expected: Array<{ note: number; velocity: number; label: string }> = [];
    for (const p of [...audit.pads, audit.pedal!.chick!]) {
      if (p.outcome === "silent") continue;
      for (const l of p.layers) expected.push({ note: p.note, velocity: Math.floor((l.velocityLow + l.velocityHigh) / 2), label: p.label });
    }
    expect(expected.length).toBeGreaterThan(30);
    expect(notes.map((n) => [n.note, n.velocity])).toEqual(expected.map((e) => [e.note, e.velocity]));
    expect(notes.map((n) => n.tick)).toEqual(expected.map((_, i) => i * 480));
    expect(offs).toEqual(expected.map((_, i) => i * 480 + 240));
    expect(new Set(notes.map((n) => n.channel))).toEqual(new Set([9])); // channel 10 is 9 on the wire
    expect(markers.map((m) => m.tick)).toEqual(notes.map((n) => n.tick));
    markers.forEach((m, i) => expect(m.text.startsWith(expected[i]!.label)).toBe(true));
    // the kick has 4 even layers 1-31, 32-63, 64-95, 96-127: middles 16, 47, 79, 111
    expect(notes.slice(0, 4).map((n) => n.velocity)).toEqual([16, 47, 79, 111]);
    expect(markers[0]!.text).toBe("Kick - layer 1/4");
  });

  it("every track ends with FF 2F 00", () => {
    for (const t of midi.tracks) expect(t.at(-1)!.type).toBe("endOfTrack");
  });

  it("a channel option moves every note; silent pads are left out", () => {
    const gm = getTemplate("gm-percussion")!;
    const a = runAudit(gm, buildDefaultKit(gm, cat), cat);
    const m = parseMidi(auditToSmf(a, { channel: 1 }));
    const ons = m.tracks[1]!.filter((e) => e.type === "noteOn");
    expect(new Set(ons.map((e) => (e as { channel: number }).channel))).toEqual(new Set([0]));
    expect(ons).toHaveLength(auditionNotes(a).length);
    const silentNotes = a.pads.filter((p) => p.outcome === "silent").map((p) => p.note);
    for (const e of ons) expect(silentNotes).not.toContain((e as { noteNumber: number }).noteNumber);
    expect(() => auditToSmf(a, { channel: 17 })).toThrow(RangeError);
  });

  it("middle velocity stays inside 1-127", () => {
    expect(middleVelocity(1, 127)).toBe(64);
    expect(middleVelocity(0, 1)).toBe(1);
  });
});
