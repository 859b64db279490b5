/**
 * `npm run bench:web`: the workbench in Chromium against a started server
 * (`npm start`, or FANBOUND_BASE_URL), printing one table:
 *
 * - wide results: the longest main-thread task (PerformanceObserver "longtask")
 *   while a design of thousands of gates loads, draws, and its tables are
 *   scrolled and switched — target: none over 200 ms up to 5,000 gates;
 * - typing on the demo designs: the pause before a compile starts and the
 *   time from that start to the results on screen, p95 — targets 250 ms and
 *   150 ms;
 * - a design page opened again (warm): time until the editor shows the
 *   equations — target 1.5 s.
 *
 * It signs in as the demo designer and keeps its wide designs in the demo
 * workspace, archived (so the design list looks as before; an archived design
 * still opens by its address). The typing it does is removed again.
 */
import type { Page } from "playwright-core";
import { launchChromium } from "./chromium";
import { comparatorSource, paritySource } from "./sources";
import { DEMO_PASSWORD } from "../scripts/demo.mjs";

const BASE = process.env.FANBOUND_BASE_URL ?? "http://127.0.0.1:3000";
const DEMO_WS = "ferrow-controls";
const DEMO_DESIGNS = ["Chamber interlock", "Status lamp decode", "Chamber level display", "Paddle driver decode", "Fault priority encoder"];
const KEYSTROKES_PER_DESIGN = 12;

const WIDE = [
  { name: "Bench: 8-bit magnitude comparator (16 inputs)", family: "cmos-hc-5v", source: comparatorSource(8), settings: {} },
  { name: "Bench: 11-input parity", family: "ttl-std-5v", source: paritySource(11), settings: { heuristic: true } },
  { name: "Bench: 12-input parity", family: "cmos-hc-5v", source: paritySource(12), settings: { heuristic: true } },
];

interface Json {
  [k: string]: unknown;
}

async function apiCall(page: Page, method: string, path: string, body?: unknown): Promise<{ status: number; json: Json }> {
  const res = await page.request.fetch(`${BASE}/api/v1${path}`, {
    method,
    headers: body === undefined ? {} : { "content-type": "application/json" },
    data: body === undefined ? undefined : JSON.stringify(body),
  });
  const text = await res.text();
  return { status: res.status(), json: text ? (JSON.parse(text) as Json) : {} };
}

async function signIn(page: Page) {
  await page.goto(`${BASE}/signin`);
  await page.fill('input[name="email"]', "designer@ferrow.example");
  await page.fill('input[name="password"]', DEMO_PASSWORD);
  await page.click('button[type="submit"]');
  await page.waitForURL(/\/(w|workspaces)\b/, { timeout: 30_000 });
}

/** One archived design per wide case in the demo workspace, each holding the case's source. */
async function prepareWideDesigns(page: Page): Promise<Array<{ name: string; id: string }>> {
  const fams = (await apiCall(page, "GET", `/workspaces/${DEMO_WS}/families`)).json.items as Array<{ id: string; key: string }>;
  const out: Array<{ name: string; id: string }> = [];
  for (const c of WIDE) {
    const familyId = fams.find((f) => f.key === c.family)!.id;
    const list = (await apiCall(page, "GET", `/workspaces/${DEMO_WS}/designs?archived=1&q=${encodeURIComponent(c.name)}`)).json.items as Array<{ id: string; name: string }>;
    let id = list.find((d) => d.name === c.name)?.id;
    if (!id) {
      const r = await apiCall(page, "POST", `/workspaces/${DEMO_WS}/designs`, { name: c.name, familyId, draftSource: c.source, settings: c.settings });
      if (r.status !== 201) throw new Error(`could not create a bench design: ${JSON.stringify(r.json)}`);
      id = (r.json.design as { id: string }).id;
      await apiCall(page, "PATCH", `/workspaces/${DEMO_WS}/designs/${id}`, { archived: true });
    }
    const d = (await apiCall(page, "GET", `/workspaces/${DEMO_WS}/designs/${id}`)).json.design as { draftVersion: number };
    await apiCall(page, "PUT", `/workspaces/${DEMO_WS}/designs/${id}/draft`, {
      source: c.source, familyId, settings: c.settings, baseVersion: d.draftVersion,
    });
    out.push({ name: c.name, id });
  }
  return out;
}

const LONG_TASKS = () => {
  const w = window as unknown as { __longtasks: Array<[number, number]>; __answered: number };
  w.__longtasks = [];
  w.__answered = Infinity;
  new PerformanceObserver((list) => {
    for (const e of list.getEntries()) w.__longtasks.push([e.startTime, e.duration]);
  }).observe({ type: "longtask", buffered: true });
  new PerformanceObserver((list) => {
    for (const e of list.getEntries()) {
      if (e.name.endsWith("/api/v1/compile")) w.__answered = Math.min(w.__answered, (e as PerformanceResourceTiming).responseEnd);
    }
  }).observe({ type: "resource", buffered: true });
};

/**
 * Opens a wide design and lets the page start (editor, first result, drawing); then types a comment, so a
 * fresh result of the same size arrives on a page that is already running, and uses its tabs and tables.
 * Returns the long tasks from the keystroke on; the longest task of the start-up is reported apart.
 */
async function wideCase(page: Page, id: string) {
  await page.goto(`${BASE}/w/${DEMO_WS}/d/${id}`);
  await step("wide design: first drawing", page.waitForSelector('[data-testid="schematic"]', { timeout: 180_000 }));
  await page.waitForFunction(() => document.querySelector(".monaco-editor .view-lines")?.textContent?.includes("inputs"), null, { timeout: 60_000 });
  await page.waitForTimeout(1_000);
  const startup = await page.evaluate(() => {
    const w = window as unknown as { __longtasks: Array<[number, number]>; __answered: number };
    const longest = Math.max(0, ...w.__longtasks.map(([, d]) => d));
    w.__longtasks = [];
    w.__answered = Infinity;
    return longest;
  });
  // A comment no earlier run typed: the server compiles it afresh (no kept result).
  const compiled = page.waitForResponse((r) => r.url().endsWith("/api/v1/compile") && r.request().method() === "POST", { timeout: 180_000 });
  await page.click(".monaco-editor .view-lines");
  await page.keyboard.press("Control+End");
  await page.keyboard.press("Enter");
  const t0 = Date.now();
  await page.keyboard.type(`// bench ${Date.now()}`);
  await page.keyboard.press("Escape");
  const res = await compiled;
  const serverMs = Date.now() - t0;
  const body = (await res.json()) as { result?: { netlist: { gates: unknown[] } }; error?: { message: string } };
  if (!body.result) throw new Error(`the compile of a bench design failed: ${JSON.stringify(body.error ?? body).slice(0, 300)}`);
  const gates = body.result.netlist.gates.length;
  await step("wide design: status up to date", page.waitForFunction(() => document.querySelector('[data-testid="compile-status"]')?.textContent?.startsWith("up to date"), null, { timeout: 180_000 }));
  await page.waitForSelector('[data-testid="schematic"]', { timeout: 180_000 });
  await page.getByRole("tab", { name: /Gates/ }).click();
  const scroller = page.locator('[data-testid="gate-table-scroll"]');
  for (let i = 1; i <= 10; i++) {
    await scroller.evaluate((el, f) => { el.scrollTop = el.scrollHeight * f; }, i / 10);
    await page.waitForTimeout(60);
  }
  for (const tab of ["Minimized", "Figures", /Notes/, /Gates/]) {
    await page.getByRole("tab", { name: tab }).click();
    await page.waitForTimeout(150);
  }
  const select = page.locator("#cone-output");
  if (await select.count()) {
    const options = await select.locator("option").all();
    if (options.length > 1) {
      await select.selectOption({ index: options.length - 1 });
      await page.waitForSelector('[data-testid="schematic"]', { timeout: 180_000 });
    }
  }
  await page.waitForTimeout(1_000);
  const seen = await page.evaluate(() => {
    const w = window as unknown as { __longtasks: Array<[number, number]>; __answered: number };
    return { tasks: w.__longtasks, answered: w.__answered };
  });
  // From the keystroke on: typing, the answer, drawing it, and the tables used. The page's own start-up was counted apart.
  const tasks = seen.tasks.map(([, d]) => d);
  return { gates, serverMs, longest: Math.max(0, ...tasks), over200: tasks.filter((t) => t > 200).length, over50: tasks.length, loadLongest: startup };
}

const TYPING = () => {
  const w = window as unknown as { __typing: { key: number; starts: number[]; answered: number; done: number[] } };
  w.__typing = { key: 0, starts: [], answered: -1, done: [] };
  addEventListener("keydown", () => { w.__typing.key = performance.now(); }, true);
  // When each compile request leaves and when its answer is in.
  const fetch0 = window.fetch.bind(window);
  window.fetch = async (input: RequestInfo | URL, init?: RequestInit) => {
    const url = typeof input === "string" ? input : input instanceof URL ? input.href : input.url;
    if (!url.endsWith("/api/v1/compile")) return fetch0(input, init);
    w.__typing.starts.push(performance.now());
    const r = await fetch0(input, init);
    w.__typing.answered = performance.now();
    return r;
  };
  // The result is on screen at the first change of the page after an answer to
  // a compile asked after the keystroke, once the status says "up to date".
  new MutationObserver(() => {
    const t = w.__typing;
    const s = document.querySelector('[data-testid="compile-status"]');
    if (t.answered > t.key && s?.textContent?.startsWith("up to date") && (t.done.at(-1) ?? -1) < t.answered) t.done.push(performance.now());
    // The document itself: an init script runs before it has an element.
  }).observe(document, { subtree: true, childList: true, characterData: true });
};

/** Waits for `p`; a failure says which step of the bench it was. */
async function step<T>(what: string, p: Promise<T>): Promise<T> {
  try {
    return await p;
  } catch (e) {
    throw new Error(`${what}: ${e instanceof Error ? e.message : String(e)}`);
  }
}

/** Types single characters into a demo design, each after the last result arrived; returns [pause, update] pairs in ms. */
async function typingCase(page: Page, url: string): Promise<Array<[number, number]>> {
  await page.goto(url);
  await step(`${url}: first result`, page.waitForFunction(() => document.querySelector('[data-testid="compile-status"]')?.textContent?.startsWith("up to date"), null, { timeout: 60_000 }));
  await page.click(".monaco-editor .view-lines");
  await page.keyboard.press("Control+End");
  await page.keyboard.press("Enter");
  await page.keyboard.type("// bench ");
  await page.keyboard.press("Escape");
  await page.waitForTimeout(800);
  const pairs: Array<[number, number]> = [];
  for (let i = 0; i < KEYSTROKES_PER_DESIGN; i++) {
    const before = await page.evaluate(() => (window as unknown as { __typing: { done: number[] } }).__typing.done.length);
    await page.keyboard.type("x");
    await step(`${url}: result after keystroke ${i + 1}`, page.waitForFunction((n) => (window as unknown as { __typing: { done: number[] } }).__typing.done.length > n, before, { timeout: 30_000, polling: "raf" }));
    const t = await page.evaluate(() => (window as unknown as { __typing: { key: number; starts: number[]; done: number[] } }).__typing);
    const start = t.starts.filter((s) => s >= t.key).at(0);
    const done = t.done.at(-1)!;
    if (start !== undefined) pairs.push([start - t.key, done - start]);
    await page.waitForTimeout(300);
  }
  // Put the text back as it was, so the demo draft is unchanged.
  for (let i = 0; i < KEYSTROKES_PER_DESIGN + "// bench ".length + 1; i++) await page.keyboard.press("Backspace");
  await step(`${url}: draft kept after the text was put back`, page.waitForFunction(() => document.querySelector('[data-testid="draft-state"]')?.getAttribute("data-status") === "kept", null, { timeout: 30_000 }));
  return pairs;
}

function p95(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.ceil(0.95 * s.length) - 1)] ?? NaN;
}

const r0 = (x: number) => String(Math.round(x));
const pad = (s: string, w: number) => s.padEnd(w);
const lpad = (s: string, w: number) => s.padStart(w);

async function main() {
  const s = await launchChromium({ keepCache: true });
  try {
    await signIn(s.page);
    // `-- --typing`: the typing part only.
    const designs = process.argv.includes("--typing") ? [] : await prepareWideDesigns(s.page);

    console.log(`\nworkbench in Chromium against ${BASE}\n`);
    console.log("wide results: longest main-thread task while the result loads, draws and its tables are used (target: none over 200 ms up to 5,000 gates)");
    console.log("(tasks from a keystroke in the running page until its fresh result is drawn and the tables used; the page's own start-up is shown apart)");
    console.log(`${pad("case", 48)}${lpad("gates", 7)}${lpad("answer ms", 11)}${lpad("longest task ms", 17)}${lpad("tasks >200 ms", 15)}${lpad("tasks >50 ms", 14)}${lpad("start-up longest ms", 21)}  met`);
    for (const d of designs) {
      const page = await s.context.newPage();
      await page.addInitScript(LONG_TASKS);
      const r = await wideCase(page, d.id);
      const met = r.gates > 5000 ? "(above 5,000 gates)" : r.over200 === 0 ? "yes" : "NO";
      console.log(`${pad(d.name, 48)}${lpad(String(r.gates), 7)}${lpad(r0(r.serverMs), 11)}${lpad(r0(r.longest), 17)}${lpad(String(r.over200), 15)}${lpad(String(r.over50), 14)}${lpad(r0(r.loadLongest), 21)}  ${met}`);
      await page.close();
    }

    const page = await s.context.newPage();
    await page.addInitScript(TYPING);
    await page.goto(`${BASE}/w/${DEMO_WS}`);
    const links: Array<{ name: string; href: string }> = [];
    for (const name of DEMO_DESIGNS) {
      const href = await page.getByRole("link", { name, exact: true }).first().getAttribute("href");
      if (href) links.push({ name, href });
    }
    const pauses: number[] = [];
    const updates: number[] = [];
    console.log(`\ntyping: ${KEYSTROKES_PER_DESIGN} keystrokes in each demo design (targets: pause p95 ≤ 250 ms, results p95 ≤ 150 ms after the pause)`);
    console.log(`${pad("design", 30)}${lpad("pause p95 ms", 14)}${lpad("results p95 ms", 16)}${lpad("results max ms", 16)}`);
    for (const l of links) {
      const pairs = await typingCase(page, `${BASE}${l.href}`);
      pauses.push(...pairs.map((p) => p[0]));
      updates.push(...pairs.map((p) => p[1]));
      console.log(`${pad(l.name, 30)}${lpad(r0(p95(pairs.map((p) => p[0]))), 14)}${lpad(r0(p95(pairs.map((p) => p[1]))), 16)}${lpad(r0(Math.max(...pairs.map((p) => p[1]))), 16)}`);
    }
    console.log(`${pad("all", 30)}${lpad(r0(p95(pauses)), 14)}${lpad(r0(p95(updates)), 16)}${lpad(r0(Math.max(...updates)), 16)}  met: ${p95(pauses) <= 250 && p95(updates) <= 150 ? "yes" : "NO"}`);

    const ready: number[] = [];
    const first = links[0]!;
    await page.goto(`${BASE}${first.href}`);
    for (let i = 0; i < 6; i++) {
      await page.goto(`${BASE}${first.href}`);
      await page.waitForFunction(() => document.querySelector(".monaco-editor .view-lines")?.textContent?.includes("inputs"), null, { timeout: 30_000, polling: "raf" });
      if (i > 0) ready.push(await page.evaluate(() => performance.now()));
    }
    const sorted = [...ready].sort((a, b) => a - b);
    console.log(`\ndesign page opened again (warm), until the editor shows the equations: median ${r0(sorted[Math.floor(sorted.length / 2)]!)} ms, max ${r0(sorted.at(-1)!)} ms over ${ready.length} loads (target 1,500 ms): met ${sorted.at(-1)! <= 1500 ? "yes" : "NO"}`);
    if (s.outside.length) console.log(`requests that tried to leave 127.0.0.1 (blocked): ${s.outside.join(", ")}`);
  } finally {
    await s.close();
  }
}

main().catch((e: unknown) => {
  console.error(e instanceof Error ? e.message : e);
  console.error(`(is the app served at ${BASE}? start it with npm start, or set FANBOUND_BASE_URL)`);
  process.exitCode = 1;
});
