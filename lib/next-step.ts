// The next step of a studio on the way library → samples → kit → layout → audit, decided from what the studio
// holds (pure: the server reads the counts, lib/server/next-step.ts; the pages show the answer). One answer per
// state, in a drummer's words, with the one action that moves the studio on.
import { whoCan } from "./permissions";

export interface StudioProgress {
  /**
   * Libraries by name; samples counts every stored sample, pending those still queued or measuring; sorting is
   * true while measured samples wait to be sorted into instruments (the regroup has not read them yet).
   */
  libraries: ReadonlyArray<{ id: string; name: string; samples: number; pending: number; instruments: number; sorting?: boolean }>;
  /** Kits, most recently changed first; filled = slots holding an instrument. */
  kits: ReadonlyArray<{ id: string; name: string; slots: number; filled: number }>;
  /** Layouts, most recently changed first, with how many audits each has. */
  layouts: ReadonlyArray<{ id: string; name: string; audits: number }>;
  /** The newest audit, if any. */
  latestAudit: { id: string; layoutName: string; kitName: string } | null;
}

export type StepKey = "library" | "samples" | "sorting" | "no-instruments" | "kit" | "fill-kit" | "layout" | "audit" | "done";

export type StepAction =
  | { kind: "link"; label: string; href: string }
  | { kind: "audit"; label: string; layoutId: string; kitId: string };

export interface NextStep {
  key: StepKey;
  /** 1..5 on the way library, samples, kit, layout, audit (sorting counts as samples); 6 when done. */
  number: number;
  title: string;
  text: string;
  /** null when the member may not take the step (a viewer), or when there is nothing to click. */
  action: StepAction | null;
}

export const STEP_NAMES = ["Library", "Samples", "Kit", "Layout", "Audit"] as const;

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

/**
 * The studio's next step. `base` is the studio's address (`/s/<id>`); `canWrite` whether the member may create
 * and edit (viewers get the same step, told who can take it, and no action).
 */
export function nextStep(p: StudioProgress, { base, canWrite }: { base: string; canWrite: boolean }): NextStep {
  const who = whoCan("studio:write");
  const act = (a: StepAction): StepAction | null => (canWrite ? a : null);
  if (p.libraries.length === 0) {
    return {
      key: "library", number: 1, title: "Create your first library",
      text: canWrite
        ? "A library holds one sample pack or recording session. Make one, then drop your WAV one-shots on it."
        : `This studio has no library yet: ${who} can create one.`,
      action: act({ kind: "link", label: "Create a library", href: `${base}/libraries#new-library` }),
    };
  }
  const instruments = p.libraries.reduce((s, l) => s + l.instruments, 0);
  const withSamples = p.libraries.filter((l) => l.samples > 0);
  if (instruments === 0 && withSamples.length === 0) {
    const lib = p.libraries[0]!;
    return {
      key: "samples", number: 2, title: `Add samples to “${lib.name}”`,
      text: canWrite
        ? "Drop a folder of WAV one-shots (or a zipped pack) on the library. Folder and file names help Kitwright sort them."
        : `No samples yet: ${who} can add them.`,
      action: act({ kind: "link", label: "Drop a folder of samples", href: `${base}/libraries/${lib.id}#add-samples` }),
    };
  }
  if (instruments === 0) {
    const pending = p.libraries.reduce((s, l) => s + l.pending, 0);
    const lib = [...withSamples].sort((a, b) => b.pending - a.pending || Number(!!b.sorting) - Number(!!a.sorting))[0]!;
    if (pending > 0 || lib.sorting) {
      return {
        key: "sorting", number: 2, title: "Measuring and sorting your samples",
        text: `${pending > 0 ? `${plural(pending, "sample")} still to measure.` : "Sorting them into instruments and velocity layers."} When they are sorted into instruments, the next step is a kit. You can watch them arrive.`,
        action: { kind: "link", label: `Watch “${lib.name}”`, href: `${base}/libraries/${lib.id}` },
      };
    }
    return {
      key: "no-instruments", number: 2, title: "No instruments yet",
      text: canWrite
        ? "None of the files could be sorted into a drum or cymbal (see why on the library's samples). Add WAV one-shots: one hit per file."
        : `None of the files could be sorted into a drum or cymbal yet: ${who} can add more.`,
      action: act({ kind: "link", label: "Add other samples", href: `${base}/libraries/${lib.id}#add-samples` }),
    };
  }
  if (p.kits.length === 0) {
    const lib = [...p.libraries].sort((a, b) => b.instruments - a.instruments)[0]!;
    return {
      key: "kit", number: 3, title: "Build a kit",
      text: canWrite
        ? `“${lib.name}” has ${plural(lib.instruments, "instrument")}. A kit names its slots (Kick, Snare, Tom 1…) and puts one instrument in each; Kitwright can fill one for you.`
        : `The studio's instruments are ready for a kit: ${who} can build one.`,
      action: act({ kind: "link", label: `Build a kit from “${lib.name}”`, href: `${base}/kits?library=${lib.id}#new-kit` }),
    };
  }
  if (p.kits.every((k) => k.filled === 0)) {
    const kit = p.kits[0]!;
    return {
      key: "fill-kit", number: 3, title: `Fill “${kit.name}”`,
      text: canWrite
        ? `Its ${plural(kit.slots, "slot")} hold no instrument yet, so every pad would stay silent. Choose an instrument for each slot.`
        : `Its slots hold no instrument yet: ${who} can fill them.`,
      action: act({ kind: "link", label: `Open “${kit.name}”`, href: `${base}/kits/${kit.id}` }),
    };
  }
  if (p.layouts.length === 0) {
    return {
      key: "layout", number: 4, title: "Add a layout",
      text: canWrite
        ? "A layout is your pad controller or trigger kit: which pad sends which MIDI note, and what it should play. Start from a template or a blank grid."
        : `No layout yet: ${who} can add one.`,
      action: act({ kind: "link", label: "Add a layout", href: `${base}/layouts#new-layout` }),
    };
  }
  const unaudited = p.layouts.find((l) => l.audits === 0);
  if (unaudited) {
    // the kit with the most filled slots (most recently changed first among equals)
    const kit = p.kits.reduce((best, k) => (k.filled > best.filled ? k : best), p.kits[0]!);
    return {
      key: "audit", number: 5, title: `Audit “${unaudited.name}”`,
      text: canWrite
        ? `Check every pad of “${unaudited.name}” against the kit “${kit.name}”: what plays, what plays a stand-in, what stays silent.`
        : `“${unaudited.name}” has never been audited: ${who} can run an audit.`,
      action: act({ kind: "audit", label: `Audit with “${kit.name}”`, layoutId: unaudited.id, kitId: kit.id }),
    };
  }
  const a = p.latestAudit;
  return {
    key: "done", number: 6, title: "Every layout has an audit",
    text: "Read the latest audit to see which pads play and which stay silent; after you change a kit or a layout, audit it again.",
    action: a ? { kind: "link", label: `Open the audit of “${a.layoutName}” with “${a.kitName}”`, href: `${base}/audits/${a.id}` } : null,
  };
}
