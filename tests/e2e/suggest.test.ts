// Suggest a layout in Chromium: from the layouts page to the suggestion (hats on both sides of the snare, a
// reason for every pad), kept as a new layout that opens in the editor; a viewer sees it without the keep button.
// Screenshots at 1440 and 390 px, light and dark.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { BASE, launch, screenshot, signIn, choose } from "./browser";
import { db } from "@/lib/server/db";
import { call, makeStudioWithRoles } from "../integration/helpers";
import { addInstrument, makeLibrary } from "../integration/audit/helpers";
import * as kitsRoute from "@/app/api/studios/[studioId]/kits/route";

let browser: Browser;
let s: Awaited<ReturnType<typeof makeStudioWithRoles>>;
const tag = Math.random().toString(36).slice(2, 7);

beforeAll(async () => {
  browser = await launch();
  s = await makeStudioWithRoles();
  const lib = await makeLibrary(db(), s.studio.id, `Loft room ${tag}`);
  const add = (key: string, name: string, family: string, articulations: Record<string, [number, number]>, pitchHz: number | null = null) =>
    addInstrument(db(), s.studio.id, lib, { key, name, family, articulations, pitchHz });
  const ids = {
    kick: await add("kick", "Kick 20 felt", "kick", { centre: [3, 2] }),
    snare: await add("snare", "Snare 14 steel", "snare", { centre: [4, 3], "rim-shot": [2, 2], "cross-stick": [2, 1] }),
    hat: await add("hat", "Hi-hat 14 dark", "hi-hat", { closed: [3, 3], open: [2, 2], pedal: [2, 1] }),
    tomLow: await add("tom-14", "Tom 14", "tom", { centre: [2, 2] }, 98),
    tomHigh: await add("tom-10", "Tom 10", "tom", { centre: [2, 2] }, 196),
    ride: await add("ride", "Ride 20", "ride", { bow: [3, 2], bell: [2, 1] }),
  };
  const slot = (id: string, name: string, family: string, instrumentId: string) => ({ id, name, family, instrumentId });
  await call(kitsRoute.POST, {
    params: { studioId: s.studio.id },
    user: s.users.editor,
    body: { name: `Loft kit ${tag}`, slots: [slot("kick", "Kick", "kick", ids.kick), slot("snare", "Snare", "snare", ids.snare), slot("hi-hat", "Hi-hat", "hi-hat", ids.hat), slot("tom-2", "Floor tom", "tom", ids.tomLow), slot("tom-1", "Rack tom", "tom", ids.tomHigh), slot("ride", "Ride", "ride", ids.ride)] },
  });
});
afterAll(async () => {
  await browser?.close();
  await db()("studios").whereIn("id", [s.studio.id, s.otherStudio.id]).delete();
  await db().destroy();
});

describe("suggest a layout in Chromium", () => {
  it("suggests a 3 x 5 grid for a kit, explains each pad, and keeps it as a layout to edit", async () => {
    const ctx = await browser.newContext({ viewport: { width: 1440, height: 900 } });
    const page = await ctx.newPage();
    await signIn(page, s.users.editor.email, s.users.editor.password);
    await page.goto(`${BASE}/s/${s.studio.id}/layouts`);
    await page.getByTestId("suggest-link").click();
    await page.waitForURL(/\/layouts\/suggest$/);
    await choose(page.getByLabel("Kit", { exact: true }), { label: `Loft kit ${tag} (6 filled slots)` });
    await page.getByLabel("Rows").fill("3");
    await page.getByLabel("Columns").fill("5");
    await page.getByRole("button", { name: "Suggest", exact: true }).click();
    await page.getByTestId("suggested-grid").waitFor();
    // 6 instruments, 11 recorded strokes, the closed hat twice and a second kick pad: 13 of 15 pads
    await expect(page.getByTestId("suggested-pad").count()).resolves.toBe(13);
    const reasons = page.getByTestId("suggest-reasons");
    await expect(reasons.textContent()).resolves.toMatch(/both sides of the snare/);
    await expect(reasons.locator("li").count()).resolves.toBe(13);
    await screenshot(page, "suggest-1440-light");
    await page.emulateMedia({ colorScheme: "dark" });
    await screenshot(page, "suggest-1440-dark");
    await page.setViewportSize({ width: 390, height: 844 });
    expect(await page.evaluate(() => document.documentElement.scrollWidth <= window.innerWidth)).toBe(true);
    await screenshot(page, "suggest-390-dark");
    await page.emulateMedia({ colorScheme: "light" });
    await screenshot(page, "suggest-390-light");

    await page.getByRole("button", { name: "Keep it as a new layout" }).click();
    await page.waitForURL(/\/layouts\/[0-9a-f-]{36}$/);
    const row = await db()("layouts").where({ studio_id: s.studio.id }).first();
    expect(row.name).toBe(`Loft kit ${tag} — suggested`);
    const layout = typeof row.body === "string" ? JSON.parse(row.body) : row.body;
    expect(layout.surface).toEqual({ kind: "grid", rows: 3, cols: 5 });
    expect(layout.pads).toHaveLength(13);
    await ctx.close();
  }, 120_000);

  it("shows a viewer the suggestion without the keep button", async () => {
    const ctx = await browser.newContext();
    const page = await ctx.newPage();
    await signIn(page, s.users.viewer.email, s.users.viewer.password);
    await page.goto(`${BASE}/s/${s.studio.id}/layouts/suggest`);
    await page.getByRole("button", { name: "Suggest", exact: true }).click();
    await page.getByTestId("suggested-grid").waitFor();
    await page.getByText("View only").waitFor();
    await expect(page.getByRole("button", { name: "Keep it as a new layout" }).count()).resolves.toBe(0);
    await ctx.close();
  }, 60_000);
});
