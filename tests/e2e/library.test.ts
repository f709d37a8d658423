// Browser flow of a library in Chromium against the running app and worker: create a library, upload a
// folder of generated WAVs through the page's folder input, watch progress reach catalogued, relabel in bulk,
// open a sample (the hearing-safety caution comes before the first playback), the health view and the plots.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import type { Browser, Page } from "playwright-core";
import { BASE, choose, launch, screenshot, signIn, uploaderReady } from "./browser";
import { db, closeDb } from "@/lib/server/db";
import { addMember, createStudio, createUser } from "@/db/factories";
import { encodeWav } from "@/lib/audio/encode";

const tag = Math.random().toString(36).slice(2, 8);
let browser: Browser;
let page: Page;
let studioId: string;
const owner = { email: `lib-owner-${tag}@example.test`, name: "Library Owner", password: "correct-horse-9" };
const viewer = { email: `lib-viewer-${tag}@example.test`, name: "Library Viewer", password: "correct-horse-9" };
const folder = fs.mkdtempSync(path.join(os.tmpdir(), "kw-e2e-lib-"));
const root = path.join(folder, "Session A");

function hit(seed: number, freq: number, gain: number, decay: number): Uint8Array {
  const fs_ = 44_100;
  const n = Math.round(0.4 * fs_);
  const x = new Float32Array(n);
  let s = seed >>> 0 || 1;
  for (let i = 0; i < n; i++) {
    s = (s * 1664525 + 1013904223) >>> 0;
    const t = i / fs_;
    x[i] = gain * Math.exp(-t * decay) * (0.7 * Math.sin(2 * Math.PI * freq * t) + 0.3 * ((s / 2 ** 32) * 2 - 1));
  }
  return encodeWav([x], { sampleRate: fs_, bits: 16 });
}

beforeAll(async () => {
  const o = await createUser(db(), owner);
  const v = await createUser(db(), viewer);
  const studio = await createStudio(db(), { name: `E2E Library Studio ${tag}`, ownerId: o.id });
  await addMember(db(), { studioId: studio.id, userId: v.id, role: "viewer" });
  studioId = studio.id;
  let k = 1;
  for (const [drum, freq, decay] of [["Kick", 55, 12], ["Snare", 190, 18]] as const) {
    fs.mkdirSync(path.join(root, drum), { recursive: true });
    for (let v = 1; v <= 3; v++) for (let rr = 1; rr <= 2; rr++) fs.writeFileSync(path.join(root, drum, `${drum.toLowerCase()}_v${v}_rr${rr}.wav`), hit(k++ * 977, freq, 0.15 * v * v, decay));
  }
  fs.writeFileSync(path.join(root, "Snare", "notes.wav"), "not audio at all, just text");
  browser = await launch();
  page = await browser.newPage({ viewport: { width: 1400, height: 1000 } });
});

afterAll(async () => {
  await browser?.close();
  await closeDb();
  fs.rmSync(folder, { recursive: true, force: true });
});

describe("library in the browser", () => {
  it("create, upload a folder, watch it catalogue, relabel, listen, health, plots", async () => {
    await signIn(page, owner.email, owner.password);
    await page.goto(`${BASE}/s/${studioId}/libraries`);
    await page.getByLabel("Library name").fill(`Room kit ${tag}`);
    await page.getByRole("button", { name: "Create library" }).click();
    await page.waitForURL(/\/libraries\/[0-9a-f-]{36}$/);
    await expect.poll(() => page.getByTestId("library-name").textContent()).toBe(`Room kit ${tag}`);

    await uploaderReady(page);

    await page.getByTestId("folder-input").setInputFiles(root);
    await page.getByTestId("upload-summary").waitFor({ timeout: 60_000 });
    const summary = await page.getByTestId("upload-summary").textContent();
    expect(summary).toContain("12 queued for measuring");
    expect(summary).toContain("1 refused");
    expect(await page.getByTestId("refused-list").textContent()).toMatch(/notes\.wav: not a WAV file/);
    await screenshot(page, "library-uploaded");

    await expect.poll(async () => page.getByTestId("count-catalogued").locator("dd").textContent(), { timeout: 90_000, interval: 1000 }).toBe("12");
    await expect.poll(async () => page.getByTestId("progress-status").textContent(), { timeout: 30_000 }).toBe("all catalogued");
    // the folder names became the families once the library is sorted
    await expect.poll(async () => (await page.getByTestId("samples-table").textContent()) ?? "", { timeout: 30_000, interval: 1000 }).toMatch(/kick/);
    await expect.poll(async () => page.getByTestId("sample-row").count(), { timeout: 15_000 }).toBe(12);
    expect(await page.getByTestId("samples-table").textContent()).toContain("Session A/Kick/kick_v1_rr1.wav");
    await screenshot(page, "library-catalogued");

    // search by path words (kick + rr2: 3 files), then a word's middle falls back to "contains", then cleared
    await page.getByLabel("Search paths").fill("kick rr2");
    await expect.poll(async () => page.getByTestId("sample-row").count(), { timeout: 15_000 }).toBe(3);
    expect(await page.getByTestId("samples-table").textContent()).toContain("kick_v2_rr2.wav");
    await page.getByLabel("Search paths").fill("nare_v3");
    await expect.poll(async () => page.getByTestId("sample-row").count(), { timeout: 15_000 }).toBe(2);
    expect(await page.locator("#f-q-hint").textContent()).toMatch(/No path word starts with “nare_v3”: showing paths that contain it/);
    await screenshot(page, "library-search-contains");
    await page.getByLabel("Search paths").fill("");
    await expect.poll(async () => page.getByTestId("sample-row").count(), { timeout: 15_000 }).toBe(12);

    // bulk relabel: the snares become rim shots (sorted by path: the 6 snares come after the 6 kicks)
    await choose(page.getByLabel("Family", { exact: true }), "snare");
    await expect.poll(async () => page.getByTestId("sample-row").count(), { timeout: 15_000 }).toBe(6);
    await page.getByRole("button", { name: "select this page" }).click();
    await choose(page.getByLabel("Set articulation"), "rim-shot");
    await page.getByRole("button", { name: /^Relabel 6/ }).click();
    await page.getByText("Relabelled 6 samples").waitFor();
    await expect.poll(async () => (await page.getByTestId("samples-table").textContent())?.match(/rim-shot/g)?.length ?? 0, { timeout: 20_000 }).toBe(6);
    await screenshot(page, "library-relabelled");
    expect(page.url()).toContain("family=snare");

    // listen: the caution comes first
    await page.getByTestId("sample-row").first().getByRole("button").first().click();
    await page.getByTestId("sample-detail").waitFor();
    await page.getByTestId("waveform").waitFor();
    // what the sound alone says, as bars: the families it weighed, best first, each with its share
    await page.getByTestId("sound-fit").waitFor();
    const fitRows = await page.getByTestId("sound-fit-row").allTextContents();
    expect(fitRows.length).toBeGreaterThanOrEqual(1);
    const shares = fitRows.map((t) => Number(/(\d+) %/.exec(t)![1]));
    expect(shares).toEqual([...shares].sort((a, b) => b - a));
    await page.getByTestId("play").click();
    await page.getByTestId("hearing-caution").waitFor();
    expect(await page.getByTestId("hearing-caution").textContent()).toMatch(/Monitoring levels are your responsibility/);
    await screenshot(page, "library-caution");
    await page.getByRole("button", { name: "I understand, continue" }).click();
    expect(await page.evaluate(() => localStorage.getItem("kw.hearing-caution.v1"))).toBe("yes");
    await page.getByTestId("play").click();
    await expect.poll(async () => page.getByTestId("hearing-caution").count()).toBe(0);

    await page.getByRole("link", { name: "Health" }).click();
    await page.getByTestId("health").waitFor();
    await screenshot(page, "library-health");
    await page.getByRole("link", { name: "Plots" }).click();
    await page.getByTestId("feature-map").waitFor();
    await page.waitForTimeout(500);
    await screenshot(page, "library-plots");
  });

  it("a viewer browses but sees no upload or relabel controls", async () => {
    const ctx = await browser.newContext();
    const p = await ctx.newPage();
    await signIn(p, viewer.email, viewer.password);
    const lib = await db()("libraries").where({ studio_id: studioId }).first("id");
    await p.goto(`${BASE}/s/${studioId}/libraries/${lib.id}`);
    await p.getByTestId("samples-table").waitFor();
    expect(await p.getByTestId("uploader").count()).toBe(0);
    expect(await p.getByTestId("bulk-bar").count()).toBe(0);
    expect(await p.getByText("Library settings").count()).toBe(0);
    await ctx.close();
  });
});
