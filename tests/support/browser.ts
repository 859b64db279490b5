/**
 * Chromium for the browser tests: Debian's /usr/bin/chromium under
 * playwright-core, a fresh profile each run, and a guard that records every
 * request leaving 127.0.0.1 so a test can fail on it.
 */
import type { Page } from "playwright-core";
import { mkdirSync } from "node:fs";
import path from "node:path";
import { launchChromium, type ChromiumSession } from "../../lib/bench/chromium";

export const BASE_URL = process.env.FANBOUND_BASE_URL ?? "http://127.0.0.1:3100";
export const ARTEFACTS = path.resolve("test-results");

export interface Session extends ChromiumSession {
  /** Content-Security-Policy violations the pages reported, and console errors that mention the policy. */
  cspViolations(): Promise<string[]>;
}

/** Chromium as lib/bench/chromium.ts starts it, with every policy violation of its pages kept for the test. */
export async function openBrowser(): Promise<Session> {
  const session = await launchChromium();
  const { context, page } = session;
  // Every document reports policy violations as events; keep them on the window.
  await context.addInitScript(() => {
    const w = window as unknown as { __csp?: string[] };
    w.__csp = [];
    document.addEventListener("securitypolicyviolation", (e) => {
      w.__csp!.push(`${e.violatedDirective} blocked ${e.blockedURI || "inline"} at ${e.sourceFile}:${e.lineNumber}`);
    });
  });
  // Chromium also logs each violation (workers' included) as a console error, across navigations.
  const consoleCsp: string[] = [];
  const watch = (p: Page) =>
    p.on("console", (m) => {
      if (m.type() === "error" && /Content Security Policy/i.test(m.text())) consoleCsp.push(m.text());
    });
  context.pages().forEach(watch);
  context.on("page", watch);
  return {
    ...session,
    async cspViolations() {
      const reported = await page.evaluate(() => (window as unknown as { __csp?: string[] }).__csp ?? []).catch(() => []);
      return [...reported, ...consoleCsp];
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

/**
 * Types text into the focused Monaco editor and closes any completion list it
 * opened (the list can appear a moment after the last key; Enter would then
 * take a suggestion instead of breaking the line).
 */
export async function typeInEditor(page: Page, text: string): Promise<void> {
  await page.keyboard.type(text);
  for (let i = 0; i < 5; i++) {
    await page.waitForTimeout(120);
    await page.keyboard.press("Escape");
    if ((await page.locator(".monaco-editor .suggest-widget.visible").count()) === 0) return;
  }
}
