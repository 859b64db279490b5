import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { existsSync, statSync } from "node:fs";
import { BASE_URL, openBrowser, screenshot, type Session } from "../support/browser";

describe("landing and sign-in pages in chromium", () => {
  let s: Session;
  beforeAll(async () => {
    s = await openBrowser();
  });
  afterAll(async () => {
    await s?.close();
  });

  it("serves the landing page in the product's look, with nothing fetched from outside", async () => {
    const res = await s.page.goto(`${BASE_URL}/`, { waitUntil: "networkidle" });
    expect(res?.status()).toBe(200);
    await expect(s.page.locator("h1").innerText()).resolves.toContain("gates a logic family can build");
    // The product's own paper background (#f6f4ee, app/globals.css; a choice of ours, no outside source) is what the body shows.
    const bg = await s.page.evaluate(() => getComputedStyle(document.documentElement).backgroundColor);
    expect(bg).toBe("rgb(246, 244, 238)");
    // The interface face is the shipped one, not a system fallback.
    const fontLoaded = await s.page.evaluate(async () => {
      await document.fonts.ready;
      return [...document.fonts].some((f) => f.status === "loaded");
    });
    expect(fontLoaded).toBe(true);
    const file = await screenshot(s.page, "landing");
    expect(statSync(file).size).toBeGreaterThan(10_000);
    expect(s.outside).toEqual([]);
    expect(await s.cspViolations()).toEqual([]);
  });

  it("serves the sign-in page and rejects a wrong password with a clear message", async () => {
    const res = await s.page.goto(`${BASE_URL}/signin`, { waitUntil: "networkidle" });
    expect(res?.status()).toBe(200);
    await s.page.fill('input[name="email"]', "nobody@ferrow.example");
    await s.page.fill('input[name="password"]', "not-the-password");
    await s.page.click('button[type="submit"]');
    // Next's route announcer is an alert too; the form's own alert is the one inside the form.
    await expect(s.page.locator("form [role=alert]").innerText({ timeout: 15_000 })).resolves.toMatch(/not right/);
    const file = await screenshot(s.page, "signin");
    expect(existsSync(file)).toBe(true);
    expect(s.outside).toEqual([]);
  });
});
