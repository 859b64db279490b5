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

/**
 * `keepCache`: Playwright's request routing turns the browser's HTTP cache off, so a "warm" page load would
 * fetch every script again. With it, requests outside 127.0.0.1 are stopped by the browser's own host
 * resolver instead (every other host resolves to nothing) and listed by watching requests, and the cache works
 * as it does for a designer.
 */
export async function launchChromium({ keepCache = false }: { keepCache?: boolean } = {}): Promise<ChromiumSession> {
  const profile = mkdtempSync(path.join(tmpdir(), "fanbound-chromium-"));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: "/usr/bin/chromium",
    headless: true,
    viewport: { width: 1360, height: 860 },
    args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
      "--disable-background-networking", "--disable-component-update", "--disable-sync",
      ...(keepCache ? ["--host-resolver-rules=MAP * ~NOTFOUND, EXCLUDE 127.0.0.1"] : [])],
  });
  const outside: string[] = [];
  const isLocal = (u: string) => {
    const url = new URL(u);
    return url.protocol === "data:" || url.protocol === "blob:" || url.hostname === "127.0.0.1";
  };
  if (keepCache) context.on("request", (r) => { if (!isLocal(r.url())) outside.push(r.url()); });
  else await context.route("**/*", (route) => {
    if (isLocal(route.request().url())) return route.continue();
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
