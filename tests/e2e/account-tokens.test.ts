// The account page in a real browser: make a personal API token (roles offered only up to mine), see its secret
// once, use it from outside the browser, see the use listed, revoke it, and the next request answers 401.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser, Page } from "playwright-core";
import { BASE, launch, screenshot, signIn } from "./browser";
import { db, closeDb } from "@/lib/server/db";
import { addMember, createStudio, createUser } from "@/db/factories";

const tag = Math.random().toString(36).slice(2, 8);
const owner = { name: "Maren Holt", email: `maren-${tag}@example.test`, password: "owner-pass-123", verified: true };
const editor = { name: "Tiago Brandt", email: `tiago-${tag}@example.test`, password: "editor-pass-123", verified: true };
let studioId = "";
let browser: Browser;
let page: Page;

beforeAll(async () => {
  const o = await createUser(db(), owner);
  const e = await createUser(db(), editor);
  const studio = await createStudio(db(), { name: `Tidewater Room ${tag}`, ownerId: o.id });
  await addMember(db(), { studioId: studio.id, userId: e.id, role: "editor" });
  studioId = studio.id;
  browser = await launch();
  page = await browser.newPage({ viewport: { width: 1400, height: 1000 } });
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

const listLibraries = (secret: string) => fetch(`${BASE}/api/studios/${studioId}/libraries`, { headers: { authorization: `Bearer ${secret}` } });

describe("personal API tokens on the account page", () => {
  it("makes a token shown once, lists it with its last use, and revokes it", async () => {
    await signIn(page, editor.email, editor.password);
    await page.getByTestId("signed-in-as").click();
    await page.waitForURL(/\/account$/);
    await expect(page.getByTestId("tokens-none").textContent()).resolves.toContain("no API tokens");
    // an editor may give a token the editor's role or less, never the owner's
    await page.locator("#token-role").click();
    const roles = await page.getByRole("listbox").locator('[role="option"]').evaluateAll((os) => os.map((o) => o.getAttribute("data-value")));
    await page.keyboard.press("Escape");
    await page.getByRole("listbox").waitFor({ state: "detached" });
    expect(roles).toEqual(["editor", "viewer"]);

    await page.getByLabel("Name").fill("Nightly build");
    await page.getByRole("button", { name: "Make token" }).click();
    const secret = (await page.getByTestId("new-token-secret").textContent())!.trim();
    expect(secret).toMatch(/^kwt_[A-Za-z0-9_-]{43}$/);
    await expect(page.getByTestId("new-token").textContent()).resolves.toContain("shown only this once");
    const row = page.locator('[data-testid="token-row"][data-token-name="Nightly build"]');
    await row.waitFor();
    await expect(row.textContent()).resolves.toContain(`${secret.slice(0, 8)}…`);
    await expect(row.getByTestId("token-last-used").textContent()).resolves.toBe("never");
    await screenshot(page, "account-01-token-made");

    // used from outside the browser (no cookie): it works, and the list shows the use
    expect((await listLibraries(secret)).status).toBe(200);
    await page.reload();
    await row.waitFor();
    await expect(row.getByTestId("token-last-used").textContent()).resolves.toMatch(/^\d{4}-\d\d-\d\d \d\d:\d\d$/);
    // shown once: after a reload the secret is nowhere on the page
    expect(await page.content()).not.toContain(secret.slice(8));

    page.once("dialog", (d) => void d.accept());
    await row.getByRole("button", { name: "Revoke" }).click();
    await row.getByTestId("token-state").waitFor();
    await expect(row.getByTestId("token-state").textContent()).resolves.toMatch(/^Revoked \d{4}-\d\d-\d\d$/);
    await screenshot(page, "account-02-token-revoked");
    const after = await listLibraries(secret);
    expect(after.status).toBe(401);
    expect(((await after.json()) as { error: { message: string } }).error.message).toMatch(/^This API token \("Nightly build"\) was revoked/);
  });
});
