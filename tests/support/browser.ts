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

export type Session = ChromiumSession;

export const openBrowser = launchChromium;

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
