// The platform in a real browser: sign up, confirm by the caught mail, sign in, create a studio, invite a
// second person, who signs up from the invitation as a viewer and cannot reach editor actions in the UI
// or the API. Also checks the security headers on real responses.
import http from "node:http";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Browser } from "playwright-core";
import { BASE, choose, launch, screenshot, signIn, waitForMailLink } from "./browser";

const tag = Math.random().toString(36).slice(2, 8);
const owner = { name: "Ines Varga", email: `ines-${tag}@example.test`, password: "owner-pass-123" };
const guest = { name: "Bo Lindahl", email: `bo-${tag}@example.test`, password: "viewer-pass-123" };
const studioName = `Saltmarsh Room ${tag}`;
let otherStudioUrl = "";

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

describe("platform flow in Chromium", () => {
  it("sends security headers", async () => {
    const res = await fetch(`${BASE}/sign-in`);
    expect(res.headers.get("content-security-policy")).toMatch(/default-src 'self'.*frame-ancestors 'none'/);
    expect(res.headers.get("x-content-type-options")).toBe("nosniff");
    expect(res.headers.get("x-frame-options")).toBe("DENY");
    expect(res.headers.get("x-powered-by")).toBeNull();
  });

  it("answers TRACE with 405 (the server's guard; Next.js answered 500), never echoing the request", async () => {
    const r = await new Promise<{ status: number; allow?: string; body: string }>((resolve, reject) => {
      const req = http.request(`${BASE}/api/health`, { method: "TRACE", headers: { cookie: "secret=1" } }, (res) => {
        let body = "";
        res.on("data", (c) => (body += c));
        res.on("end", () => resolve({ status: res.statusCode!, allow: res.headers.allow, body }));
      });
      req.on("error", reject);
      req.end();
    });
    expect(r.status).toBe(405);
    expect(r.allow).toMatch(/GET/);
    expect(r.body).not.toContain("secret=1");
  });

  it("signs up, confirms by mail, signs in, creates a studio and invites a viewer who cannot edit", async () => {
    const ctx = await browser.newContext();
    const page = await ctx.newPage();
    await page.goto(`${BASE}/sign-up`);
    await page.getByLabel("Your name").fill(owner.name);
    await page.getByLabel("E-mail").fill(owner.email);
    await page.getByLabel("Password").fill("short");
    await page.getByRole("button", { name: "Create account" }).click();
    await expect(page.getByText("Use at least 10 characters.").isVisible()).resolves.toBe(true);
    await page.getByLabel("Password").fill(owner.password);
    await page.getByRole("button", { name: "Create account" }).click();
    await page.waitForURL(/\/check-mail/);
    await screenshot(page, "platform-01-check-mail");

    // Signing in before confirming is refused with a clear message
    await page.goto(`${BASE}/sign-in`);
    await page.getByLabel("E-mail").fill(owner.email);
    await page.getByLabel("Password").fill(owner.password);
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.getByText(/Confirm your e-mail address first/).waitFor();

    // The caught-mail page shows the link; follow it like a person would
    const verifyLink = await waitForMailLink(owner.email, /\/verify\?token=/);
    await page.goto(`${BASE}/mail`);
    await page.getByTestId("mail-list").waitFor();
    await screenshot(page, "platform-02-mail");
    await page.getByRole("link", { name: verifyLink }).first().click();
    await page.waitForURL(/\/sign-in\?notice=verified/);
    await page.getByText("Your address is confirmed").waitFor();
    await signIn(page, owner.email, owner.password);
    await page.waitForURL(/\/studios/);

    await page.getByLabel("Studio name").fill(studioName);
    await page.getByRole("button", { name: "Create studio" }).click();
    await page.waitForURL(/\/s\/[0-9a-f-]{36}$/);
    await expect(page.getByTestId("studio-name").textContent()).resolves.toBe(studioName);
    const studioUrl = page.url();
    await screenshot(page, "platform-03-studio");

    await page.getByRole("link", { name: "Members" }).click();
    await page.getByLabel("E-mail").fill(guest.email);
    await choose(page.getByLabel("Role", { exact: true }), "viewer");
    await page.getByRole("button", { name: "Send invitation" }).click();
    await page.getByText(`Invitation sent to ${guest.email}`).waitFor();
    await page.getByTestId("invitations").getByText(guest.email).waitFor();
    await screenshot(page, "platform-04-members");

    // A second studio, then the switcher takes me back to the same section of the first
    await page.goto(`${BASE}/studios`);
    await page.getByLabel("Studio name").fill(`${studioName} B`);
    await page.getByRole("button", { name: "Create studio" }).click();
    await page.waitForURL((u) => /\/s\/[0-9a-f-]{36}$/.test(u.pathname) && u.toString() !== studioUrl);
    otherStudioUrl = page.url();
    await page.getByRole("link", { name: "Members" }).click();
    await page.waitForURL(/\/members$/);
    await choose(page.getByLabel("Switch studio"), { label: studioName });
    await page.waitForURL(`${studioUrl}/members`);
    await page.getByTestId("invitations").getByText(guest.email).waitFor();

    // Signing out ends the session: the studio list sends me to sign in
    await page.getByRole("button", { name: "Sign out" }).click();
    await page.waitForURL(/\/sign-in/);
    await page.goto(`${BASE}/studios`);
    await page.waitForURL(/\/sign-in\?next=/);
    await ctx.close();

    // The guest opens the invitation link in a fresh browser and creates an account from it
    const gctx = await browser.newContext();
    const g = await gctx.newPage();
    const inviteLink = await waitForMailLink(guest.email, /\/invite\//);
    await g.goto(inviteLink);
    await g.getByText(`Join “${studioName}”`).waitFor();
    await screenshot(g, "platform-05-invite");
    await g.getByRole("link", { name: "Create an account" }).click();
    await g.getByLabel("Your name").fill(guest.name);
    await expect(g.getByLabel("E-mail").inputValue()).resolves.toBe(guest.email);
    await g.getByLabel("Password").fill(guest.password);
    await g.getByRole("button", { name: "Create account" }).click();
    await g.waitForURL(studioUrl);
    await expect(g.getByTestId("my-role").textContent()).resolves.toBe("you: viewer");

    // A viewer sees no editor or owner controls ...
    await expect(g.getByRole("link", { name: "Activity" }).count()).resolves.toBe(0);
    await g.getByRole("link", { name: "Members" }).click();
    await g.getByTestId("members-table").waitFor();
    await expect(g.getByRole("button", { name: "Send invitation" }).count()).resolves.toBe(0);
    await expect(g.getByRole("button", { name: "Remove" }).count()).resolves.toBe(0);
    await screenshot(g, "platform-06-viewer-members");
    await g.goto(`${studioUrl}/activity`);
    await g.getByTestId("not-allowed").waitFor();

    // ... and the API refuses them too
    const studioId = studioUrl.split("/").pop()!;
    const status = await g.evaluate(async (id) => {
      const r = await fetch(`/api/studios/${id}/invitations`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ email: "x@example.test", role: "owner" }) });
      return r.status;
    }, studioId);
    expect(status).toBe(403);

    // A studio the guest is not in does not exist for them: its pages answer 404, not a page saying so
    for (const path of ["", "/libraries", "/members"]) {
      const res = await g.goto(`${otherStudioUrl}${path}`);
      expect(res?.status(), path).toBe(404);
    }
    await gctx.close();
  });

  it("the caught-mail page shows a signed-out visitor nobody else's mail, not even a reset link they asked for", async () => {
    const ctx = await browser.newContext();
    const page = await ctx.newPage();
    await page.goto(`${BASE}/forgot`);
    const status = await page.evaluate(async (email) => (await fetch("/api/auth/password-reset", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ email }) })).status, owner.email);
    expect(status).toBe(202);
    await waitForMailLink(owner.email, /\/reset\?token=/);
    await page.goto(`${BASE}/mail`);
    await page.getByTestId("mail-none").waitFor();
    await expect(page.locator("a[href*='/reset?token=']").count()).resolves.toBe(0);
    await expect(page.locator("a[href*='/verify?token=']").count()).resolves.toBe(0);
    await screenshot(page, "platform-07-mail-signed-out");
    // signed in, the owner reads their own reset mail
    await signIn(page, owner.email, owner.password);
    await page.goto(`${BASE}/mail`);
    await expect(page.locator("a[href*='/reset?token=']").count()).resolves.toBeGreaterThan(0);
    await expect(page.getByTestId("mail-to").allTextContents()).resolves.toEqual(expect.arrayContaining([owner.email]));
    for (const to of await page.getByTestId("mail-to").allTextContents()) expect(to).toBe(owner.email);
    await ctx.close();
  });
});
