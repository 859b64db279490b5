/**
 * Chromium for the browser tests: Debian's /usr/bin/chromium under
 * playwright-core, a fresh profile each run, and a guard that records every
 * request leaving 127.0.0.1 so a test can fail on it.
 */
import { chromium, type BrowserContext, type Page } from "playwright-core";
import { mkdtempSync, mkdirSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";

export const BASE_URL = process.env.FANBOUND_BASE_URL ?? "http://127.0.0.1:3100";
export const ARTEFACTS = path.resolve("test-results");

export interface Session {
  context: BrowserContext;
  page: Page;
  /** URLs requested outside 127.0.0.1 (they are blocked, and listed here). */
  outside: string[];
  close(): Promise<void>;
}

export async function openBrowser(): Promise<Session> {
  const profile = mkdtempSync(path.join(tmpdir(), "fanbound-chromium-"));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: "/usr/bin/chromium",
    headless: true,
    viewport: { width: 1360, height: 860 },
    args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
      "--disable-background-networking", "--disable-component-update", "--disable-sync"],
  });
  const outside: string[] = [];
  await context.route("**/*", (route) => {
    const url = new URL(route.request().url());
    const local = url.protocol === "data:" || url.protocol === "blob:" || url.hostname === "127.0.0.1";
    if (local) return route.continue();
    outside.push(route.request().url());
    return route.abort();
  });
  const page = context.pages()[0] ?? (await context.newPage());
  return {
    context,
    page,
    outside,
    async close() {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

export async function screenshot(page: Page, name: string): Promise<string> {
  mkdirSync(ARTEFACTS, { recursive: true });
  const file = path.join(ARTEFACTS, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}

/** Signs in through the sign-in page and waits for the workspace to open. */
export async function signIn(page: Page, email: string, password: string): Promise<void> {
  await page.goto(`${BASE_URL}/signin`);
  await page.fill('input[name="email"]', email);
  await page.fill('input[name="password"]', password);
  await page.click('button[type="submit"]');
  await page.waitForURL(/\/w\//, { timeout: 30_000 });
}
