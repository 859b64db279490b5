import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Page } from "playwright-core";
import path from "node:path";
import { ARTEFACTS, BASE_URL, openBrowser, screenshot, signIn, typeInEditor, type Session } from "../support/browser";
import { DEMO_PASSWORD } from "../../lib/scripts/demo.mjs";
import { FIGURE_KEYS } from "../../lib/review";

// Monaco draws spaces as no-break spaces.
const editorText = async (page: Page, scope = "") => (await page.locator(`${scope} .monaco-editor .view-lines`.trim()).first().innerText()).replace(/\u00a0/g, " ");
const draftStatus = (page: Page) => page.locator('[data-testid="draft-state"]').getAttribute("data-status");

async function openLibrary(page: Page) {
  await page.goto(`${BASE_URL}/w/ferrow-controls/libraries`);
  await page.getByRole("link", { name: "Ferrow lock blocks" }).click();
  await page.waitForSelector('[data-testid="revisions-gate_core"]');
}

/** The newest revision number listed for a block on its library page. */
async function newestRevision(page: Page, block: string): Promise<number> {
  const labels = await page.locator(`[data-testid="revisions-${block}"] tbody tr[data-testid^="revision-"]`).evaluateAll((rows) => rows.map((r) => r.getAttribute("data-testid")!));
  return Math.max(...labels.map((l) => Number(l.split("-").pop())));
}

/** The number of gates on the workbench's Gates tab, "Gates (25)". */
async function gatesTabCount(page: Page): Promise<number> {
  const text = await page.getByRole("tab", { name: /^Gates/ }).innerText();
  return Number(/\((\d+)\)/.exec(text)?.[1] ?? NaN);
}

/** A figure in a block's upgrade notice: column 1 the design with the revision it uses, 2 with the newer one. */
async function deltaCell(page: Page, block: string, figure: string, column: 1 | 2): Promise<number> {
  const row = page.locator(`[data-testid="deltas-${block}"] tbody tr[data-figure="${figure}"]`);
  return Number((await row.locator("td").nth(column).innerText()).replace(/[^\d.]/g, ""));
}

describe("shared block libraries in chromium: publish, use, upgrade", () => {
  let s: Session;
  beforeAll(async () => {
    s = await openBrowser();
    await signIn(s.page, "designer@ferrow.example", DEMO_PASSWORD);
  });
  afterAll(async () => {
    await s?.close();
  });

  it("lists the libraries from the navigation, and a library's blocks with figures and where each revision is used", async () => {
    const { page } = s;
    await page.getByRole("link", { name: "Libraries", exact: true }).click();
    await page.waitForURL(/\/libraries$/);
    const table = page.locator('[data-testid="library-table"]');
    await expect.poll(() => table.innerText(), { timeout: 15_000 }).toContain("Ferrow lock blocks");
    expect(await table.innerText()).toMatch(/vote2of3 r2 \(a, b, c\) → \(m\)/);
    await screenshot(page, "libraries-list");
    await openLibrary(page);
    // The demo's voted-sensor interlock uses vote2of3 r1 in its revision 1 and r2 in its revision 2.
    expect(await page.locator('[data-testid="used-by-vote2of3-1"]').innerText()).toMatch(/Gate permits, voted level sensors\s+r1/);
    expect(await page.locator('[data-testid="used-by-vote2of3-2"]').innerText()).toMatch(/Gate permits, voted level sensors\s+r2/);
    expect(await page.locator('[data-testid="used-by-level_decode-1"]').innerText()).toMatch(/Level band lamps\s+r1, r2/);
    await screenshot(page, "library-page");
  });

  it("publishes a new revision of a block from the library page", async () => {
    const { page } = s;
    await openLibrary(page);
    const before = await newestRevision(page, "gate_core");
    await page.locator('section[aria-label="Block gate_core"]').getByRole("button", { name: "Publish a new revision" }).click();
    const form = page.locator('form[aria-label="Publish a block revision"]');
    await form.locator(".monaco-editor textarea").waitFor();
    // The form starts from the newest revision's source.
    await expect.poll(() => editorText(page, 'form[aria-label="Publish a block revision"]'), { timeout: 15_000 }).toContain("permit = safe * other_shut * (level + key)");
    await form.locator(".monaco-editor .view-lines").click();
    await page.keyboard.press("Control+End");
    await typeInEditor(page, "// figures for the 3.3 V display board");
    await form.getByLabel("Figures for").selectOption({ label: "Low-voltage CMOS, 3.3 V" });
    await form.getByLabel("What changed").fill("Figures for the 3.3 V board");
    await screenshot(page, "library-publish-form");
    await form.getByRole("button", { name: "Publish" }).click();
    await expect.poll(() => newestRevision(page, "gate_core"), { timeout: 30_000 }).toBe(before + 1);
    const row = page.locator(`[data-testid="revision-gate_core-${before + 1}"]`);
    expect(await row.innerText()).toMatch(/published[\s\S]*Figures for the 3.3 V board[\s\S]*Low-voltage CMOS, 3.3 V/);
    await screenshot(page, "library-published");
  });

  it("offers the newer revision in a design that uses the block, with the figure deltas, and moves the draft to it", async () => {
    const { page } = s;
    await openLibrary(page);
    const newest = await newestRevision(page, "gate_core");
    await page.goto(`${BASE_URL}/w/ferrow-controls`);
    await page.getByRole("link", { name: "Gate permits, voted level sensors" }).click();
    await page.waitForSelector(".monaco-editor textarea");
    const notice = page.locator('[data-testid="library-notice"]');
    await expect.poll(() => notice.innerText(), { timeout: 30_000 }).toContain("A newer revision of gate_core is available");
    expect(await notice.innerText()).toContain(`r${newest}`);
    // The design's own figures now and with the newer revision (the draft compiled once more with the number moved),
    // and the block's stored figures of both revisions: every figure row is in each.
    // The compare view's rows (FIGURE_KEYS) and the heaviest load.
    await expect.poll(() => page.locator('[data-testid="deltas-gate_core"] tbody tr').count(), { timeout: 30_000 }).toBe(FIGURE_KEYS.length + 1);
    expect(await page.locator('[data-testid="block-deltas-gate_core"] tbody tr').count()).toBe(5);
    // "with rN" is the design as it compiles now: its gates are the Gates tab's count, not the block's.
    expect(await gatesTabCount(page)).toBe(await deltaCell(page, "gate_core", "gates", 1));
    await screenshot(page, "library-upgrade-offered");
    const used = (await editorText(page)).match(/use gate_core from "lock-blocks" at (\d+)/)![1];
    await notice.getByRole("button", { name: `Move to r${newest}` }).click();
    await expect.poll(() => editorText(page), { timeout: 10_000 }).toContain(`use gate_core from "lock-blocks" at ${newest}`);
    expect(Number(used)).toBeLessThan(newest);
    // The draft hook keeps the changed text on the server; the notice goes once the new text has compiled.
    await expect.poll(() => draftStatus(page), { timeout: 15_000 }).toBe("kept");
    await expect.poll(() => notice.count(), { timeout: 30_000 }).toBe(0);
    await expect.poll(() => page.locator('[data-testid="compile-status"]').innerText(), { timeout: 30_000 }).toBe("up to date · verified");
    await screenshot(page, "library-upgraded");
    await page.reload();
    await page.waitForSelector(".monaco-editor textarea");
    await expect.poll(() => editorText(page), { timeout: 15_000 }).toContain(`use gate_core from "lock-blocks" at ${newest}`);
  });

  it("uses a library block in a new design, completing the use line, then upgrades it", async () => {
    const { page } = s;
    await page.goto(`${BASE_URL}/w/ferrow-controls`);
    await page.getByRole("button", { name: "New design" }).click();
    await page.fill('input[name="name"]', `Sluice vote ${Date.now()}`);
    await page.getByRole("button", { name: "Create" }).click();
    await page.waitForURL(/\/d\//);
    await page.waitForSelector(".monaco-editor textarea");
    await page.click(".monaco-editor");
    await typeInEditor(page, "inputs p1, p2, p3, armed");
    await page.keyboard.press("Enter");
    await typeInEditor(page, "outputs open_sluice");
    await page.keyboard.press("Enter");
    // Completion offers the library's blocks on a use line, with where they come from.
    await page.keyboard.type("use vote");
    const suggest = page.locator(".monaco-editor .suggest-widget.visible");
    await expect.poll(() => suggest.innerText().catch(() => ""), { timeout: 10_000 }).toContain("vote2of3");
    await screenshot(page, "library-completion");
    await page.keyboard.press("Escape");
    // After "at", the block's revisions, the latest marked.
    await page.keyboard.type('2of3 from "lock-blocks" at ');
    await expect.poll(() => suggest.innerText().catch(() => ""), { timeout: 10_000 }).toMatch(/2\s*latest/);
    expect(await suggest.innerText()).toMatch(/\b1\b/);
    await screenshot(page, "library-completion-revision");
    await page.keyboard.press("Escape");
    await typeInEditor(page, "1");
    await page.keyboard.press("Enter");
    await typeInEditor(page, "open_sluice = armed * vote2of3(p1, p2, p3)");
    const notice = page.locator('[data-testid="library-notice"]');
    await expect.poll(() => notice.innerText().catch(() => ""), { timeout: 30_000 }).toContain("A newer revision of vote2of3 is available");
    await expect.poll(() => page.locator('[data-testid="compile-status"]').innerText(), { timeout: 30_000 }).toBe("up to date · verified");
    await page.getByRole("tab", { name: "Truth table" }).click();
    // The table is worked out in the browser with the server's answer for the use line. armed · (two of p1, p2, p3),
    // armed the least significant bit: ON at 0111, 1011, 1101, 1111 = 7, 11, 13, 15 (by hand).
    const onRows = () => page.locator('[data-testid="truth-table"] tbody tr').evaluateAll((rows) =>
      rows.filter((r) => r.lastElementChild?.textContent?.trim() === "1").map((r) => Number(r.firstElementChild?.textContent)));
    await expect.poll(onRows, { timeout: 15_000 }).toEqual([7, 11, 13, 15]);
    await screenshot(page, "library-used");
    // Hovering a library block shows its ports and the figures stored with its revision.
    await page.locator(".monaco-editor .view-line span", { hasText: /^vote2of3$/ }).last().hover();
    const hover = page.locator(".monaco-editor .monaco-hover:not(.hidden)");
    await expect.poll(() => hover.innerText().catch(() => ""), { timeout: 10_000 }).toContain("Ports: (a, b, c) → (m)");
    expect(await hover.innerText()).toMatch(/A newer revision is available: r2/);
    // The hover floats over the page: a full-page capture re-lays the page out and drops it, so this one is the view.
    await page.screenshot({ path: path.join(ARTEFACTS, "library-hover.png") });
    await page.mouse.move(0, 0);
    // The figures offered for r2 are the ones the design has once it moves.
    await expect.poll(() => page.locator('[data-testid="deltas-vote2of3"] tbody tr').count(), { timeout: 30_000 }).toBe(FIGURE_KEYS.length + 1);
    const offered = await deltaCell(page, "vote2of3", "gates", 2);
    expect(await deltaCell(page, "vote2of3", "gates", 1)).toBe(await gatesTabCount(page));
    await notice.getByRole("button", { name: "Move to r2" }).click();
    await expect.poll(() => editorText(page), { timeout: 10_000 }).toContain('use vote2of3 from "lock-blocks" at 2');
    await expect.poll(() => notice.count(), { timeout: 30_000 }).toBe(0);
    await expect.poll(() => page.locator('[data-testid="compile-status"]').innerText(), { timeout: 30_000 }).toBe("up to date · verified");
    expect(await gatesTabCount(page)).toBe(offered);
    expect(s.outside).toEqual([]);
    expect(await s.cspViolations()).toEqual([]);
  });
});
