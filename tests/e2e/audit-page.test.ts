// The audit page and the comparison in Chromium, at 1440 and 390 px, light and dark: the score reads NN/100 with
// its sentence, each empty slot is told once (never as a conflict), the velocity bars come with their legend and
// scale, the pad chart draws a layout with the same columns as the layout editor, the keyboard moves between
// pads and a pad shows it is sounding, "Compare with the previous audit" leads to the comparison, and the audit
// form offers the kit last audited with the layout. Screenshots in test-results/screens/audit-page-*.png.
//
// Audio: the catalogue rows here name sample ids with no stored file, so the browser is answered, for the
// sample audio address only, with a 0.6 s tone of our own (encodeWav, lib/audio) to hear the pad's playing state.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { BASE, launch, screenshot, signIn, choose, chosen } from "./browser";
import { db } from "@/lib/server/db";
import { encodeWav } from "@/lib/audio/encode";
import { createKit } from "@/lib/server/kits/kits";
import { createLayout } from "@/lib/server/kits/layouts";
import { runAndSaveAudit } from "@/lib/server/kits/audits";
import type { AuditRecord } from "@/lib/api-types/audits";
import { makeStudioWithRoles } from "../integration/helpers";
import { addInstrument, addLayerGroup, evenLayers, makeLibrary } from "../integration/audit/helpers";

let browser: Browser;
let s: Awaited<ReturnType<typeof makeStudioWithRoles>>;
let gmLayoutId: string;
let gridLayoutId: string;
let first: AuditRecord;
let second: AuditRecord;
let gridAudit: AuditRecord;
let otherKitId: string;
let kitId: string;
const tag = Math.random().toString(36).slice(2, 7);
const WIDTHS = [1440, 390] as const;

const tone = (() => {
  const n = Math.round(48000 * 0.6);
  const x = new Float32Array(n);
  for (let i = 0; i < n; i++) x[i] = 0.05 * Math.sin((2 * Math.PI * 220 * i) / 48000) * (1 - i / n);
  return Buffer.from(encodeWav([x], { sampleRate: 48000, bits: 16 }));
})();

beforeAll(async () => {
  browser = await launch();
  s = await makeStudioWithRoles();
  const actorId = s.users.owner.id;
  const lib = await makeLibrary(db(), s.studio.id, `Boathouse ${tag}`);
  await addInstrument(db(), s.studio.id, lib, { key: "kick", name: "Kick 22 felt", family: "kick", articulations: { centre: [4, 3] } });
  await addInstrument(db(), s.studio.id, lib, { key: "snare", name: "Snare 14 brass", family: "snare", articulations: { centre: [4, 3], "cross-stick": [2, 2] } });
  // the snare edge was recorded soft and hard only: velocities 61-79 find no layer
  await addLayerGroup(db(), s.studio.id, lib, "snare", "edge", [
    { index: 0, velocityLow: 1, velocityHigh: 60, meanStrikeLufs: -30, sampleIds: [crypto.randomUUID(), crypto.randomUUID()] },
    { index: 1, velocityLow: 80, velocityHigh: 127, meanStrikeLufs: -20, sampleIds: [crypto.randomUUID()] },
  ]);
  await addInstrument(db(), s.studio.id, lib, { key: "hat", name: "Hi-hat 14", family: "hi-hat", articulations: { closed: [3, 2], open: [2, 2] } });
  await addInstrument(db(), s.studio.id, lib, { key: "ride", name: "Ride 21", family: "ride", articulations: { bow: [3, 2] } });
  await addInstrument(db(), s.studio.id, lib, { key: "tom-10", name: "Tom 10", family: "tom", pitchHz: 196, articulations: { centre: [3, 2] } });
  await addInstrument(db(), s.studio.id, lib, { key: "crash", name: "Crash 18", family: "crash", articulations: {} });
  const kit = await createKit({ studioId: s.studio.id, actorId, name: `Boathouse kit ${tag}`, template: "gm-percussion" });
  kitId = kit.id;
  const other = await createKit({ studioId: s.studio.id, actorId, name: `Aaa spare kit ${tag}`, template: "grid-2x8" });
  otherKitId = other.id;
  gmLayoutId = (await createLayout({ studioId: s.studio.id, actorId, name: `GM map ${tag}`, template: "gm-percussion" })).id;
  gridLayoutId = (await createLayout({ studioId: s.studio.id, actorId, name: `Grid ${tag}`, template: "grid-24" })).id;
  first = await runAndSaveAudit({ studioId: s.studio.id, actorId, layoutId: gmLayoutId, kitId });
  // the crash's hits arrive; audit again
  await addLayerGroup(db(), s.studio.id, lib, "crash", "crash-hit", evenLayers(3, 2));
  second = await runAndSaveAudit({ studioId: s.studio.id, actorId, layoutId: gmLayoutId, kitId });
  gridAudit = await runAndSaveAudit({ studioId: s.studio.id, actorId, layoutId: gridLayoutId, kitId });
});
afterAll(async () => {
  await browser?.close();
  await db()("studios").whereIn("id", [s.studio.id, s.otherStudio.id]).delete();
  await db().destroy();
});

async function page(width: number, scheme: "light" | "dark" = "light"): Promise<Page> {
  const ctx = await browser.newContext({ viewport: { width, height: 900 }, colorScheme: scheme });
  const p = await ctx.newPage();
  await p.route(/\/samples\/[0-9a-f-]{36}\/audio(\?|$)/, (route) => route.fulfill({ status: 200, contentType: "audio/wav", body: tone }));
  await signIn(p, s.users.owner.email, s.users.owner.password);
  return p;
}

const drawnColumns = (p: Page, testId: string) =>
  p.getByTestId(testId).evaluate((el) => getComputedStyle(el).gridTemplateColumns.split(" ").filter(Boolean).length);
const noPageOverflow = (p: Page) => p.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth);
/** Elements of `within` (the page's main content) reaching past the window's right edge, for the message. */
const overflowing = (p: Page, within = "main") =>
  p.evaluate((sel) => [...document.querySelectorAll(`${sel} *`)].filter((e) => e.getBoundingClientRect().right > window.innerWidth + 1 && !e.closest(".overflow-x-auto"))
    .slice(0, 8).map((e) => `${e.tagName.toLowerCase()}.${(e.getAttribute("class") ?? "").split(" ").slice(0, 4).join(".")} ${Math.round(e.getBoundingClientRect().right)}`), within);

describe("the audit page in Chromium", () => {
  for (const width of WIDTHS) {
    it(`at ${width} px: NN/100 and its sentence, empty slots once, velocity legend and scale`, async () => {
      const p = await page(width);
      await p.goto(`${BASE}/s/${s.studio.id}/audits/${second.id}`);
      await p.getByTestId("score-card").waitFor();
      expect(second.result.score.outOf).toBe(100);
      await expect(p.getByTestId("audit-score").textContent()).resolves.toBe(`${second.result.score.value}/100`);
      await expect(p.getByTestId("score-sentence").textContent()).resolves.toBe(second.result.score.sentence);
      expect(second.result.score.sentence).toMatch(/^\d+ of 47 pads will sound \(\d+ as recorded, 2 through stand-ins\); \d+ stay silent, all on slots the kit leaves empty\.$/);
      // the formula behind the disclosure: words and MathML, no code block
      await p.getByText("How is this computed?").click();
      await expect(p.getByTestId("score-how").locator("math").count()).resolves.toBeGreaterThan(0);
      await expect(p.locator("pre, code").count()).resolves.toBe(0);
      // each empty slot once, in one group; none of them a conflict
      const groups = p.getByTestId("empty-slots").locator("li[data-slot]");
      await expect(groups.count()).resolves.toBe(second.result.emptySlots.length);
      const slotIds = await groups.evaluateAll((els) => els.map((e) => (e as HTMLElement).dataset.slot));
      expect(new Set(slotIds).size).toBe(slotIds.length);
      const onEmpty = second.result.emptySlots.reduce((n, g) => n + g.padIds.length, 0);
      await expect(p.getByTestId("empty-slots").locator("h3").textContent()).resolves.toContain(`${onEmpty} pads aim at slots this kit leaves empty`);
      await expect(p.getByTestId("conflicts").count()).resolves.toBe(0);
      const body = (await p.locator("main").textContent()) ?? (await p.locator("body").textContent())!;
      expect(body).not.toMatch(/empty-slot|name-sound-conflict|cost \d|path \w+ →|closeness graph|Round robins \(min\)/);
      // the folded table: pads on empty slots are not repeated there until asked for
      await expect(p.getByTestId("findings-table").locator("tbody tr").count()).resolves.toBe(47 - onEmpty);
      await expect(p.getByTestId("stand-ins").textContent()).resolves.toContain("Pedal Hi-Hat plays the closed hat instead — the nearest recorded stroke");
      expect(await overflowing(p)).toEqual([]);
      await screenshot(p, `audit-page-${width}-light`);
      await p.emulateMedia({ colorScheme: "dark" });
      await screenshot(p, `audit-page-${width}-dark`);
      await p.emulateMedia({ colorScheme: "light" });

      // the grid audit: the snare edge's velocity gap marked on its bar and told in text, the legend and scale
      await p.goto(`${BASE}/s/${s.studio.id}/audits/${gridAudit.id}`);
      await p.getByTestId("score-card").waitFor();
      await expect(p.getByTestId("gaps").textContent()).resolves.toContain("Snare edge plays nothing at velocities 61–79");
      const legend = p.getByTestId("velocity-legend");
      await expect(legend.isVisible()).resolves.toBe(true);
      await expect(legend.textContent()).resolves.toContain("gap: no layer, nothing sounds");
      const edgeRow = p.getByTestId("findings-table").locator("tr", { hasText: "Snare edge" });
      await expect(edgeRow.locator('[data-gap="61-79"]').count()).resolves.toBe(1);
      await expect(edgeRow.locator(".sr-only").first().textContent()).resolves.toContain("Nothing sounds at 61–79");
      await expect(edgeRow.textContent()).resolves.toContain("127");
      expect(await overflowing(p)).toEqual([]);
      await screenshot(p, `audit-grid-${width}-light`);
      await p.emulateMedia({ colorScheme: "dark" });
      await screenshot(p, `audit-grid-${width}-dark`);
      await p.context().close();
    });

    it(`at ${width} px: the pad chart has the editor's columns, for a grid and for a trigger-zone list`, async () => {
      const p = await page(width);
      for (const [layoutId, auditId] of [[gridLayoutId, gridAudit.id], [gmLayoutId, second.id]] as const) {
        await p.goto(`${BASE}/s/${s.studio.id}/layouts/${layoutId}`);
        await p.getByTestId("layout-grid").waitFor();
        const editor = await drawnColumns(p, "layout-grid");
        await screenshot(p, `audit-page-editor-${layoutId === gridLayoutId ? "grid" : "gm"}-${width}`);
        await p.goto(`${BASE}/s/${s.studio.id}/audits/${auditId}`);
        await p.getByTestId("pad-chart").waitFor();
        const audit = await drawnColumns(p, "pad-chart");
        expect(audit, `layout ${layoutId}`).toBe(editor);
        // the grid keeps its 6 columns; the 47-note list is 6 wide, 2 on a phone (components/pad-chart/geometry.ts)
        expect(audit).toBe(layoutId === gridLayoutId || width === 1440 ? 6 : 2);
      }
      await p.context().close();
    });
  }

  it("moves between pads with the arrow keys and shows a pad sounding while it plays", async () => {
    const p = await page(1440);
    await p.goto(`${BASE}/s/${s.studio.id}/audits/${gridAudit.id}`);
    const chart = p.getByTestId("pad-chart");
    await chart.waitFor();
    await chart.locator('[data-pad-id="r1c1"]').focus();
    await p.keyboard.press("ArrowRight");
    await expect(p.evaluate(() => (document.activeElement as HTMLElement).dataset.padId)).resolves.toBe("r1c2");
    await p.keyboard.press("ArrowDown");
    await expect(p.evaluate(() => (document.activeElement as HTMLElement).dataset.padId)).resolves.toBe("r2c2");
    // only one pad of the chart is a tab stop
    await expect(chart.locator('[tabindex="0"]').count()).resolves.toBe(1);
    // Enter plays the focused pad: the hearing caution first, then the sound
    await p.keyboard.press("Enter");
    await p.getByTestId("hearing-caution").waitFor();
    await p.getByRole("button", { name: "I understand, play" }).click();
    const pad = chart.locator('[data-pad-id="r2c2"]');
    await p.waitForFunction(() => document.querySelector('[data-pad-id="r2c2"]')?.getAttribute("aria-pressed") === "true", null, { timeout: 5000 });
    await screenshot(p, "audit-page-playing");
    await p.waitForFunction(() => document.querySelector('[data-pad-id="r2c2"]')?.getAttribute("aria-pressed") === "false", null, { timeout: 5000 });
    await expect(pad.getAttribute("aria-pressed")).resolves.toBe("false");
    await expect(p.getByTestId("audition-line").textContent()).resolves.toMatch(/Tom 10/);
    await p.context().close();
  });

  for (const width of WIDTHS) {
    it(`at ${width} px: "Compare with the previous audit" opens the comparison`, async () => {
      const p = await page(width);
      await p.goto(`${BASE}/s/${s.studio.id}/audits/${second.id}`);
      await p.getByTestId("compare-previous").click();
      await p.waitForURL((u) => u.pathname.endsWith("/audits/compare") && u.searchParams.get("before") === first.id && u.searchParams.get("after") === second.id);
      await expect(p.getByTestId("compare-score").textContent()).resolves.toContain(`${first.score}/100 → ${second.score}/100`);
      expect(second.score).toBeGreaterThan(first.score);
      const change = p.locator('[data-change="pad:gm-49"]');
      await expect(change.textContent()).resolves.toMatch(/silent.*as recorded/);
      expect(await overflowing(p)).toEqual([]);
      await screenshot(p, `compare-page-${width}-light`);
      await p.emulateMedia({ colorScheme: "dark" });
      await screenshot(p, `compare-page-${width}-dark`);
      // the first audit has no previous one
      await p.goto(`${BASE}/s/${s.studio.id}/audits/${first.id}`);
      await p.getByTestId("compare-previous-none").waitFor();
      // the list offers the same comparison
      await p.goto(`${BASE}/s/${s.studio.id}/audits?layoutId=${gmLayoutId}`);
      await expect(p.getByTestId("row-compare-previous").count()).resolves.toBe(1);
      await p.context().close();
    });
  }

  it("the audit form offers the kit last audited with the chosen layout", async () => {
    const p = await page(1440);
    await p.goto(`${BASE}/s/${s.studio.id}/audits`);
    await choose(p.getByLabel("Layout", { exact: true }), gmLayoutId);
    await expect(chosen(p.getByLabel("Kit", { exact: true }))).resolves.toBe(kitId);
    await p.getByTestId("kit-last-used").waitFor();
    // the spare kit sorts first by name, so it is not merely the first in the list
    await p.getByLabel("Kit", { exact: true }).click();
    await expect(p.getByRole("listbox").locator('[role="option"]').first().getAttribute("data-value")).resolves.toBe(otherKitId);
    await p.keyboard.press("Escape");
    await p.context().close();
  });
});
