// Bringing designs in, in chromium: a truth table dropped on the workspace
// home (a real drop event carrying a DataTransfer with the file), refusals
// shown with their row and column, the Verilog file through the file input,
// pasted spreadsheet cells, and the truth table tab of the workbench with
// its pages and download. Screenshots go to test-results/.
import { readFileSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { BASE_URL, openBrowser, screenshot, signIn, typeInEditor, type Session } from "../support/browser";
import { DEMO_PASSWORD } from "../../lib/scripts/demo.mjs";

const sluice = readFileSync("lib/import/examples/sluice-alarm.csv", "utf8");

describe("bringing designs in, in chromium", () => {
  let s: Session;
  beforeAll(async () => {
    s = await openBrowser();
    await signIn(s.page, "designer@ferrow.example", DEMO_PASSWORD);
  });
  afterAll(async () => {
    await s?.close();
  });

  /** Drops a file on the workspace home as a person would: dragenter, dragover and drop with one DataTransfer. */
  async function dropFile(name: string, text: string, type: string, on = '[data-testid="design-table"]') {
    const dt = await s.page.evaluateHandle(
      ([n, t, ty]) => {
        const d = new DataTransfer();
        d.items.add(new File([t], n, { type: ty }));
        return d;
      },
      [name, text, type] as const,
    );
    const target = s.page.locator(on).first();
    await target.dispatchEvent("dragenter", { dataTransfer: dt });
    await target.dispatchEvent("dragover", { dataTransfer: dt });
    await target.dispatchEvent("drop", { dataTransfer: dt });
  }

  it("shows the refusals of a contradictory table with row and column, and creates nothing", async () => {
    const { page } = s;
    await page.goto(`${BASE_URL}/w/ferrow-controls`);
    await page.waitForSelector('[data-testid="design-table"] tbody tr a');
    await dropFile("bad-table.csv", "gate_shut,estop,alarm\n0,0,0\n0,1,1\n-,1,0\n1,0,x\n", "text/csv");
    const problems = page.locator('[data-testid="import-problems"] tbody tr');
    await expect.poll(() => problems.count(), { timeout: 15_000 }).toBe(2);
    const texts = await problems.allInnerTexts();
    expect(texts[0]).toContain("rows 3 and 4 contradict each other");
    expect(texts[0]).toMatch(/^4\s+alarm/);
    expect(texts[1]).toMatch(/^5\s+alarm/);
    expect(texts[1]).toContain('the cell holds "x"; write 0, 1 or -');
    await expect.poll(() => page.getByRole("button", { name: "Create design" }).isDisabled()).toBe(true);
    await screenshot(page, "import-refused");
    await page.getByRole("button", { name: "Close" }).click();
  });

  it("imports the dropped sluice alarm table with both outputs chosen, previews it and creates the design", async () => {
    const { page } = s;
    await dropFile("sluice-alarm.csv", sluice, "text/csv");
    await page.waitForSelector('[data-testid="import-columns"]');
    // Default: only the last column is an output; choose alarm as well.
    await expect.poll(async () => (await page.locator('[data-testid="import-source"]').innerText()).includes("outputs horn\n"), { timeout: 15_000 }).toBe(true);
    await page.locator('[data-testid="import-columns"] button', { hasText: /^alarm/ }).click();
    await expect.poll(async () => (await page.locator('[data-testid="import-source"]').innerText()).includes("outputs alarm, horn\n"), { timeout: 15_000 }).toBe(true);
    const name = `Sluice alarm ${Date.now()}`;
    await page.getByLabel("Design name").fill(name);
    await screenshot(page, "import-preview");
    await page.getByRole("button", { name: "Create design" }).click();
    await page.waitForURL(/\/d\//, { timeout: 30_000 });
    await page.waitForSelector(".monaco-editor");

    // The truth table tab: 16 rows, horn open (-) at row 5, as the table said.
    await page.getByRole("tab", { name: "Truth table" }).click();
    const rows = page.locator('[data-testid="truth-table"] tbody tr');
    await expect.poll(() => rows.count(), { timeout: 15_000 }).toBe(16);
    const row5 = (await rows.nth(5).locator("td").allInnerTexts()).map((t) => t.trim());
    expect(row5).toEqual(["5", "0", "1", "0", "1", "1", "-"]);
    const download = page.waitForEvent("download");
    await page.getByRole("button", { name: "Download CSV" }).click();
    const file = await download;
    const csv = readFileSync((await file.path())!, "utf8");
    expect(csv.split("\r\n")[0]).toBe("sluice_open,pound_high,flow,override_key,alarm,horn");
    expect(csv.split("\r\n")[6]).toBe("0,1,0,1,1,-");
    await screenshot(page, "workbench-truth-table");
  });

  it("pages through a wide design's table", async () => {
    const { page } = s;
    // Still in the workbench: replace the source with 12 inputs (4096 rows, 16 pages of 256).
    await page.click(".monaco-editor .view-lines");
    await page.keyboard.press("Control+A");
    await page.keyboard.press("Delete");
    // Through the shared helper: a completion list that opens late would otherwise take the Enter.
    await typeInEditor(page, "inputs a, b, c, d, e, f, g, h, i, j, k, l");
    await page.keyboard.press("Enter");
    await typeInEditor(page, "outputs y");
    await page.keyboard.press("Enter");
    await typeInEditor(page, "y = a ^ l");
    const range = page.locator('[data-testid="truth-table-range"]');
    await expect.poll(() => range.innerText(), { timeout: 15_000 }).toBe("rows 0–255 of 4,096");
    await page.getByRole("button", { name: "Last page" }).click();
    await expect.poll(() => range.innerText()).toBe("rows 3,840–4,095 of 4,096");
    // Row 4095: every input 1, so a ^ l = 0.
    const last = (await page.locator('[data-testid="truth-table"] tbody tr').last().locator("td").allInnerTexts()).map((t) => t.trim());
    expect(last[0]).toBe("4095");
    expect(last[last.length - 1]).toBe("0");
    await screenshot(page, "workbench-truth-table-paged");
  });

  it("makes a Verilog file dropped on the workbench the new draft of the open design, kept over a reload and undoable", async () => {
    const { page } = s;
    // Still in the workbench of the imported sluice design, whose draft now holds the 12-input text.
    const url = page.url();
    const weir = readFileSync("lib/import/examples/weir-horn.v", "utf8");
    await dropFile("weir-horn.v", weir, "text/plain", '[data-testid="editor"]');
    await expect.poll(async () => (await page.locator('[data-testid="import-source"]').innerText()), { timeout: 15_000 })
      .toContain("let blocked = sluice_open * flow'");
    // The workbench asks no name or family: the import becomes this design's draft.
    expect(await page.getByLabel("Design name").count()).toBe(0);
    await screenshot(page, "workbench-import-preview");
    await page.getByRole("button", { name: /^Make it the draft of / }).click();
    await page.waitForSelector('[data-testid="import-used"]');
    // The imported module is short, so every line is in view.
    const editorText = async () => (await page.locator(".monaco-editor .view-lines").innerText()).replace(/\u00a0/g, " ");
    await expect.poll(editorText, { timeout: 10_000 }).toContain("blocked");
    // The draft reaches the server like typing does, so a reload shows it.
    await expect.poll(() => page.locator('[data-testid="draft-state"]').getAttribute("data-status"), { timeout: 15_000 }).toBe("kept");
    await screenshot(page, "workbench-import-used");
    await page.goto(url);
    await page.waitForSelector(".monaco-editor");
    await expect.poll(editorText, { timeout: 15_000 }).toContain("blocked");

    // A second import, then the previous text taken back.
    await dropFile("weir-horn.v", weir.replace(/blocked/g, "held"), "text/plain", '[data-testid="editor"]');
    await expect.poll(async () => (await page.locator('[data-testid="import-source"]').innerText()), { timeout: 15_000 }).toContain("let held");
    await page.getByRole("button", { name: /^Make it the draft of / }).click();
    await expect.poll(editorText, { timeout: 10_000 }).toContain("held");
    await page.getByRole("button", { name: "Take the previous text back" }).click();
    await expect.poll(editorText, { timeout: 10_000 }).toContain("blocked");
    expect(await editorText()).not.toContain("held");
  });

  it("brings in a Verilog file through the file input, and pasted spreadsheet cells", async () => {
    const { page } = s;
    await page.goto(`${BASE_URL}/w/ferrow-controls`);
    await page.waitForSelector('[data-testid="design-table"] tbody tr a');
    await page.setInputFiles('[data-testid="import-file"]', "lib/import/examples/weir-horn.v");
    await expect.poll(async () => (await page.locator('[data-testid="import-source"]').innerText()), { timeout: 15_000 })
      .toContain("let blocked = sluice_open * flow'");
    await expect(page.getByLabel("Design name").inputValue()).resolves.toBe("Weir horn");
    await screenshot(page, "import-verilog");
    await page.getByRole("button", { name: "Close" }).click();

    await page.getByRole("button", { name: "Paste cells…" }).click();
    await page.getByLabel("Cells pasted from a spreadsheet, or a Verilog module").fill("sluice_open\tflow\talarm\n0\t0\t0\n0\t1\t1\n1\t-\t1\n");
    await expect.poll(async () => (await page.locator('[data-testid="import-source"]').innerText()), { timeout: 15_000 })
      .toContain("alarm = off(0)"); // 0 only at sluice_open = 0, flow = 0: off(0) is shorter than on(1..3)
    await screenshot(page, "import-pasted");
    expect(s.outside).toEqual([]);
  });
});
