"use client";
// Web MIDI input for the browser: asks for access (navigator.requestMIDIAccess, no SysEx), listens to every
// input, and turns MIDI 1.0 channel messages into small events (note on/off with velocity, control change).
// States are explicit so pages can say what is wrong: unsupported browser, permission refused, no device.
import { useCallback, useEffect, useRef, useState } from "react";

export type MidiStatus = "idle" | "unsupported" | "requesting" | "denied" | "no-device" | "ready";

export interface MidiEvent {
  kind: "note-on" | "note-off" | "cc";
  /** 1-16 */
  channel: number;
  note?: number;
  velocity?: number;
  controller?: number;
  value?: number;
  input: string;
  at: number;
}

/** MIDI 1.0: status 0x9n note on (velocity 0 = note off), 0x8n note off, 0xBn control change; n = channel - 1. */
export function parseMidiMessage(data: ArrayLike<number>, input = "", at = Date.now()): MidiEvent | null {
  if (!data || data.length < 3) return null;
  const status = data[0]! & 0xf0;
  const channel = (data[0]! & 0x0f) + 1;
  const a = data[1]! & 0x7f;
  const b = data[2]! & 0x7f;
  if (status === 0x90) return { kind: b === 0 ? "note-off" : "note-on", channel, note: a, velocity: b, input, at };
  if (status === 0x80) return { kind: "note-off", channel, note: a, velocity: b, input, at };
  if (status === 0xb0) return { kind: "cc", channel, controller: a, value: b, input, at };
  return null;
}

interface InputLike { id?: string; name?: string | null; onmidimessage: ((e: { data: Uint8Array | null }) => void) | null }
interface AccessLike { inputs: Map<string, InputLike> | { values(): IterableIterator<InputLike>; size?: number }; onstatechange: (() => void) | null }

export function useMidi(onEvent: (e: MidiEvent) => void) {
  const [status, setStatus] = useState<MidiStatus>("idle");
  const [message, setMessage] = useState<string>("");
  const [inputs, setInputs] = useState<string[]>([]);
  const handler = useRef(onEvent);
  handler.current = onEvent;
  const access = useRef<AccessLike | null>(null);

  const attach = useCallback(() => {
    const acc = access.current;
    if (!acc) return;
    const list = [...acc.inputs.values()];
    for (const input of list) {
      const name = input.name ?? input.id ?? "MIDI input";
      input.onmidimessage = (e) => {
        const ev = e.data ? parseMidiMessage(e.data, name) : null;
        if (ev) handler.current(ev);
      };
    }
    setInputs(list.map((i) => i.name ?? i.id ?? "MIDI input"));
    setStatus(list.length ? "ready" : "no-device");
  }, []);

  const connect = useCallback(async () => {
    const nav = navigator as Navigator & { requestMIDIAccess?: (o?: { sysex?: boolean }) => Promise<unknown> };
    if (typeof nav.requestMIDIAccess !== "function") {
      setStatus("unsupported");
      setMessage("This browser has no Web MIDI. Use a Chromium-based browser, or type notes in by hand.");
      return;
    }
    setStatus("requesting");
    try {
      const acc = (await nav.requestMIDIAccess({ sysex: false })) as AccessLike;
      access.current = acc;
      acc.onstatechange = () => attach();
      attach();
      setMessage("");
    } catch (e) {
      setStatus("denied");
      setMessage(`MIDI access was refused (${(e as Error)?.message || "no reason given"}). Allow MIDI for this site in the browser's site settings and try again.`);
    }
  }, [attach]);

  useEffect(() => () => {
    const acc = access.current;
    if (acc) {
      acc.onstatechange = null;
      for (const i of acc.inputs.values()) i.onmidimessage = null;
    }
  }, []);

  return { status, message, inputs, connect };
}
