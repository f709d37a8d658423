// When the connection drops during an upload (server restarted, network gone), the uploader says which files
// did not get through and offers to send them again; the retry lands them. The drop is simulated by aborting
// the upload requests in the browser (playwright route interception), then letting them through.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import type { Browser } from "playwright-core";
import { BASE, launch, signIn, uploaderReady } from "./browser";
import { db, closeDb } from "@/lib/server/db";
import { createStudio, createUser } from "@/db/factories";
import { encodeWav } from "@/lib/audio/encode";

const tag = Math.random().toString(36).slice(2, 8);
const owner = { email: `retry-${tag}@example.test`, name: "Retry Owner", password: "correct-horse-9" };
let browser: Browser;
let studioId: string;
const dir = fs.mkdtempSync(path.join(os.tmpdir(), "kw-retry-"));

beforeAll(async () => {
  const o = await createUser(db(), owner);
  studioId = (await createStudio(db(), { name: `Retry Studio ${tag}`, ownerId: o.id })).id;
  for (const k of [1, 2]) {
    const x = Float32Array.from({ length: 9600 }, (_, i) => 0.3 * Math.exp(-i / 2000) * Math.sin((2 * Math.PI * 200 * k * i) / 48_000));
    fs.writeFileSync(path.join(dir, `tom_v${k}.wav`), encodeWav([x], { sampleRate: 48_000, bits: 16 }));
  }
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
  fs.rmSync(dir, { recursive: true, force: true });
});

describe("upload retry", () => {
  it("names the files that did not get through and sends them again on request", async () => {
    const page = await browser.newPage();
    await signIn(page, owner.email, owner.password);
    await page.goto(`${BASE}/s/${studioId}/libraries`);
    await page.getByLabel("Library name").fill(`Retry kit ${tag}`);
    await page.getByRole("button", { name: "Create library" }).click();
    await page.waitForURL(/\/libraries\/[0-9a-f-]{36}$/);

    await page.route("**/uploads", (route) => route.abort("connectionreset"));
    await uploaderReady(page);
    await page.getByTestId("file-input").setInputFiles([path.join(dir, "tom_v1.wav"), path.join(dir, "tom_v2.wav")]);
    await page.getByTestId("upload-failed").waitFor({ timeout: 30_000 });
    expect(await page.getByTestId("upload-failed").textContent()).toMatch(/2 files did not get through/);

    await page.unroute("**/uploads");
    await page.getByRole("button", { name: "Send them again" }).click();
    await expect.poll(async () => page.getByTestId("upload-summary").textContent(), { timeout: 30_000 }).toMatch(/2 queued for measuring/);
    expect(await page.getByTestId("upload-failed").count()).toBe(0);
  }, 120_000);
});
