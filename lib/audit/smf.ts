// Standard MIDI File 1.0 writer for auditioning an audit in any DAW: format 1, a tempo track
// (FF 51 tempo) and one note track that plays every sounding pad at the middle velocity of every layer,
// one note per beat, each preceded by a marker (FF 06) naming the pad and the layer.

import type { AuditResult, PadFinding } from "./types";

/** Encode a variable-length quantity (SMF 1.0): 7 bits per byte, most significant first, bit 7 set on all but the last. */
export function encodeVlq(value: number): number[] {
  if (!Number.isInteger(value) || value < 0 || value > 0x0fffffff) throw new RangeError(`VLQ out of range: ${value}`);
  const bytes = [value & 0x7f];
  let v = value >>> 7;
  while (v > 0) {
    bytes.unshift((v & 0x7f) | 0x80);
    v >>>= 7;
  }
  return bytes;
}

/** Decode a variable-length quantity starting at `offset`; returns the value and the bytes read. */
export function decodeVlq(bytes: ArrayLike<number>, offset = 0): { value: number; length: number } {
  let value = 0;
  for (let i = 0; i < 4; i++) {
    const b = bytes[offset + i];
    if (b === undefined) throw new RangeError("VLQ runs past the end");
    value = (value << 7) | (b & 0x7f);
    if (!(b & 0x80)) return { value, length: i + 1 };
  }
  throw new RangeError("VLQ longer than 4 bytes");
}

/** The three tempo bytes of FF 51 03: microseconds per quarter note, big-endian (not a VLQ). */
export function tempoBytes(bpm: number): [number, number, number] {
  const us = Math.round(60_000_000 / bpm);
  if (!(us > 0 && us <= 0xffffff)) throw new RangeError(`tempo out of range: ${bpm} bpm`);
  return [(us >> 16) & 0xff, (us >> 8) & 0xff, us & 0xff];
}

export interface SmfEvent {
  /** Absolute time in ticks. */
  tick: number;
  /** Raw event bytes without the delta time (status byte included; running status is not used). */
  data: number[];
}

function textBytes(s: string): number[] {
  return [...new TextEncoder().encode(s)];
}

function metaEvent(type: number, payload: number[]): number[] {
  return [0xff, type, ...encodeVlq(payload.length), ...payload];
}

function chunk(id: string, body: number[]): number[] {
  const n = body.length;
  return [...textBytes(id), (n >>> 24) & 0xff, (n >>> 16) & 0xff, (n >>> 8) & 0xff, n & 0xff, ...body];
}

/** Serialise one track: events sorted by tick (stable), delta times as VLQs, end of track appended. */
export function trackBytes(events: SmfEvent[]): number[] {
  const sorted = events.map((e, i) => ({ e, i })).sort((a, b) => a.e.tick - b.e.tick || a.i - b.i);
  const out: number[] = [];
  let last = 0;
  for (const { e } of sorted) {
    out.push(...encodeVlq(e.tick - last), ...e.data);
    last = e.tick;
  }
  out.push(0x00, 0xff, 0x2f, 0x00);
  return out;
}

/** A format 1 file from tracks of events; division = ticks per quarter note (bit 15 clear). */
export function writeSmf(tracks: SmfEvent[][], division = 480): Uint8Array {
  if (!Number.isInteger(division) || division < 1 || division > 0x7fff) throw new RangeError(`division out of range: ${division}`);
  const header = chunk("MThd", [0x00, 0x01, (tracks.length >> 8) & 0xff, tracks.length & 0xff, (division >> 8) & 0xff, division & 0xff]);
  const body = tracks.flatMap((t) => chunk("MTrk", trackBytes(t)));
  return Uint8Array.from([...header, ...body]);
}

export interface AuditionOptions {
  /** MIDI channel 1-16 of every note; 10 (General MIDI percussion) by default. */
  channel?: number;
  bpm?: number;
  division?: number;
  /** Note length as a fraction of a beat (default 0.5). */
  gate?: number;
}

export interface AuditionNote {
  padId: string;
  marker: string;
  note: number;
  velocity: number;
  tick: number;
}

/** Middle velocity of a layer: floor((low + high) / 2), kept inside 1-127. */
export function middleVelocity(low: number, high: number): number {
  return Math.min(127, Math.max(1, Math.floor((low + high) / 2)));
}

/** The notes of the audition file, in order: every sounding pad (and the pedal chick), every layer, one per beat. */
export function auditionNotes(result: AuditResult, division = 480): AuditionNote[] {
  const out: AuditionNote[] = [];
  const pads: PadFinding[] = [...result.pads, ...(result.pedal?.chick ? [result.pedal.chick] : [])];
  let beat = 0;
  for (const p of pads) {
    if (p.outcome === "silent" || p.note < 0 || p.note > 127) continue;
    p.layers.forEach((l, i) => {
      out.push({
        padId: p.padId,
        marker: `${p.label} - layer ${i + 1}/${p.layers.length}`,
        note: p.note,
        velocity: middleVelocity(l.velocityLow, l.velocityHigh),
        tick: beat * division,
      });
      beat++;
    });
  }
  return out;
}

/** The audition file of an audit (format 1: tempo track, then the note track). */
export function auditToSmf(result: AuditResult, options: AuditionOptions = {}): Uint8Array {
  const channel = options.channel ?? 10;
  if (!Number.isInteger(channel) || channel < 1 || channel > 16) throw new RangeError(`channel out of range: ${channel}`);
  const division = options.division ?? 480;
  const bpm = options.bpm ?? 120;
  const gate = Math.max(1, Math.round(division * (options.gate ?? 0.5)));
  const ch = channel - 1;
  const tempoTrack: SmfEvent[] = [
    { tick: 0, data: metaEvent(0x03, textBytes(`Kitwright audition: ${result.layoutName} / ${result.kitName}`)) },
    { tick: 0, data: metaEvent(0x58, [4, 2, 24, 8]) },
    { tick: 0, data: metaEvent(0x51, tempoBytes(bpm)) },
  ];
  const noteTrack: SmfEvent[] = [{ tick: 0, data: metaEvent(0x03, textBytes("Pads")) }];
  for (const n of auditionNotes(result, division)) {
    noteTrack.push({ tick: n.tick, data: metaEvent(0x06, textBytes(n.marker)) });
    noteTrack.push({ tick: n.tick, data: [0x90 | ch, n.note, n.velocity] });
    noteTrack.push({ tick: n.tick + gate, data: [0x80 | ch, n.note, 0x40] });
  }
  return writeSmf([tempoTrack, noteTrack], division);
}
