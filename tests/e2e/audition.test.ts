// The whole product path in one browser session: upload WAVs through the API as the signed-in owner, let the
// worker measure and sort them, build a kit and a layout from the five-piece template, run the audit, then
// click the kick pad: the hearing-safety caution comes first, then the kit really plays (the sample audio is
// fetched from the server and started through Web Audio), and the round robins take turns.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { BASE, kickWav as kick, launch, signIn } from "./browser";
import { db, closeDb } from "@/lib/server/db";
import { createStudio, createUser } from "@/db/factories";

const tag = Math.random().toString(36).slice(2, 8);
const owner = { email: `audition-${tag}@example.test`, name: "Audition Owner", password: "correct-horse-9" };
let browser: Browser;
let studioId: string;

beforeAll(async () => {
  const o = await createUser(db(), owner);
  studioId = (await createStudio(db(), { name: `Audition Studio ${tag}`, ownerId: o.id })).id;
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

describe("audition", () => {
  it("plays what the kit would play, quietly, after the caution, with round robins taking turns", async () => {
    const ctx = await browser.newContext();
    // count what Web Audio is asked to play (headless Chromium has no speakers, but the graph runs)
    await ctx.addInitScript(() => {
      const w = window as unknown as { __kwStarts: number[] };
      w.__kwStarts = [];
      const start = AudioBufferSourceNode.prototype.start;
      AudioBufferSourceNode.prototype.start = function (this: AudioBufferSourceNode, ...a: number[]) {
        w.__kwStarts.push(this.buffer?.length ?? -1);
        return start.apply(this, a as []);
      };
    });
    const page = await ctx.newPage();
    await signIn(page, owner.email, owner.password);
    const api = page.request;
    const lib = await api.post(`${BASE}/api/studios/${studioId}/libraries`, { data: { name: `Kick takes ${tag}` } });
    expect(lib.status()).toBe(201);
    const libraryId = (await lib.json()).id as string;
    // 2 layers x 2 round robins of one kick, named the way the trade does
    for (const [v, g] of [[1, 0.1], [2, 0.6]] as const) {
      for (const rr of [1, 2]) {
        const up = await api.post(`${BASE}/api/studios/${studioId}/libraries/${libraryId}/uploads`, {
          multipart: { file: { name: `Kick/kick_v${v}_rr${rr}.wav`, mimeType: "audio/wav", buffer: Buffer.from(kick(g * (1 + rr * 0.05), v * 10 + rr)) } },
        });
        expect(up.status()).toBe(201);
      }
    }
    await expect
      .poll(async () => (await (await api.get(`${BASE}/api/studios/${studioId}/libraries/${libraryId}/progress`)).json()) as { catalogued: number; cataloguing: boolean }, { timeout: 90_000, interval: 1000 })
      .toMatchObject({ catalogued: 4, cataloguing: false });

    const kit = await api.post(`${BASE}/api/studios/${studioId}/kits`, { data: { name: "Audition kit", template: "trigger-five" } });
    expect(kit.status()).toBe(201);
    const layout = await api.post(`${BASE}/api/studios/${studioId}/layouts`, { data: { name: "Audition layout", template: "trigger-five" } });
    expect(layout.status()).toBe(201);
    const audit = await api.post(`${BASE}/api/studios/${studioId}/audits`, { data: { layoutId: (await layout.json()).layout.id, kitId: (await kit.json()).kit.id } });
    expect(audit.status()).toBe(201);

    await page.goto(`${BASE}/s/${studioId}/audits/${(await audit.json()).audit.id}`);
    const pad = page.getByTestId("pad-chart").locator('[data-pad-id="kick"]');
    await expect(pad.getAttribute("data-outcome")).resolves.toBe("direct");
    await page.getByText(/Level\s+-24 dB/).first().waitFor(); // playback starts quiet

    await pad.click();
    await page.getByTestId("hearing-caution").waitFor();
    const audio = page.waitForResponse((r) => /\/samples\/[0-9a-f-]{36}\/audio$/.test(r.url()));
    await page.getByRole("button", { name: "I understand, play" }).click();
    const res = await audio;
    expect(res.status()).toBe(200);
    expect(res.headers()["content-type"]).toMatch(/audio\/(wav|x-wav|wave)/);
    await expect.poll(() => page.getByTestId("audition-line").textContent(), { timeout: 15_000 }).toMatch(/take 1\/2/);
    await pad.click();
    await expect.poll(() => page.getByTestId("audition-line").textContent(), { timeout: 15_000 }).toMatch(/take 2\/2/);
    const starts = await page.evaluate(() => (window as unknown as { __kwStarts: number[] }).__kwStarts);
    // two buffers started, each the decoded 0.5 s file (24,000 frames at 48 kHz; the context may resample)
    expect(starts).toHaveLength(2);
    for (const len of starts) expect(len).toBeGreaterThan(20_000);
    await ctx.close();
  }, 180_000);
});
