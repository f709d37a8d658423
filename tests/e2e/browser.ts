// Browser-test helpers: Debian's Chromium driven by playwright-core (never a downloaded browser), the
// running app of the test profile (scripts/test.sh starts it), and the SMTP fake's mail folder.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { chromium, type Browser, type Locator, type Page } from "playwright-core";
import { encodeWav } from "@/lib/audio/encode";

export const BASE = process.env.KW_APP_URL ?? "http://localhost:3100";
const MAIL_DIR = process.env.KW_MAIL_FAKE_DIR ?? "";

export async function launch(): Promise<Browser> {
  const profile = fs.mkdtempSync(path.join(os.tmpdir(), "kw-chromium-"));
  // playwright gives Chromium a fresh temporary profile itself; XDG_CONFIG_HOME keeps it out of $HOME.
  return chromium.launch({
    env: { ...process.env, XDG_CONFIG_HOME: profile, HOME: profile } as Record<string, string>,
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    headless: true,
    args: ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
  });
}

export async function screenshot(page: Page, name: string): Promise<void> {
  const dir = path.resolve("test-results/screens");
  fs.mkdirSync(dir, { recursive: true });
  await page.screenshot({ path: path.join(dir, `${name}.png`), fullPage: true });
}

export async function signIn(page: Page, email: string, password: string): Promise<void> {
  await page.goto(`${BASE}/sign-in`);
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((u) => !u.pathname.startsWith("/sign-in"), { timeout: 20_000 });
}

/** The newest mail to an address whose text matches, waiting up to timeoutMs; returns its first link. */
export async function waitForMailLink(to: string, pattern: RegExp, timeoutMs = 15_000): Promise<string> {
  const end = Date.now() + timeoutMs;
  while (Date.now() < end) {
    const files = fs.existsSync(MAIL_DIR) ? fs.readdirSync(MAIL_DIR).filter((f) => f.endsWith(".eml")).sort().reverse() : [];
    for (const f of files) {
      const raw = fs.readFileSync(path.join(MAIL_DIR, f), "utf8").replace(/=\r?\n/g, "").replace(/=3D/g, "=");
      if (!raw.toLowerCase().includes(to.toLowerCase())) continue;
      const m = raw.match(/https?:\/\/[^\s]+/g)?.find((l) => pattern.test(l));
      if (m) return m;
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`no mail to ${to} with a link matching ${pattern}`);
}

/**
 * Choose in one of the app's selects (components/ui/select: a button that opens a listbox): by value, by the
 * option's visible label, or by position (the same order as the options in the markup).
 */
export async function choose(control: Locator, option: string | { label: string } | { index: number }): Promise<void> {
  await control.click();
  const list = control.page().getByRole("listbox");
  const item =
    typeof option === "string" ? list.locator(`[role="option"][data-value="${option}"]`)
    : "label" in option ? list.getByRole("option", { name: option.label, exact: true })
    : list.getByRole("option").nth(option.index);
  await item.click();
  await list.waitFor({ state: "detached" });
}

/** Wait until the library page's uploader is hydrated (its inputs have their handlers; files set earlier are lost). */
export async function uploaderReady(page: Page): Promise<void> {
  await page.locator('[data-testid="uploader"][data-ready]').waitFor();
}

/** The value chosen in one of the app's selects ("" for none), as a native select's inputValue() gives it. */
export async function chosen(control: Locator): Promise<string> {
  return (await control.getAttribute("data-value")) ?? "";
}

/** A damped 60 Hz kick-like tone with a click (0.5 s, 48 kHz, 16-bit) scaled by `gain`: a file to upload (invented). */
export function kickWav(gain: number, seed: number): Uint8Array {
  const n = 24_000;
  const x = new Float32Array(n);
  let s = seed;
  for (let i = 0; i < n; i++) {
    s = (s * 1664525 + 1013904223) >>> 0;
    const t = i / 48_000;
    x[i] = gain * (Math.exp(-t * 9) * Math.sin(2 * Math.PI * 60 * t) + 0.2 * Math.exp(-t * 300) * ((s / 2 ** 32) * 2 - 1));
  }
  return encodeWav([x], { sampleRate: 48_000, bits: 16 });
}
