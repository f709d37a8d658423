// Kits, layouts and the coverage audit in Chromium: build a layout by MIDI learn with a fake MIDI input,
// take the slots from a kit filled from the catalogue, run the audit, see a silent pad, add the missing
// samples, audit again, compare, export the CSV.
//
// Fake MIDI input: Chromium offers Web MIDI only with a real device and a permission prompt, so the test
// replaces navigator.requestMIDIAccess (page.addInitScript, before any page script runs) with a function
// resolving to an access object holding one input, "Test pad controller". The page sets that input's
// onmidimessage like with a real device; the test calls window.__kwMidiSend([status, data1, data2]) to
// deliver MIDI 1.0 bytes (0x99 = note on, channel 10; 0xB9 = control change, channel 10).
import fs from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { BASE, choose, chosen, launch, screenshot, signIn } from "./browser";
import { db } from "@/lib/server/db";
import { makeStudioWithRoles } from "../integration/helpers";
import { addInstrument, addLayerGroup, evenLayers, makeLibrary } from "../integration/audit/helpers";

let browser: Browser;
let s: Awaited<ReturnType<typeof makeStudioWithRoles>>;
let libraryId: string;
const tag = Math.random().toString(36).slice(2, 7);

beforeAll(async () => {
  browser = await launch();
  s = await makeStudioWithRoles();
  libraryId = await makeLibrary(db(), s.studio.id, `Pier room ${tag}`);
  await addInstrument(db(), s.studio.id, libraryId, { key: "kick", name: "Kick 22 felt", family: "kick", articulations: { centre: [3, 2] } });
  await addInstrument(db(), s.studio.id, libraryId, { key: "snare", name: "Snare 14 brass", family: "snare", articulations: { centre: [4, 3], edge: [2, 2] } });
  // catalogued, but none of its hits has been sorted into a layer yet
  await addInstrument(db(), s.studio.id, libraryId, { key: "cowbell", name: "Cowbell low", family: "cowbell", articulations: {} });
});
afterAll(async () => {
  await browser?.close();
  await db()("studios").whereIn("id", [s.studio.id, s.otherStudio.id]).delete();
  await db().destroy();
});

async function fakeMidi(page: Page) {
  await page.addInitScript(() => {
    const input = { id: "fake-in-1", name: "Test pad controller", manufacturer: "test", type: "input", state: "connected", connection: "open", onmidimessage: null as null | ((e: { data: Uint8Array }) => void) };
    const access = { inputs: new Map([[input.id, input]]), outputs: new Map(), sysexEnabled: false, onstatechange: null };
    Object.defineProperty(Navigator.prototype, "requestMIDIAccess", { configurable: true, value: () => Promise.resolve(access) });
    (window as unknown as { __kwMidiSend: (b: number[]) => void }).__kwMidiSend = (bytes) => input.onmidimessage?.({ data: new Uint8Array(bytes) });
  });
}
const send = (page: Page, bytes: number[]) => page.evaluate((b) => (window as unknown as { __kwMidiSend: (b: number[]) => void }).__kwMidiSend(b), bytes);

describe("audit flow in Chromium", () => {
  it("builds a layout by MIDI learn, audits it against a kit, fixes the silent pad, compares and exports", async () => {
    const ctx = await browser.newContext({ acceptDownloads: true });
    const page = await ctx.newPage();
    await fakeMidi(page);
    await signIn(page, s.users.owner.email, s.users.owner.password);

    // a kit filled from the catalogue for the General MIDI slots
    await page.goto(`${BASE}/s/${s.studio.id}/kits`);
    await page.getByLabel("Kit name").fill(`Pier kit ${tag}`);
    await choose(page.getByLabel("Kit template"), "gm-percussion");
    await page.getByRole("button", { name: "Create kit" }).click();
    await page.waitForURL(/\/kits\/[0-9a-f-]{36}$/);
    await page.getByTestId("kit-slots").waitFor();
    await expect(chosen(page.getByLabel("Instrument").first())).resolves.not.toBe("");
    await screenshot(page, "audit-01-kit");

    // a blank 1 x 3 grid
    await page.goto(`${BASE}/s/${s.studio.id}/layouts`);
    await page.getByLabel("Layout name").fill(`Pad strip ${tag}`);
    await choose(page.getByLabel("Start from"), "grid");
    await page.getByLabel("Rows").fill("1");
    await page.getByLabel("Columns").fill("3");
    await page.getByRole("button", { name: "Create layout" }).click();
    await page.waitForURL(/\/layouts\/[0-9a-f-]{36}$/);
    await choose(page.getByLabel("Take slots from a kit"), { label: `Pier kit ${tag} (39 slots)` });

    // MIDI learn: connect, learn pads, hit three pads on the (fake) controller
    await page.getByRole("button", { name: "Connect MIDI controller" }).click();
    await page.getByText("Listening").first().waitFor();
    await page.getByRole("button", { name: "Learn pads" }).click();
    await send(page, [0x99, 36, 101]);
    await send(page, [0x99, 38, 90]);
    await send(page, [0x99, 56, 70]);
    await page.getByTestId("midi-monitor").getByText("note on  56").or(page.getByTestId("midi-monitor").getByText(/note on\s+56/)).first().waitFor();
    const pads = page.getByTestId("layout-pad");
    await expect(pads.nth(0).textContent()).resolves.toContain("36 · C2 · ch 10");
    await expect(pads.nth(1).textContent()).resolves.toContain("38 · D2 · ch 10");
    await expect(pads.nth(2).textContent()).resolves.toContain("56 · G#3 · ch 10");
    await expect(pads.nth(0).textContent()).resolves.toContain("vel 101");

    // middle C convention: C3 names note 36 "C1"
    await choose(page.getByLabel("Octave convention").first(), "C3");
    await expect(pads.nth(0).textContent()).resolves.toContain("36 · C1");
    await choose(page.getByLabel("Octave convention").first(), "C4");

    // aim the pads: label, slot, articulation (the slot family's own articulations come first)
    const aim = async (i: number, label: string, slot: string, art: string) => {
      await pads.nth(i).click();
      await page.getByLabel("Label", { exact: true }).fill(label);
      await choose(page.getByLabel("Target slot"), { label: slot });
      await expect(chosen(page.getByLabel("Stroke"))).resolves.toBe(art);
    };
    await aim(0, "Kick", "Kick (kick)", "centre");
    await aim(1, "Snare", "Snare A (snare)", "centre");
    await aim(2, "Bell", "Cowbell (cowbell)", "hit");

    // the hi-hat pedal: learn its controller by moving it
    await page.getByRole("button", { name: "Add hi-hat pedal" }).click();
    await page.getByRole("button", { name: "Learn pedal" }).click();
    await send(page, [0xb9, 11, 64]);
    await expect(page.getByLabel("Controller (CC)").inputValue()).resolves.toBe("11");
    await screenshot(page, "audit-02-layout-learned");
    await page.getByRole("button", { name: "Save layout" }).click();
    await page.getByText("Layout saved.").waitFor();
    // the confirmation stays after the page refreshes its server parts (the editor is not remounted)
    await page.waitForTimeout(1500);
    await expect(page.getByText("Layout saved.").isVisible()).resolves.toBe(true);

    // run the audit
    await page.goto(`${BASE}/s/${s.studio.id}/audits`);
    await choose(page.getByLabel("Layout", { exact: true }), { label: `Pad strip ${tag}` });
    await choose(page.getByLabel("Kit", { exact: true }), { label: `Pier kit ${tag}` });
    await page.getByRole("button", { name: "Run audit" }).click();
    await page.waitForURL(/\/audits\/[0-9a-f-]{36}$/);
    const firstUrl = page.url();
    const chart = page.getByTestId("pad-chart");
    await chart.waitFor();
    await expect(chart.locator('[data-pad-id="r1c3"]').getAttribute("data-outcome")).resolves.toBe("silent");
    await expect(chart.locator('[data-pad-id="r1c3"]').textContent()).resolves.toContain("silent");
    await expect(chart.locator('[data-pad-id="r1c1"]').getAttribute("data-outcome")).resolves.toBe("direct");
    await expect(chart.locator('[data-pad-id="r1c3"] svg[data-icon="silent"]').count()).resolves.toBe(1);
    await page.getByTestId("audit-pedal").waitFor();
    await screenshot(page, "audit-03-first-audit");

    // audition asks for the hearing-safety caution first
    await chart.locator('[data-pad-id="r1c2"]').click();
    await page.getByTestId("hearing-caution").waitFor();
    await page.getByRole("button", { name: "Not now" }).click();

    // the cowbell's hits arrive in the catalogue; audit again
    await addLayerGroup(db(), s.studio.id, libraryId, "cowbell", "hit", evenLayers(2, 3));
    await page.getByRole("button", { name: "Run audit" }).click();
    await page.waitForURL((u) => /\/audits\/[0-9a-f-]{36}$/.test(u.pathname) && u.href !== firstUrl);
    await expect(page.getByTestId("pad-chart").locator('[data-pad-id="r1c3"]').getAttribute("data-outcome")).resolves.toBe("direct");

    // compare with the first audit
    await page.getByTestId("compare-previous").click();
    await page.waitForURL(/\/audits\/compare\?/);
    await expect(page.getByTestId("compare-changes").locator('[data-change="pad:r1c3"]').textContent()).resolves.toMatch(/silent.*as recorded/);
    await screenshot(page, "audit-04-compare");

    // export the CSV of the later audit
    await page.goBack();
    await page.getByTestId("pad-chart").waitFor();
    const [download] = await Promise.all([page.waitForEvent("download"), page.getByTestId("export-csv").click()]);
    const csv = fs.readFileSync((await download.path())!, "utf8");
    expect(csv.split("\r\n")[0]).toBe("kind,id,label,note,channel,row,col,zone,slot,instrument,requested,outcome,plays,path,cost,layers,velocity_gaps,min_round_robins,reason,edges");
    expect(csv).toMatch(/pad,r1c3,Bell,56,10,1,3,,Cowbell,Cowbell low,hit,direct,hit/);
    await screenshot(page, "audit-05-second-audit");
    // the printable pad chart: print media hides the controls (.no-print)
    await page.emulateMedia({ media: "print" });
    await expect(page.getByRole("button", { name: "Run audit" }).isVisible()).resolves.toBe(false);
    await expect(page.getByTestId("pad-chart").isVisible()).resolves.toBe(true);
    await screenshot(page, "audit-06-print");
    await ctx.close();
  });
});
