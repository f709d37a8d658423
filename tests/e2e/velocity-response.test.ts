// The velocity response in Chromium: three layers of one kick uploaded with known gains (0.1, 0.3, 0.9 of full
// scale: -19.08 and -9.54 dB against the top one), measured and sorted by the worker; the library's velocity
// page shows each layer's measured level and trim, switches to Dannenberg's curve, plays the layers after the
// trims (after the hearing-safety caution) and downloads the trims as CSV. Screenshots at 1440 and 390 px.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { BASE, choose, kickWav as kick, launch, screenshot, signIn } from "./browser";
import { db, closeDb } from "@/lib/server/db";
import { createStudio, createUser } from "@/db/factories";

const tag = Math.random().toString(36).slice(2, 8);
const owner = { email: `velocity-${tag}@example.test`, name: "Velocity Owner", password: "correct-horse-9" };
let browser: Browser;
let studioId: string;

beforeAll(async () => {
  const o = await createUser(db(), owner);
  studioId = (await createStudio(db(), { name: `Velocity Studio ${tag}`, ownerId: o.id })).id;
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

describe("velocity response", () => {
  it("shows each layer against the curve, plays them after the trims and downloads the trims", async () => {
    const ctx = await browser.newContext({ acceptDownloads: true, viewport: { width: 1440, height: 900 } });
    await ctx.addInitScript(() => {
      const w = window as unknown as { __kwStarts: number };
      w.__kwStarts = 0;
      const start = AudioBufferSourceNode.prototype.start;
      AudioBufferSourceNode.prototype.start = function (this: AudioBufferSourceNode, ...a: number[]) {
        w.__kwStarts++;
        return start.apply(this, a as []);
      };
    });
    const page = await ctx.newPage();
    await signIn(page, owner.email, owner.password);
    const api = page.request;
    const lib = await api.post(`${BASE}/api/studios/${studioId}/libraries`, { data: { name: `Kick layers ${tag}` } });
    const libraryId = (await lib.json()).id as string;
    for (const [v, g] of [[1, 0.1], [2, 0.3], [3, 0.9]] as const) {
      const up = await api.post(`${BASE}/api/studios/${studioId}/libraries/${libraryId}/uploads`, {
        multipart: { file: { name: `Kick/kick_v${v}_rr1.wav`, mimeType: "audio/wav", buffer: Buffer.from(kick(g, v)) } },
      });
      expect(up.status()).toBe(201);
    }
    const url = `${BASE}/api/studios/${studioId}/libraries/${libraryId}/velocity-response`;
    await expect
      .poll(async () => ((await (await api.get(url)).json()) as { groups: { response: { layers: unknown[] } }[] }).groups.map((g) => g.response.layers.length), { timeout: 90_000, interval: 1000 })
      .toEqual([3]);

    await page.goto(`${BASE}/s/${studioId}/libraries/${libraryId}/velocity`);
    const table = page.getByTestId("trims-table");
    await table.waitFor();
    const cells = async (col: number) => (await table.locator(`tbody tr td:nth-child(${col})`).allTextContents()).map((t) => Number(t.replace(/[^0-9.+-]/g, "")));
    const measured = await cells(3);
    // strike loudness scales with gain: 20 log10(0.1/0.9) = -19.08 dB, 20 log10(0.3/0.9) = -9.54 dB
    expect(measured[0]).toBeCloseTo(-19.1, 0);
    expect(measured[1]).toBeCloseTo(-9.5, 0);
    expect(measured[2]).toBe(0);
    const dlsTargets = await cells(4);
    const trims = await cells(5);
    trims.forEach((t, i) => expect(t).toBeCloseTo(dlsTargets[i]! - measured[i]!, 0));
    await screenshot(page, "velocity-1440-light");

    await choose(page.locator("#vr-curve"), "dannenberg");
    await page.getByLabel("Dynamic range (dB)").fill("30");
    await expect.poll(async () => (await cells(4))[0], { timeout: 10_000 }).not.toBe(dlsTargets[0]);

    await page.getByRole("button", { name: /Listen after the trims/ }).click();
    await page.getByRole("alertdialog", { name: "Hearing safety" }).waitFor();
    await page.getByRole("button", { name: "I understand" }).click();
    await page.getByRole("button", { name: /Listen after the trims/ }).click();
    await expect.poll(() => page.evaluate(() => (window as unknown as { __kwStarts: number }).__kwStarts), { timeout: 15_000 }).toBe(3);

    const download = page.waitForEvent("download");
    await page.getByRole("link", { name: "Trims as CSV" }).click();
    const file = await download;
    expect(file.suggestedFilename()).toBe(`velocity-trims-Kick layers ${tag}.csv`); // the UTF-8 filename* keeps the library name as it is

    await page.emulateMedia({ colorScheme: "dark" });
    await screenshot(page, "velocity-1440-dark");
    await page.setViewportSize({ width: 390, height: 844 });
    await screenshot(page, "velocity-390-dark");
    await ctx.close();
  }, 180_000);
});
