// Multi-mic consistency in Chromium: three takes of a ride through a close and an overhead microphone (our
// generator), one overhead shifted by 2 ms as a wrong edit would, one take with no overhead; uploaded, measured
// and sorted by the worker; the library's health page names the shifted take and the missing mic and plots
// the offsets take by take.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { BASE, launch, screenshot, signIn } from "./browser";
import { db, closeDb } from "@/lib/server/db";
import { createStudio, createUser } from "@/db/factories";
import { encodeWav } from "@/lib/audio/encode";
import { renderSound } from "@/lib/synth/drums";

const tag = Math.random().toString(36).slice(2, 8);
const owner = { email: `mics-${tag}@example.test`, name: "Mic Owner", password: "correct-horse-9" };
let browser: Browser;
let studioId: string;

function take(rr: number, mic: "close" | "overhead", shiftMs = 0): Buffer {
  const chs = renderSound({ family: "ride", instrument: { diameterIn: 21 }, articulation: "bow" }, { sampleRate: 48_000, velocity: 100, seed: `rr${rr}`, channels: 2, mic, seconds: 1 });
  const shift = Math.round((shiftMs / 1000) * 48_000);
  const out = chs.map((c) => {
    const y = new Float32Array(c.length + shift);
    y.set(c, shift);
    return y;
  });
  return Buffer.from(encodeWav(out, { sampleRate: 48_000, bits: 24 }));
}

beforeAll(async () => {
  const o = await createUser(db(), owner);
  studioId = (await createStudio(db(), { name: `Mic Studio ${tag}`, ownerId: o.id })).id;
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

describe("multi-mic consistency", () => {
  it("names a shifted overhead and a missing one on the health page, with the offsets plotted", async () => {
    const ctx = await browser.newContext({ viewport: { width: 1440, height: 900 } });
    const page = await ctx.newPage();
    await signIn(page, owner.email, owner.password);
    const api = page.request;
    const libraryId = (await (await api.post(`${BASE}/api/studios/${studioId}/libraries`, { data: { name: `Ride mics ${tag}` } })).json()).id as string;
    const files: [string, Buffer][] = [];
    for (const rr of [1, 2, 3, 4]) {
      files.push([`Ride21/Ride21_Bow_v1_rr${rr}_Close.wav`, take(rr, "close")]);
      if (rr !== 4) files.push([`Ride21/Ride21_Bow_v1_rr${rr}_OH.wav`, take(rr, "overhead", rr === 2 ? 2 : 0)]);
    }
    for (const [name, buffer] of files) {
      const up = await api.post(`${BASE}/api/studios/${studioId}/libraries/${libraryId}/uploads`, { multipart: { file: { name, mimeType: "audio/wav", buffer } } });
      expect(up.status()).toBe(201);
    }
    const health = `${BASE}/api/studios/${studioId}/libraries/${libraryId}/health`;
    await expect
      .poll(async () => ((await (await api.get(health)).json()) as { sampleCount: number }).sampleCount, { timeout: 120_000, interval: 1000 })
      .toBe(7);

    await page.goto(`${BASE}/s/${studioId}/libraries/${libraryId}/health`);
    const shifted = page.locator('[data-testid="finding"][data-code="mic-offset"]');
    await expect(shifted.count()).resolves.toBe(1);
    await expect(shifted.textContent()).resolves.toMatch(/take v1 rr2: the overhead microphone arrives 2\.0 ms later/);
    await expect(page.locator('[data-testid="finding"][data-code="mic-missing"]').textContent()).resolves.toMatch(/1 take has no overhead microphone \(v1 rr4\)/);
    await page.getByTestId("mic-offsets").waitFor();
    await expect(page.getByTestId("mic-offsets").locator('div[role="img"]').getAttribute("aria-label")).resolves.toMatch(/usually 2\.\d\d ms later/);
    await screenshot(page, "mic-offsets-1440-light");
    await page.setViewportSize({ width: 390, height: 844 });
    await page.emulateMedia({ colorScheme: "dark" });
    await screenshot(page, "mic-offsets-390-dark");
    await ctx.close();
  }, 240_000);
});
