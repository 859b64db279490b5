/**
 * Debian's Chromium under playwright-core, as the browser tests and the
 * browser benchmark start it: headless, a fresh profile, no background
 * traffic, and every request that would leave 127.0.0.1 blocked and listed.
 */
import { chromium, type BrowserContext, type Page } from "playwright-core";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";

export interface ChromiumSession {
  context: BrowserContext;
  page: Page;
  /** URLs requested outside 127.0.0.1 (they are blocked, and listed here). */
  outside: string[];
  close(): Promise<void>;
}

export async function launchChromium(): Promise<ChromiumSession> {
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
