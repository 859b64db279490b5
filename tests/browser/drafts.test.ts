import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Page } from "playwright-core";
import { BASE_URL, openBrowser, screenshot, signIn, typeInEditor, type Session } from "../support/browser";
import { DEMO_PASSWORD } from "../../lib/scripts/demo.mjs";

/** Creates a design from the workspace home and returns its address. */
async function newDesign(page: Page, name: string): Promise<string> {
  await page.goto(`${BASE_URL}/w/ferrow-controls`);
  await page.getByRole("button", { name: "New design" }).click();
  await page.fill('input[name="name"]', name);
  await page.getByRole("button", { name: "Create" }).click();
  await page.waitForURL(/\/d\//);
  await page.waitForSelector(".monaco-editor textarea");
  return page.url();
}

async function typeAtEnd(page: Page, text: string) {
  await page.click(".monaco-editor .view-lines");
  await page.keyboard.press("Control+End");
  await typeInEditor(page, text);
}

// Monaco draws spaces as no-break spaces.
const editorText = async (page: Page) => (await page.locator(".monaco-editor .view-lines").innerText()).replace(/\u00a0/g, " ");
const draftStatus = (page: Page) => page.locator('[data-testid="draft-state"]').getAttribute("data-status");

describe("drafts in chromium", () => {
  let s: Session;
  beforeAll(async () => {
    s = await openBrowser();
    await signIn(s.page, "designer@ferrow.example", DEMO_PASSWORD);
  });
  afterAll(async () => {
    await s?.close();
  });

  it("keeps typed text on the server without a save, and says so only once the server has it", async () => {
    const { page } = s;
    const url = await newDesign(page, `Weir draft ${Date.now()}`);
    expect(await draftStatus(page)).toBe("kept");
    const put = page.waitForRequest((r) => r.url().endsWith("/draft") && r.method() === "PUT", { timeout: 15_000 });
    await typeAtEnd(page, "// sluice notes kept as I type");
    // Until the server answers, the page does not claim the text is kept.
    expect(await draftStatus(page)).not.toBe("kept");
    await put;
    await expect.poll(() => draftStatus(page), { timeout: 15_000 }).toBe("kept");
    await screenshot(page, "draft-kept");
    await page.reload();
    await page.waitForSelector(".monaco-editor textarea");
    await expect.poll(() => editorText(page), { timeout: 15_000 }).toContain("sluice notes kept as I type");
    expect(page.url()).toBe(url);
    expect(s.outside).toEqual([]);
  });

  it("asks before leaving a page whose text the server does not have yet", async () => {
    const { page } = s;
    await newDesign(page, `Weir leave ${Date.now()}`);
    // Hold the draft's write so the text stays unsent while the page is left.
    await page.route("**/draft", () => {});
    await typeAtEnd(page, "// not sent yet");
    const dialog = new Promise<string>((resolve) => page.once("dialog", (d) => {
      resolve(d.type());
      void d.dismiss();
    }));
    await page.close({ runBeforeUnload: true });
    expect(await dialog).toBe("beforeunload");
    s.page = await s.context.newPage();
  });

  it("shows a conflict when two tabs change the same draft, and lets the designer take the other text", async () => {
    const a = s.page;
    const url = await newDesign(a, `Weir two tabs ${Date.now()}`);
    const b = await s.context.newPage();
    await b.goto(url);
    await b.waitForSelector(".monaco-editor textarea");
    // Both tabs change the draft of version 1; tab A's write lands first.
    await typeAtEnd(a, "// from tab A");
    await typeAtEnd(b, "// from tab B");
    await expect.poll(() => draftStatus(a), { timeout: 15_000 }).toBe("kept");
    const banner = b.locator('[data-testid="draft-conflict"]');
    await expect.poll(() => banner.count(), { timeout: 15_000 }).toBe(1);
    expect(await draftStatus(b)).toBe("conflict");
    expect(await banner.innerText()).toContain("Dev Ashdown");
    await b.getByRole("button", { name: "Show theirs" }).click();
    expect(await b.locator('[data-testid="their-draft"]').innerText()).toContain("from tab A");
    await screenshot(b, "draft-conflict");
    // Tab B's text was not written over tab A's.
    await a.reload();
    await a.waitForSelector(".monaco-editor textarea");
    await expect.poll(() => editorText(a), { timeout: 15_000 }).toContain("from tab A");
    expect(await editorText(a)).not.toContain("from tab B");

    await b.getByRole("button", { name: "Take theirs" }).click();
    await expect.poll(() => editorText(b), { timeout: 10_000 }).toContain("from tab A");
    expect(await editorText(b)).not.toContain("from tab B");
    expect(await draftStatus(b)).toBe("kept");
    await b.close();
  });

  it("lets the designer keep their own text over the other tab's, which the server then holds", async () => {
    const a = s.page;
    const url = await newDesign(a, `Weir keep mine ${Date.now()}`);
    const b = await s.context.newPage();
    await b.goto(url);
    await b.waitForSelector(".monaco-editor textarea");
    await typeAtEnd(a, "// first writer");
    await typeAtEnd(b, "// second writer keeps this");
    await expect.poll(() => b.locator('[data-testid="draft-conflict"]').count(), { timeout: 15_000 }).toBe(1);
    await b.getByRole("button", { name: "Keep my text" }).click();
    await expect.poll(() => draftStatus(b), { timeout: 15_000 }).toBe("kept");
    const c = await s.context.newPage();
    await c.goto(url);
    await c.waitForSelector(".monaco-editor textarea");
    await expect.poll(() => editorText(c), { timeout: 15_000 }).toContain("second writer keeps this");
    expect(await editorText(c)).not.toContain("first writer");
    await b.close();
    await c.close();
    expect(s.outside).toEqual([]);
  });
});
