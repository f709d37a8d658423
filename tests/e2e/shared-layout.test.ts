// Shared setups in Chromium: an editor publishes a layout with a description; someone with no account opens the
// link and sees the pads and what they aim at (no kit, sample or studio names); a person signed in to another
// studio imports it; the kit matrix ranks the studio's kits; revoking makes the link a 404 page.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { BASE, launch, screenshot, signIn } from "./browser";
import { db } from "@/lib/server/db";
import { call, makeStudioWithRoles } from "../integration/helpers";
import { smallCatalogue } from "../integration/audit/helpers";
import * as kitsRoute from "@/app/api/studios/[studioId]/kits/route";
import * as layoutsRoute from "@/app/api/studios/[studioId]/layouts/route";

let browser: Browser;
let s: Awaited<ReturnType<typeof makeStudioWithRoles>>;
let layoutId: string;
const tag = Math.random().toString(36).slice(2, 7);

beforeAll(async () => {
  browser = await launch();
  s = await makeStudioWithRoles();
  const cat = await smallCatalogue(db(), s.studio.id);
  layoutId = (await call(layoutsRoute.POST, { params: { studioId: s.studio.id }, user: s.users.editor, body: { name: `Strip ${tag}`, template: "grid-2x8" } })).json.layout.id;
  const slot = (id: string, family: string, instrumentId: string) => ({ id, name: id, family, instrumentId });
  await call(kitsRoute.POST, { params: { studioId: s.studio.id }, user: s.users.editor, body: { name: `Hidden kit ${tag}`, slots: [slot("kick", "kick", cat.kick), slot("snare", "snare", cat.snare), slot("ride-1", "ride", cat.ride)] } });
  await call(kitsRoute.POST, { params: { studioId: s.studio.id }, user: s.users.editor, body: { name: `Kick only ${tag}`, slots: [slot("kick", "kick", cat.kick)] } });
});
afterAll(async () => {
  await browser?.close();
  await db()("studios").whereIn("id", [s.studio.id, s.otherStudio.id]).delete();
  await db().destroy();
});

describe("shared setups in Chromium", () => {
  it("publishes a layout, shows it to anyone with the link, imports it elsewhere, ranks the kits and revokes it", async () => {
    const editor = await browser.newContext({ viewport: { width: 1440, height: 900 } });
    const page = await editor.newPage();
    await signIn(page, s.users.editor.email, s.users.editor.password);
    await page.goto(`${BASE}/s/${s.studio.id}/layouts/${layoutId}`);
    await page.getByLabel("Description (shown on the shared page)").fill("Cymbals on top, drums below.");
    await page.getByRole("button", { name: "Publish" }).click();
    await expect.poll(() => page.getByTestId("share-link").inputValue().catch(() => ""), { timeout: 10_000 }).toMatch(/\/shared\/[A-Za-z0-9_-]{43}$/);
    const link = await page.getByTestId("share-link").inputValue();

    // no account
    const anon = await browser.newContext({ viewport: { width: 390, height: 844 } });
    const a = await anon.newPage();
    await a.goto(link);
    await expect(a.getByTestId("shared-name").textContent()).resolves.toBe(`Strip ${tag}`);
    await expect(a.getByTestId("shared-description").textContent()).resolves.toBe("Cymbals on top, drums below.");
    await expect(a.getByTestId("suggested-pad").count()).resolves.toBe(16);
    const body = (await a.locator("body").textContent()) ?? "";
    for (const secret of [s.studio.name, `Hidden kit ${tag}`, "Snare 14x6.5", s.users.editor.name]) expect(body).not.toContain(secret);
    await expect(a.getByRole("link", { name: "Sign in" }).count()).resolves.toBeGreaterThan(0);
    await screenshot(a, "shared-390-light");
    await anon.close();

    // someone signed in to another studio imports it
    const other = await browser.newContext();
    const o = await other.newPage();
    await signIn(o, s.users.outsider.email, s.users.outsider.password);
    await o.goto(link);
    await o.getByRole("button", { name: "Import into my studio" }).click();
    await o.waitForURL(new RegExp(`/s/${s.otherStudio.id}/layouts/[0-9a-f-]{36}$`));
    await other.close();

    // views counted (two page views), the kit matrix ranks the kits
    await page.reload();
    await expect(page.getByTestId("share-views").textContent()).resolves.toMatch(/^2 views/);
    await page.getByTestId("kit-matrix-link").click();
    await page.getByTestId("kit-matrix").waitFor();
    await expect(page.getByTestId("kit-matrix-row").allTextContents()).resolves.toEqual([expect.stringContaining(`Hidden kit ${tag}`), expect.stringContaining(`Kick only ${tag}`)]);
    await screenshot(page, "kit-matrix-1440-light");

    // revoke: the link is a 404 page at once
    await page.goto(`${BASE}/s/${s.studio.id}/layouts/${layoutId}`);
    await page.getByRole("button", { name: "Stop sharing" }).click();
    await page.getByText("Not shared.").waitFor();
    const gone = await browser.newContext();
    const g = await gone.newPage();
    const res = await g.goto(link);
    expect(res?.status()).toBe(404);
    await gone.close();
    await editor.close();
  }, 180_000);
});
