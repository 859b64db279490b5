import { afterAll, beforeAll, describe, expect, it } from "vitest";
import type { Page } from "playwright-core";
import { BASE_URL, openBrowser, screenshot, signIn, typeInEditor, type Session } from "../support/browser";
import { linkTo, waitForMail } from "../support/mail";
import { DEMO_PASSWORD } from "../../lib/scripts/demo.mjs";

const WS = "ferrow-controls";
const R1 = `// Ferrow Lock & Weir: upper gate permit
inputs lower_shut, level_upper, override_key, estop
outputs open_upper
open_upper = estop' * lower_shut * level_upper
`;
// The key lets the keeper open the gate without the level signal.
const R2 = R1.replace("open_upper = estop' * lower_shut * level_upper", "open_upper = estop' * lower_shut * (level_upper + override_key)");
// The designer's answer: the key works only with the paddles shut (typed in the workbench).
const R3_LINES = [
  "// Ferrow Lock & Weir: upper gate permit",
  "inputs lower_shut, level_upper, override_key, estop, paddles_shut",
  "outputs open_upper",
  "open_upper = estop' * lower_shut * level_upper + estop' * lower_shut * override_key * paddles_shut",
];

async function api(page: Page, method: "GET" | "POST", path: string, data?: unknown) {
  const res = method === "GET" ? await page.request.get(`${BASE_URL}/api/v1${path}`) : await page.request.post(`${BASE_URL}/api/v1${path}`, { data });
  expect(res.status(), `${method} ${path}: ${await res.text()}`).toBeLessThan(300);
  return res.json();
}

/**
 * Types the lines over the editor's text the way a person would, and checks
 * the text on screen: on a busy machine a keystroke can still go astray, and
 * then the lines are typed again.
 */
async function replaceText(page: Page, lines: string[]) {
  // Let the page settle first: the draft loaded and compiled.
  await expect.poll(() => page.getByTestId("compile-status").innerText(), { timeout: 30_000 }).toMatch(/up to date|error/);
  const shown = async () => (await page.locator(".monaco-editor .view-lines").innerText()).replace(/\u00a0/g, " ").trimEnd();
  for (let attempt = 0; attempt < 3; attempt++) {
    await page.click(".monaco-editor .view-lines");
    await page.keyboard.press("Control+A");
    await page.keyboard.press("Delete");
    for (const [i, line] of lines.entries()) {
      await typeInEditor(page, line);
      if (i < lines.length - 1) await page.keyboard.press("Enter");
    }
    if ((await shown()) === lines.join("\n")) return;
  }
  expect(await shown()).toBe(lines.join("\n"));
}

/** Both schematics laid out (ELK runs off the main thread), so a screenshot shows them. */
async function bothDrawn(page: Page) {
  await expect.poll(() => page.locator('[data-testid="schematic-pair"] [data-testid="schematic"]').count(), { timeout: 20_000 }).toBe(2);
}

async function askForReview(page: Page, number: number, message: string) {
  await page.getByRole("button", { name: `Ask for review of r${number}` }).click();
  await page.getByLabel("Rhian Tull").check();
  await page.fill("#review-message", message);
  await page.getByRole("button", { name: "Send the request" }).click();
  await expect.poll(() => page.locator('[data-testid="review-panel"] [data-state]').first().getAttribute("data-state"), { timeout: 20_000 }).toBe("open");
}

describe("a review in chromium: ask, mail, line comment, changes asked, new revision, ask again, approved", () => {
  let designer: Session;
  let reviewer: Session;
  let designId: string;
  const name = `Upper gate permit ${Date.now()}`;

  beforeAll(async () => {
    designer = await openBrowser();
    reviewer = await openBrowser();
  });
  afterAll(async () => {
    await designer?.close();
    await reviewer?.close();
  });

  it("the designer asks the reviewer from the comparison of r1 and r2, and the reviewer gets an e-mail with its link", async () => {
    const { page } = designer;
    await signIn(page, "designer@ferrow.example", DEMO_PASSWORD);
    // Two revisions to start from, saved through the REST API with the designer's session.
    const families = await api(page, "GET", `/workspaces/${WS}/families`);
    const familyId = families.items.find((f: { key: string }) => f.key === "cmos-hc-5v").id;
    designId = (await api(page, "POST", `/workspaces/${WS}/designs`, { name, familyId, draftSource: R1 })).design.id;
    await api(page, "POST", `/workspaces/${WS}/designs/${designId}/revisions`, { message: "Upper gate permit", source: R1, familyId, settings: {} });
    await api(page, "POST", `/workspaces/${WS}/designs/${designId}/revisions`, { message: "The override key opens without the level signal", source: R2, familyId, settings: {} });

    // From the workbench's revisions table to the comparison of r1 and r2.
    await page.goto(`${BASE_URL}/w/${WS}/d/${designId}`);
    await page.locator('[data-testid="revision-list"] tr[data-revision="2"]').getByRole("link", { name: "compare" }).click();
    await page.waitForURL(/\/compare\?from=1&to=2/);
    await page.waitForSelector('[data-testid="figures-compare"]');
    // x·(y + k) = x·y + x·k: one product term more in r2 (distributive law, any textbook).
    await expect.poll(() => page.locator('[data-figure="products"] td').nth(3).innerText()).toBe("+1");
    expect(await page.locator('[data-figure="products"]').getAttribute("data-direction")).toBe("worse");
    expect(await page.locator('[data-testid="source-diff"] tr[data-kind="added"]').count()).toBe(1);
    await expect.poll(() => page.locator('[data-testid="schematic-pair"] [data-testid="schematic"]').count(), { timeout: 20_000 }).toBe(2);
    expect(await page.locator('[data-testid="schematic-pair"] polyline.stroke-accent').count()).toBeGreaterThan(0);
    await askForReview(page, 2, "The keeper asked for the key to open the upper gate. Is it safe?");
    await screenshot(page, "review-asked");

    const mail = await waitForMail("reviewer@ferrow.example", new RegExp(`r2 of ${name}`));
    expect(mail.text).toContain("The keeper asked for the key");
    const link = linkTo(BASE_URL, mail.text);
    expect(link.pathname).toBe(`/w/${WS}/d/${designId}/compare`);
    expect(link.searchParams.get("review")).toMatch(/^[0-9a-f-]{36}$/);
    expect(designer.outside).toEqual([]);

    // The reviewer follows the link from the mail.
    await signIn(reviewer.page, "reviewer@ferrow.example", DEMO_PASSWORD);
    await expect.poll(() => reviewer.page.getByRole("link", { name: /^Reviews \(\d+\)$/ }).count(), { timeout: 15_000 }).toBe(1);
    await reviewer.page.goto(link.toString());
    await reviewer.page.waitForSelector('[data-testid="review-panel"]');
  });

  it("the reviewer comments on line 4 and asks for changes", async () => {
    const { page } = reviewer;
    await page.getByRole("button", { name: "Comment on line 4" }).click();
    await page.fill("#line-comment-4", "Why does the override key bypass the level-equal check? With the key turned the gate may open against a head of water.");
    await page.getByRole("button", { name: "Add line comment" }).click();
    await expect.poll(() => page.locator('[data-testid="line-comments"][data-line="4"]').innerText(), { timeout: 15_000 }).toContain("head of water");
    expect(await page.locator('tr[data-line="4"] [data-testid="line-glyph"]').count()).toBe(1);
    await bothDrawn(page);
    await screenshot(page, "review-line-comment");

    // The navigation counts what waits for the reviewer; deciding takes this review off it.
    const nav = page.getByRole("link", { name: /^Reviews( \(\d+\))?$/ });
    const waiting = async () => Number(/\((\d+)\)/.exec(await nav.innerText())?.[1] ?? 0);
    const before = await waiting();
    expect(before).toBeGreaterThanOrEqual(1);
    await page.fill("#decision-note", "Let the key work only with the paddles shut.");
    await page.getByRole("button", { name: "Ask for changes" }).click();
    await expect.poll(waiting, { timeout: 15_000 }).toBe(before - 1);
    await expect.poll(() => page.locator('[data-testid="review-panel"] [data-state]').first().getAttribute("data-state"), { timeout: 15_000 }).toBe("changes-asked");
    expect(await page.locator('[data-testid="decisions"]').innerText()).toContain("Let the key work only with the paddles shut.");
    await bothDrawn(page);
    await screenshot(page, "review-changes-asked");
    expect(reviewer.outside).toEqual([]);
  });

  it("the designer reads the decision, answers on the line, saves r3 in the workbench and asks again", async () => {
    const { page } = designer;
    const mail = await waitForMail("designer@ferrow.example", new RegExp(`asked for changes on r2 of ${name}`));
    await page.goto(linkTo(BASE_URL, mail.text).toString());
    await page.waitForSelector('[data-testid="review-panel"] [data-state="changes-asked"]');
    // No decision form for the designer, only the thread.
    expect(await page.locator('[data-testid="decide"]').count()).toBe(0);
    await page.getByRole("button", { name: "Comment on line 4" }).click();
    await page.fill("#line-comment-4", "Right: the key now needs the paddles shut too. Saving that as r3.");
    await page.getByRole("button", { name: "Add line comment" }).click();
    await expect.poll(() => page.locator('[data-testid="line-comments"][data-line="4"] > td > div').count(), { timeout: 15_000 }).toBe(2);

    await page.goto(`${BASE_URL}/w/${WS}/d/${designId}`);
    await page.waitForSelector(".monaco-editor textarea");
    await replaceText(page, R3_LINES);
    await expect.poll(() => page.getByTestId("compile-status").innerText(), { timeout: 30_000 }).toContain("up to date");

    // Before saving, the unsaved draft against r2: the server compiles what was typed (the link sends it first).
    await page.getByRole("link", { name: "compare draft" }).click();
    await page.waitForURL(/\/compare\?from=2&to=draft/);
    await page.waitForSelector('[data-testid="figures-compare"]', { timeout: 30_000 });
    expect(await page.locator("#cmp-to").inputValue()).toBe("draft");
    // Lines 2 (the new input) and 4 (the gated key term) changed; lines 1 and 3 kept.
    expect(await page.locator('[data-testid="source-diff"] tr[data-kind="added"]').count()).toBe(2);
    expect(await page.locator('[data-testid="source-diff"] tr[data-kind="removed"]').count()).toBe(2);
    await expect.poll(() => page.locator('[data-testid="schematic-pair"] [data-testid="schematic"]').count(), { timeout: 20_000 }).toBe(2);
    expect(await page.getByTestId("draft-note").innerText()).toMatch(/last kept .* by /);
    await screenshot(page, "review-draft-compare");
    await page.goto(`${BASE_URL}/w/${WS}/d/${designId}`);
    await page.waitForSelector(".monaco-editor textarea");
    await expect.poll(() => page.getByTestId("compile-status").innerText(), { timeout: 30_000 }).toContain("up to date");
    await page.keyboard.press("Control+s");
    await page.fill("#rev-message", "The override key needs the paddles shut");
    await page.getByRole("button", { name: "Save", exact: true }).click();
    const row3 = page.locator('[data-testid="revision-list"] tr[data-revision="3"]');
    await expect.poll(() => row3.innerText(), { timeout: 20_000 }).toContain("paddles shut");
    // r2's review state shows in the revisions table.
    await expect.poll(() => page.locator('tr[data-revision="2"] [data-testid="revision-review"]').innerText()).toContain("changes asked");

    await row3.getByRole("link", { name: "compare" }).click();
    await page.waitForURL(/\/compare\?from=2&to=3/);
    await page.waitForSelector('[data-testid="figures-compare"]');
    await askForReview(page, 3, "Key now gated by the paddles, as asked.");
    expect(designer.outside).toEqual([]);
  });

  it("the reviewer approves r3, and the decisions stay on record", async () => {
    const { page } = reviewer;
    const mail = await waitForMail("reviewer@ferrow.example", new RegExp(`r3 of ${name}`));
    await page.goto(linkTo(BASE_URL, mail.text).toString());
    await page.waitForSelector('[data-testid="decide"]');
    await page.fill("#decision-note", "The key is safe with the paddles shut. Approved.");
    await page.getByRole("button", { name: "Approve" }).click();
    await expect.poll(() => page.locator('[data-testid="review-panel"] [data-state]').first().getAttribute("data-state"), { timeout: 15_000 }).toBe("approved");
    await bothDrawn(page);
    await screenshot(page, "review-approved");

    await page.goto(`${BASE_URL}/w/${WS}/reviews`);
    await page.waitForSelector('[data-testid="recent-decisions"] li');
    const recent = page.locator('[data-testid="recent-decisions"] li', { hasText: name });
    await expect.poll(() => recent.count()).toBe(2);
    expect(await recent.first().innerText()).toMatch(/approved/);
    expect(await recent.nth(1).innerText()).toMatch(/changes asked/);
    // A reviewer does not ask for reviews, so the page has no "asked by me" list for them.
    expect(await page.getByTestId("asked-by-me").count()).toBe(0);
    await screenshot(page, "reviews-page");

    await page.goto(`${BASE_URL}/w/${WS}/d/${designId}`);
    await expect.poll(() => page.locator('tr[data-revision="3"] [data-testid="revision-review"]').innerText(), { timeout: 15_000 }).toContain("approved");
    expect(reviewer.outside).toEqual([]);
  });

  it("a viewer reads the review but finds no comment or decision controls", async () => {
    const v = await openBrowser();
    try {
      await signIn(v.page, "viewer@ferrow.example", DEMO_PASSWORD);
      const mail = await waitForMail("reviewer@ferrow.example", new RegExp(`r3 of ${name}`));
      await v.page.goto(linkTo(BASE_URL, mail.text).toString());
      await v.page.waitForSelector('[data-testid="review-panel"] [data-state="approved"]');
      expect(await v.page.locator("#general-comment").count()).toBe(0);
      expect(await v.page.getByRole("button", { name: /Comment on line/ }).count()).toBe(0);
      expect(await v.page.locator('[data-testid="decide"]').count()).toBe(0);
      expect(await v.page.getByText("Your role reads reviews").count()).toBe(1);
      expect(v.outside).toEqual([]);
    } finally {
      await v.close();
    }
  });
});
