"use client";
// Connect button, connection state in words and an icon, and the live monitor of incoming notes and controllers.
import type { MidiEvent, MidiStatus } from "./use-midi";
import { noteName, type MiddleC } from "./note-name";

const STATUS_TEXT: Record<MidiStatus, string> = {
  idle: "Not connected",
  unsupported: "No Web MIDI in this browser",
  requesting: "Asking the browser for MIDI access…",
  denied: "MIDI access refused",
  "no-device": "No MIDI input found: plug in the controller (it is picked up as soon as it appears)",
  ready: "Listening",
};

export function MidiStatusLine({ status, message, inputs, onConnect }: { status: MidiStatus; message: string; inputs: string[]; onConnect: () => void }) {
  const ok = status === "ready";
  const bad = status === "denied" || status === "unsupported" || status === "no-device";
  return (
    <div className="space-y-2" data-testid="midi-status" data-state={status}>
      <div className="flex flex-wrap items-center gap-3">
        {status !== "ready" && (
          <button type="button" className="btn-quiet" onClick={onConnect} disabled={status === "requesting"}>
            Connect MIDI controller
          </button>
        )}
        <span className={`inline-flex items-center gap-1.5 text-sm ${ok ? "text-good" : bad ? "text-bad" : "text-muted"}`}>
          <span aria-hidden className="font-mono">{ok ? "●" : bad ? "✕" : "○"}</span>
          {STATUS_TEXT[status]}
          {ok && inputs.length > 0 && <span className="text-muted">: {inputs.join(", ")}</span>}
        </span>
      </div>
      {message && <p role="alert" className="rounded-md border border-bad/30 bg-bad-soft px-3 py-2 text-sm text-bad">{message}</p>}
    </div>
  );
}

export function MidiMonitor({ events, middleC }: { events: MidiEvent[]; middleC: MiddleC }) {
  return (
    <div>
      <h3 className="text-sm font-semibold">Live monitor</h3>
      {events.length === 0 ? (
        <p className="mt-1 text-xs text-muted">Nothing received yet. Hit a pad or move the pedal.</p>
      ) : (
        <ol className="num mt-1 max-h-48 overflow-y-auto text-xs" data-testid="midi-monitor" aria-live="polite" tabIndex={0} aria-label="MIDI messages received">
          {events.map((e, i) => (
            <li key={`${e.at}-${i}`} className="border-t border-line py-0.5">
              {e.kind === "cc" ? (
                <>CC {e.controller} = {e.value} · ch {e.channel}</>
              ) : (
                <>{e.kind === "note-on" ? "note on " : "note off"} {e.note} ({noteName(e.note!, middleC)}) vel {e.velocity} · ch {e.channel}</>
              )}
            </li>
          ))}
        </ol>
      )}
    </div>
  );
}
