// The studio's next step, one case per state on the way library → samples → kit → layout → audit.
// Kitwright's own guidance (no published source): the order is the order the data depends on — a kit holds
// instruments sorted from samples of a library, an audit needs a layout and a kit.
import { describe, expect, it } from "vitest";
import { nextStep, type StudioProgress } from "./next-step";

const base = "/s/studio-1";
const empty: StudioProgress = { libraries: [], kits: [], layouts: [], latestAudit: null };
const lib = (over: Partial<StudioProgress["libraries"][number]> = {}) => ({ id: "lib-1", name: "Room kit", samples: 0, pending: 0, instruments: 0, ...over });
const kit = (over: Partial<StudioProgress["kits"][number]> = {}) => ({ id: "kit-1", name: "Studio kit", slots: 8, filled: 6, ...over });
const layout = (over: Partial<StudioProgress["layouts"][number]> = {}) => ({ id: "lay-1", name: "My pads", audits: 0, ...over });
const editor = { base, canWrite: true };
const viewer = { base, canWrite: false };

describe("nextStep", () => {
  it("an empty studio: create a library", () => {
    const s = nextStep(empty, editor);
    expect(s).toMatchObject({ key: "library", number: 1, title: "Create your first library" });
    expect(s.action).toEqual({ kind: "link", label: "Create a library", href: "/s/studio-1/libraries#new-library" });
  });

  it("a library without samples: drop a folder on it", () => {
    const s = nextStep({ ...empty, libraries: [lib()] }, editor);
    expect(s).toMatchObject({ key: "samples", number: 2, title: "Add samples to “Room kit”" });
    expect(s.action).toEqual({ kind: "link", label: "Drop a folder of samples", href: "/s/studio-1/libraries/lib-1#add-samples" });
  });

  it("samples still being measured and no instrument yet: watch the library that is working", () => {
    const s = nextStep({ ...empty, libraries: [lib({ id: "a", name: "Done", samples: 3 }), lib({ id: "b", name: "Busy", samples: 12, pending: 7 })] }, editor);
    expect(s.key).toBe("sorting");
    expect(s.text).toMatch(/^7 samples still to measure/);
    expect(s.action).toEqual({ kind: "link", label: "Watch “Busy”", href: "/s/studio-1/libraries/b" });
  });

  it("every sample measured but not yet sorted into instruments: still sorting, not a dead end", () => {
    const s = nextStep({ ...empty, libraries: [lib({ samples: 4 }), lib({ id: "lib-2", name: "Fresh", samples: 6, sorting: true })] }, editor);
    expect(s.key).toBe("sorting");
    expect(s.text).toMatch(/^Sorting them into instruments and velocity layers\./);
    expect(s.action).toEqual({ kind: "link", label: "Watch “Fresh”", href: "/s/studio-1/libraries/lib-2" });
  });

  it("every sample refused or unsorted: say so and offer to add others", () => {
    const s = nextStep({ ...empty, libraries: [lib({ samples: 4 })] }, editor);
    expect(s.key).toBe("no-instruments");
    expect(s.action).toMatchObject({ href: "/s/studio-1/libraries/lib-1#add-samples" });
  });

  it("instruments but no kit: build one from the library with the most instruments", () => {
    const s = nextStep({ ...empty, libraries: [lib({ id: "a", name: "Small", samples: 2, instruments: 1 }), lib({ id: "b", name: "Big", samples: 40, instruments: 9 })] }, editor);
    expect(s).toMatchObject({ key: "kit", number: 3 });
    expect(s.text).toContain("“Big” has 9 instruments");
    expect(s.action).toEqual({ kind: "link", label: "Build a kit from “Big”", href: "/s/studio-1/kits?library=b#new-kit" });
  });

  it("only empty kits: fill the newest", () => {
    const s = nextStep({ ...empty, libraries: [lib({ samples: 5, instruments: 2 })], kits: [kit({ id: "k2", name: "Blank", filled: 0, slots: 1 }), kit({ id: "k1", filled: 0 })] }, editor);
    expect(s.key).toBe("fill-kit");
    expect(s.text).toMatch(/^Its 1 slot hold/);
    expect(s.action).toEqual({ kind: "link", label: "Open “Blank”", href: "/s/studio-1/kits/k2" });
  });

  it("a filled kit and no layout: add a layout", () => {
    const s = nextStep({ ...empty, libraries: [lib({ samples: 5, instruments: 2 })], kits: [kit()] }, editor);
    expect(s).toMatchObject({ key: "layout", number: 4 });
    expect(s.action).toEqual({ kind: "link", label: "Add a layout", href: "/s/studio-1/layouts#new-layout" });
  });

  it("a layout never audited: audit it with the fullest kit", () => {
    const p: StudioProgress = {
      ...empty,
      libraries: [lib({ samples: 5, instruments: 2 })],
      kits: [kit({ id: "k-new", name: "Sketch", filled: 2 }), kit({ id: "k-full", name: "Full", filled: 7 }), kit({ id: "k-tie", name: "Tie", filled: 7 })],
      layouts: [layout({ id: "l1", name: "Audited", audits: 2 }), layout({ id: "l2", name: "Fresh pads" })],
      latestAudit: { id: "a1", layoutName: "Audited", kitName: "Full" },
    };
    const s = nextStep(p, editor);
    expect(s).toMatchObject({ key: "audit", number: 5, title: "Audit “Fresh pads”" });
    expect(s.action).toEqual({ kind: "audit", label: "Audit with “Full”", layoutId: "l2", kitId: "k-full" });
  });

  it("every layout audited: open the newest audit", () => {
    const s = nextStep({ ...empty, libraries: [lib({ samples: 5, instruments: 2 })], kits: [kit()], layouts: [layout({ audits: 1 })], latestAudit: { id: "a9", layoutName: "My pads", kitName: "Studio kit" } }, editor);
    expect(s).toMatchObject({ key: "done", number: 6 });
    expect(s.action).toEqual({ kind: "link", label: "Open the audit of “My pads” with “Studio kit”", href: "/s/studio-1/audits/a9" });
  });

  it("a viewer is told the same step and who can take it, with nothing to click", () => {
    for (const p of [empty, { ...empty, libraries: [lib()] }, { ...empty, libraries: [lib({ samples: 5, instruments: 2 })] }]) {
      const s = nextStep(p, viewer);
      expect(s.action).toBeNull();
      expect(s.text).toContain("editors and owners can");
    }
    // watching the sorting and reading an audit need no write
    expect(nextStep({ ...empty, libraries: [lib({ samples: 3, pending: 3 })] }, viewer).action).not.toBeNull();
  });
});
