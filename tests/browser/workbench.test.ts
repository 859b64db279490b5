import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { BASE_URL, openBrowser, screenshot, signIn, typeInEditor, type Session } from "../support/browser";
import { DEMO_PASSWORD } from "../../lib/scripts/demo.mjs";
import { readFileSync } from "node:fs";
import { compileNow } from "../../lib/pipeline/index";
import { BUILT_IN_FAMILIES } from "../../lib/families/index";

/** Product terms of an SOP expression as sets of literals, so term and literal order do not matter. */
function terms(expr: string): string[] {
  return expr
    .split("+")
    .map((t) => t.split("*").map((l) => l.trim()).sort().join("*"))
    .sort();
}

describe("the designer's workbench in chromium", () => {
  let s: Session;
  beforeAll(async () => {
    s = await openBrowser();
  });
  afterAll(async () => {
    await s?.close();
  });

  it("lets the designer create a design, type equations, watch the result follow and save a revision", async () => {
    const { page } = s;
    await signIn(page, "designer@ferrow.example", DEMO_PASSWORD);
    await page.waitForSelector('[data-testid="design-table"] tbody tr a');
    await screenshot(page, "workspace-home");

    const name = `Weir sluice ${Date.now()}`;
    await page.getByRole("button", { name: "New design" }).click();
    await page.fill('input[name="name"]', name);
    await page.getByRole("button", { name: "Create" }).click();
    await page.waitForURL(/\/d\//);
    await page.waitForSelector(".monaco-editor textarea");

    // Type a small design line by line (Escape closes any completion list before Enter).
    await page.click(".monaco-editor");
    const lines = ["inputs a, b, c", "outputs f", "f = a * b + a * b' * c"];
    for (const [i, line] of lines.entries()) {
      await typeInEditor(page, line);
      if (i < lines.length - 1) await page.keyboard.press("Enter");
    }
    // a·b + a·b'·c = a·b + a·c (absorption: x + x'y = x + y, with x = b inside a) — Boolean algebra, any textbook.
    const expr = page.locator('[data-output="f"] [data-testid="expression"]');
    await expect.poll(async () => terms(await expr.innerText()), { timeout: 30_000 }).toEqual(["a*b", "a*c"]);
    await page.getByRole("tab", { name: /Gates/ }).click();
    const rowsBefore = await page.locator('[data-testid="gate-table"] tbody tr[data-gate]').count();
    expect(rowsBefore).toBeGreaterThan(0);

    // Add a term that absorbs everything with a: the cover shrinks to the single literal a.
    await page.click(".monaco-editor .view-lines");
    await page.keyboard.press("Control+End");
    await typeInEditor(page, " + a * c'");
    await page.getByRole("tab", { name: "Minimized" }).click();
    // a·b + a·b'·c + a·c' = a (every combination with a = 1 is covered) — checked by hand over the 4 cases of b, c.
    await expect.poll(async () => (await expr.innerText()).trim(), { timeout: 30_000 }).toBe("a");
    await page.getByRole("tab", { name: /Gates/ }).click();
    await expect.poll(() => page.locator('[data-testid="gate-table"] tbody tr[data-gate]').count(), { timeout: 10_000 }).not.toBe(rowsBefore);
    await screenshot(page, "workbench-typed");

    await page.keyboard.press("Control+s");
    await page.fill("#rev-message", "Sluice opens whenever the weir is armed");
    await page.getByRole("button", { name: "Save", exact: true }).click();
    const row = page.locator('[data-testid="revision-list"] tr[data-revision="1"]');
    await expect.poll(() => row.innerText(), { timeout: 20_000 }).toContain("Sluice opens whenever the weir is armed");
    await screenshot(page, "workbench-saved");

    // A fan-in the family cannot have is refused at the field, with what to type instead.
    await page.getByLabel("Fan-in override").fill("1");
    await expect.poll(() => page.locator('[data-testid="settings"] [role=alert]').innerText()).toMatch(/from 2 to 64/);
    await page.getByLabel("Fan-in override").fill("");
    expect(s.outside).toEqual([]);
    // The Content-Security-Policy (proxy.ts) lets the editor, its worker and the app run: nothing was blocked.
    expect(await page.locator(".monaco-editor .view-lines").count()).toBeGreaterThan(0);
    expect(await s.cspViolations()).toEqual([]);
  });

  it("lets the designer rename and archive a design from the workspace home", async () => {
    const { page } = s;
    await page.goto(`${BASE_URL}/w/ferrow-controls`);
    const row = page.locator('[data-testid="design-table"] tbody tr', { hasText: "Weir sluice" }).first();
    await row.getByRole("button", { name: "Rename" }).click();
    const renamed = `Weir sluice permit ${Date.now()}`;
    const field = page.locator('[data-testid="design-table"] input[aria-label^="New name for Weir sluice"]');
    await field.fill(renamed);
    await field.press("Enter");
    await expect.poll(() => page.getByRole("link", { name: renamed }).count(), { timeout: 10_000 }).toBe(1);
    const current = page.locator('[data-testid="design-table"] tbody tr', { hasText: renamed });
    await current.getByRole("button", { name: "Archive" }).click();
    await expect.poll(() => page.getByRole("link", { name: renamed }).count(), { timeout: 10_000 }).toBe(0);
    await page.getByLabel("Archived").check();
    await expect.poll(() => page.getByRole("link", { name: renamed }).count(), { timeout: 10_000 }).toBe(1);
    await screenshot(page, "workspace-archived");
    await page.getByLabel("Archived").uncheck();
    expect(s.outside).toEqual([]);
  });

  it("draws the schematic with one symbol per netlist gate, the critical path marked", async () => {
    const { page } = s;
    await page.goto(`${BASE_URL}/w/ferrow-controls`);
    const compiled = page.waitForResponse((r) => r.url().endsWith("/api/v1/compile") && r.status() === 200, { timeout: 30_000 });
    await page.getByRole("link", { name: "Chamber interlock" }).click();
    const body = (await (await compiled).json()) as { result: { netlist: { gates: unknown[] } } };
    const n = body.result.netlist.gates.length;
    expect(n).toBeGreaterThan(5);
    await expect.poll(() => page.locator('[data-testid="schematic"] g[data-gate]').count(), { timeout: 20_000 }).toBe(n);
    expect(await page.locator('[data-testid="schematic"] polyline.stroke-accent').count()).toBeGreaterThan(0);
    // A click on a symbol finds its row in the gate table.
    const first = page.locator('[data-testid="schematic"] g[data-gate]').first();
    const id = await first.getAttribute("data-gate");
    await first.click();
    await expect.poll(() => page.locator(`#gate-row-${id}`).getAttribute("class")).toContain("bg-accent");
    await screenshot(page, "schematic");
    expect(s.outside).toEqual([]);
  });

  it("puts inverters into spare NAND places when the setting is on, and into inverter packages when it is off", async () => {
    const { page } = s;
    // The demo's last revision of the chamber interlock: NAND–NAND with gates of up to four inputs, on high-speed CMOS.
    const source = readFileSync("lib/lang/examples/chamber-interlock.fnb", "utf8");
    const family = BUILT_IN_FAMILIES.find((f) => f.id === "cmos-hc-5v")!;
    const run = (spareInverters: boolean) => compileNow({ source, family, settings: { form: "nand", fanIn: 4, spareInverters } }).result!.analysis;
    const on = run(true);
    const off = run(false);
    // The same gates either way; with the setting on, fewer NOT gates and one package fewer (a hex inverter
    // package holds six, a quad two-input NAND four: common practice, no source).
    expect(on.gates).toBe(off.gates);
    expect(on.byType.NOT ?? 0).toBeLessThan(off.byType.NOT ?? 0);
    expect(on.packages).toBe(off.packages! - 1);

    await page.goto(`${BASE_URL}/w/ferrow-controls`);
    await page.getByRole("link", { name: "Chamber interlock" }).click();
    await page.getByRole("tab", { name: "Figures" }).click();
    const figure = (label: string) => page.locator('[data-testid="figures"] dt', { hasText: label }).locator("xpath=following-sibling::dd");
    const shown = async () => [Number(await figure("Gates").innerText()), Number(await figure("Packages").innerText())];
    const spare = page.getByLabel("Spare gates as inverters");
    // on by default; a draft kept by an earlier run may have it off
    if (!(await spare.isChecked())) await spare.check();
    await expect.poll(shown, { timeout: 30_000 }).toEqual([on.gates, on.packages]);
    await spare.uncheck();
    await expect.poll(shown, { timeout: 30_000 }).toEqual([off.gates, off.packages]);
    await screenshot(page, "spare-inverters-off");
    await spare.check();
    await expect.poll(shown, { timeout: 30_000 }).toEqual([on.gates, on.packages]);
    await screenshot(page, "spare-inverters-on");
    expect(s.outside).toEqual([]);
  });

  it("shows the two-level and the factored structure side by side, and the revision keeps the designer's choice", async () => {
    const { page } = s;
    // The demo's last revision of the status lamp decode keeps the factored structure (standard low-power TTL, pin load 4).
    const source = readFileSync("lib/lang/examples/status-lamps.fnb", "utf8");
    const family = BUILT_IN_FAMILIES.find((f) => f.id === "ttl-ls-5v")!;
    const both = compileNow({ source, family, settings: { outputPinLoad: 4 } }).result!.structures;
    const [two, fac] = [both.find((x) => x.structure === "two-level")!, both.find((x) => x.structure === "factored")!];
    expect(fac.gates).toBeLessThan(two.gates);

    await page.goto(`${BASE_URL}/w/ferrow-controls`);
    await page.getByRole("link", { name: "Status lamp decode" }).click();
    const panel = page.locator('[data-testid="structures"]');
    const cell = (structure: string, figure: string) => panel.locator(`td[data-structure="${structure}"][data-figure="${figure}"]`);
    const kept = () => panel.locator('th[data-kept="true"]').getAttribute("data-structure");
    const symbols = () => page.locator('[data-testid="schematic"] g[data-gate]').count();
    const keepFactored = page.getByLabel("Keep the factored structure");
    const keepTwoLevel = page.getByLabel("Keep the two-level structure");
    // a draft left by an earlier run may keep the other structure
    await keepFactored.waitFor({ timeout: 30_000 });
    if (!(await keepFactored.isChecked())) await keepFactored.check();
    await expect.poll(kept, { timeout: 30_000 }).toBe("factored");
    await expect.poll(async () => [await cell("two-level", "Gates").innerText(), await cell("factored", "Gates").innerText()], { timeout: 30_000 })
      .toEqual([String(two.gates), String(fac.gates)]);
    expect(await cell("two-level", "Levels").innerText()).toBe(String(two.levels));
    expect(await cell("factored", "Packages").innerText()).toBe(String(fac.packages));
    // the schematic draws the kept netlist
    await expect.poll(symbols, { timeout: 30_000 }).toBe(fac.gates);
    await screenshot(page, "structures-factored");

    await keepTwoLevel.check();
    await expect.poll(kept, { timeout: 30_000 }).toBe("two-level");
    await expect.poll(symbols, { timeout: 30_000 }).toBe(two.gates);
    await screenshot(page, "structures-two-level");

    // the aim travels to the server with the settings
    const asked = page.waitForRequest((r) => r.url().endsWith("/api/v1/compile") && /"aim":"levels"/.test(r.postData() ?? ""), { timeout: 30_000 });
    await panel.getByLabel("Factor for").selectOption("levels");
    await asked;
    await panel.getByLabel("Factor for").selectOption("gates");

    await keepFactored.check();
    await expect.poll(symbols, { timeout: 30_000 }).toBe(fac.gates);
    await expect.poll(() => page.getByTestId("compile-status").innerText(), { timeout: 30_000 }).toMatch(/verified/);
    await page.getByRole("button", { name: "Save revision" }).click();
    await page.fill("#rev-message", "Keep the factored decode");
    await page.getByRole("button", { name: "Save", exact: true }).click();
    const row = page.locator('[data-testid="revision-list"] tr', { hasText: "Keep the factored decode" }).first();
    await expect.poll(() => row.locator('[data-testid="revision-structure"]').innerText(), { timeout: 20_000 }).toBe("factored");
    expect(await row.locator("td").nth(5).innerText()).toBe(String(fac.gates));
    await screenshot(page, "structures-saved");

    // the revision's own page shows the same side by side, read only, with the factored structure kept
    await row.getByRole("link").first().click();
    await page.waitForURL(/\/r\/\d+$/);
    await expect.poll(() => page.locator('[data-testid="structures"] th[data-kept="true"]').getAttribute("data-structure"), { timeout: 30_000 }).toBe("factored");
    expect(await page.getByLabel("Keep the two-level structure").isDisabled()).toBe(true);
    await expect.poll(symbols, { timeout: 30_000 }).toBe(fac.gates);
    await screenshot(page, "structures-revision");
    expect(s.outside).toEqual([]);
  });

  it("shows the viewer no edit controls", async () => {
    const v = await openBrowser();
    try {
      await signIn(v.page, "viewer@ferrow.example", DEMO_PASSWORD);
      await v.page.waitForSelector('[data-testid="design-table"] tbody tr a');
      expect(await v.page.getByRole("button", { name: "New design" }).count()).toBe(0);
      expect(await v.page.getByRole("button", { name: "Rename" }).count()).toBe(0);
      await v.page.getByRole("link", { name: "Chamber level display" }).click();
      await v.page.waitForSelector('[data-testid="settings"] select');
      await expect.poll(() => v.page.getByText("read only for your role").count(), { timeout: 15_000 }).toBe(1);
      expect(await v.page.getByRole("button", { name: "Save revision" }).count()).toBe(0);
      for (const sel of await v.page.locator('[data-testid="settings"] select, [data-testid="settings"] input').all()) {
        expect(await sel.isDisabled()).toBe(true);
      }
      // The editor refuses keystrokes for a viewer.
      await v.page.waitForSelector('[data-testid="schematic"] g[data-gate]', { timeout: 30_000 });
      const before = await v.page.locator(".monaco-editor .view-lines").innerText();
      await v.page.click(".monaco-editor .view-lines");
      await v.page.keyboard.type("zzz");
      expect(await v.page.locator(".monaco-editor .view-lines").innerText()).toBe(before);
      await screenshot(v.page, "viewer-workbench");
      expect(v.outside).toEqual([]);
    } finally {
      await v.close();
    }
  });
});
