// A compile run to the end in the background, in chromium: the designer stops a slow compile in the
// workbench, hands it to a job worker (a real process of the built worker), follows it in the job panel
// and gets its result in the panels. Screenshots go to test-results/.
import { spawn, type ChildProcess } from "node:child_process";
import type { Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { BASE_URL, openBrowser, screenshot, signIn, type Session } from "../support/browser";
import { DEMO_PASSWORD } from "../../lib/scripts/demo.mjs";

const WS = "ferrow-controls";

async function api(page: Page, method: "GET" | "POST", path: string, data?: unknown) {
  const res = method === "GET" ? await page.request.get(`${BASE_URL}/api/v1${path}`) : await page.request.post(`${BASE_URL}/api/v1${path}`, { data });
  expect(res.status(), `${method} ${path}: ${await res.text()}`).toBeLessThan(300);
  return res.json();
}

describe("running a compile to the end in the background, in chromium", () => {
  let s: Session;
  let worker: ChildProcess | null = null;
  beforeAll(async () => {
    s = await openBrowser();
    await signIn(s.page, "designer@ferrow.example", DEMO_PASSWORD);
  });
  afterAll(async () => {
    worker?.kill("SIGKILL");
    await s?.close();
  });

  it("stops a slow compile, runs it as a job, follows it and shows the job's result", async () => {
    const { page } = s;
    // A 13-input parity of the weir's sensor chain under names no earlier run used, so no kept result answers it:
    // 4,096 products of 13 literals to map, seconds of work (common practice, no source).
    const tag = Date.now().toString(36);
    const names = Array.from({ length: 13 }, (_, i) => `vane${i}_${tag}`);
    const source = `// Ferrow Lock & Weir: odd count of culvert vanes tripped\ninputs ${names.join(", ")}\noutputs odd_trip\nodd_trip = ${names.join(" ^ ")}\n`;
    const families = await api(page, "GET", `/workspaces/${WS}/families`);
    const familyId = families.items.find((f: { key: string }) => f.key === "ttl-std-5v").id;
    const design = (await api(page, "POST", `/workspaces/${WS}/designs`, {
      name: `Vane parity ${tag}`, familyId, draftSource: source, settings: { heuristic: true, fanOut: 8 },
    })).design;
    worker = spawn(process.execPath, [".build/jobs-worker.mjs"], { env: process.env, stdio: ["ignore", "ignore", "inherit"] });

    // Cancel once the compile has been sent and the server is working on it, as a designer would.
    const sent = page.waitForRequest((r) => r.url().endsWith("/api/v1/compile") && r.method() === "POST", { timeout: 30_000 });
    await page.goto(`${BASE_URL}/w/${WS}/d/${design.id}`);
    await sent;
    await page.waitForTimeout(300);
    const status = page.locator('[data-testid="compile-status"]');
    await status.getByRole("button", { name: "Cancel" }).click({ timeout: 30_000 });
    const notice = page.locator('[data-testid="stop-notice"]');
    await notice.waitFor();
    expect(await notice.innerText()).toContain("You stopped the compile");
    await notice.getByRole("button", { name: "Run to the end in the background" }).click();

    const panel = page.locator('[data-testid="job-panel"]');
    await panel.waitFor();
    await expect.poll(() => panel.getAttribute("data-status"), { timeout: 30_000 }).toMatch(/^(queued|running|done)$/);
    await screenshot(page, "job-running");
    await expect.poll(() => panel.getAttribute("data-status"), { timeout: 180_000 }).toBe("done");
    expect(await panel.innerText()).toContain("done — the results below are the job's");

    // The job's result stands in the panels: gates counted, a verified result, no stop notice.
    const gatesTab = page.getByRole("tab", { name: /^Gates \(\d+\)$/ });
    await gatesTab.waitFor({ timeout: 30_000 });
    const gates = Number(/\((\d+)\)/.exec(await gatesTab.innerText())![1]);
    expect(gates).toBeGreaterThan(4096); // at least one AND gate per product, plus the OR tree
    expect(await notice.count()).toBe(0);
    await expect.poll(() => status.innerText(), { timeout: 30_000 }).toMatch(/^up to date/);
    await screenshot(page, "job-done");
    expect(s.outside).toEqual([]);
  });
});
