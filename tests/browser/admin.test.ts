import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { BASE_URL, openBrowser, screenshot, signIn, type Session } from "../support/browser";
import { DEMO_PASSWORD } from "../../lib/scripts/demo.mjs";

const MAIL_DIR = process.env.MAIL_DIR ?? ".data/mail-test";

/** The newest link to this site in the newest captured mail to `to` whose text matches `about`, waiting up to ~15 s. */
async function linkFromMail(to: string, about: RegExp): Promise<string> {
  for (let i = 0; i < 150; i++) {
    const files = readdirSync(MAIL_DIR).filter((f) => f.endsWith(".json")).sort().reverse();
    for (const f of files) {
      const m = JSON.parse(readFileSync(path.join(MAIL_DIR, f), "utf8")) as { to: string[]; text: string };
      if (!m.to.includes(to) || !about.test(m.text)) continue;
      const link = new RegExp(`${BASE_URL.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}/\\S+`).exec(m.text);
      if (link) return link[0];
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`no mail to ${to} matching ${about} in ${MAIL_DIR}`);
}

describe("the owner's screens in chromium", () => {
  let owner: Session;
  beforeAll(async () => {
    owner = await openBrowser();
    await signIn(owner.page, "owner@ferrow.example", DEMO_PASSWORD);
  });
  afterAll(async () => {
    await owner?.close();
  });

  it("invite → accept → change role → remove, each step in the activity list", async () => {
    const { page } = owner;
    await page.getByRole("link", { name: "Members" }).click();
    await page.waitForURL(/\/members$/);
    await page.waitForSelector('[data-testid="member-table"] tbody tr');
    // the demo's pending invitation and activity are there
    await expect.poll(() => page.locator('[data-invitation="lockkeeper@ferrow.example"]').count(), { timeout: 15_000 }).toBe(1);
    await expect.poll(() => page.locator('[data-testid="activity-list"] li').count()).toBeGreaterThan(5);
    // the only owner can be neither demoted nor removed
    expect(await page.getByLabel("Role of Orla Ferrow").isDisabled()).toBe(true);
    expect(await page.locator('[data-member="owner@ferrow.example"]').getByRole("button", { name: "Remove" }).isDisabled()).toBe(true);
    await screenshot(page, "members");

    const email = `pier-${Date.now()}@test.ferrow.example`;
    await page.fill('input[name="email"]', email);
    await page.selectOption('select[name="role"]', "viewer");
    await page.getByRole("button", { name: "Send invitation" }).click();
    await expect.poll(() => page.locator("[role=status]").innerText(), { timeout: 15_000 }).toMatch(/on its way/);
    await expect.poll(() => page.locator(`[data-invitation="${email}"]`).count()).toBe(1);

    // The invitee follows the mailed link, creates an account, confirms the address from the mail sign-up sends, and accepts.
    const invite = await linkFromMail(email, /invites you to the workspace/);
    const guest = await openBrowser();
    try {
      const g = guest.page;
      await g.goto(invite);
      await g.getByRole("link", { name: "Create account" }).click();
      await g.fill('input[name="name"]', "Pia Quayside");
      await g.fill('input[name="email"]', email);
      await g.fill('input[name="password"]', "heron-lantern-sluice-gate");
      await g.click('button[type="submit"]');
      await g.waitForURL(/\/invite\?token=/, { timeout: 30_000 });
      // before the address is confirmed, accepting says what to do
      await g.getByRole("button", { name: "Accept and open the workspace" }).click();
      // (Next's route announcer is an alert too; the invitation's own is a paragraph.)
      await expect.poll(() => g.locator("p[role=alert]").innerText(), { timeout: 15_000 }).toMatch(/Confirm that .* is your address/);
      await g.goto(await linkFromMail(email, /Confirm that this address is yours/));
      await g.getByRole("button", { name: "Confirm my address" }).click();
      await expect.poll(() => g.locator("[role=status]").innerText(), { timeout: 15_000 }).toContain(`${email} is confirmed`);
      await g.goto(invite);
      await screenshot(g, "invite-accept");
      await g.getByRole("button", { name: "Accept and open the workspace" }).click();
      await g.waitForURL(/\/w\/ferrow-controls$/, { timeout: 30_000 });
      // a viewer sees Families and the matrix, not Members
      await expect.poll(() => g.getByRole("link", { name: "Compatibility" }).count(), { timeout: 15_000 }).toBe(1);
      expect(await g.getByRole("link", { name: "Members" }).count()).toBe(0);
      expect(guest.outside).toEqual([]);
    } finally {
      await guest.close();
    }

    await page.reload();
    const row = page.locator(`[data-member="${email}"]`);
    await expect.poll(() => row.count(), { timeout: 15_000 }).toBe(1);
    expect(await page.getByLabel("Role of Pia Quayside").inputValue()).toBe("viewer");
    await page.getByLabel("Role of Pia Quayside").selectOption("designer");
    await expect.poll(() => page.locator("[role=status]").innerText(), { timeout: 15_000 }).toMatch(/Pia Quayside is now designer/);
    await expect.poll(() => page.locator('[data-testid="activity-list"] li').first().innerText()).toMatch(/changed the role of Pia Quayside .* from viewer to designer/);
    await screenshot(page, "members-role-changed");

    await row.getByRole("button", { name: "Remove" }).click();
    await row.getByRole("button", { name: "Yes, remove" }).click();
    await expect.poll(() => page.locator(`[data-member="${email}"]`).count(), { timeout: 15_000 }).toBe(0);
    const activity = page.locator('[data-testid="activity-list"] li');
    await expect.poll(() => activity.first().innerText()).toMatch(/removed Pia Quayside .* from the workspace \(was designer\)/);
    await expect.poll(() => page.locator('[data-testid="activity-list"]').innerText()).toMatch(/Pia Quayside accepted the invitation and joined as viewer/);
    await screenshot(page, "members-removed");

    // the demo invitation is sent again, and cancelled after a confirmation
    const pending = page.locator('[data-invitation="lockkeeper@ferrow.example"]');
    await pending.getByRole("button", { name: "Send again" }).click();
    await expect.poll(() => page.locator("[role=status]").innerText(), { timeout: 15_000 }).toMatch(/sent again/);
    expect(await linkFromMail("lockkeeper@ferrow.example", /replaces the one sent before/)).toMatch(/\/invite\?token=/);
    await pending.getByRole("button", { name: "Cancel" }).click();
    await pending.getByRole("button", { name: "Yes, cancel it" }).click();
    await expect.poll(() => page.locator('[data-invitation="lockkeeper@ferrow.example"]').count(), { timeout: 15_000 }).toBe(0);
    expect(owner.outside).toEqual([]);
  });

  it("edits a family: the derived figures follow as figures are typed, a bad figure is named with its range, archive", async () => {
    const { page } = owner;
    await page.goto(`${BASE_URL}/w/ferrow-controls/families`);
    await page.getByRole("link", { name: "New family" }).click();
    await page.waitForURL(/\/families\/new$/);
    await page.getByLabel("Start from").selectOption({ label: "A copy of Bipolar TTL, standard, 5 V" });
    const low = page.getByTestId("derived-dcFanOutLow");
    // textbook standard TTL: IOL 16 mA / IIL 1.6 mA = 10 inputs held low
    await expect.poll(() => low.innerText()).toMatch(/floor\(16 mA \/ 1\.6 mA\) = 10/);
    await page.getByLabel("Name", { exact: true }).fill("Relay board TTL, bench figures");
    await page.getByRole("textbox", { name: /^Key/ }).fill(`relay-ttl-${Date.now()}`);
    // worked by hand: a weaker output sinking 8 mA feeds floor(8 / 1.6) = 5 standard inputs, and the family fan-out follows
    await page.getByLabel("IOL in mA").fill("8");
    await expect.poll(() => page.getByTestId("derived-dcFanOutLow-value").innerText()).toBe("5");
    await expect.poll(() => low.innerText()).toMatch(/floor\(8 mA \/ 1\.6 mA\) = 5/);
    await expect.poll(() => page.getByTestId("derived-fanOut-value").innerText()).toBe("5");
    // NMH follows VOH(min): 2.6 − 2.0 = 0.6 V
    await page.getByLabel("VOH(min) in V").fill("2.6");
    await expect.poll(() => page.getByTestId("derived-nmh-value").innerText()).toBe("0.60 V");
    await page.getByLabel("Source of IOL").fill("measured");
    await screenshot(page, "family-editor-derived");

    await page.getByLabel("VCC in V").fill("50");
    await expect.poll(() => page.locator('[data-figure="supplyV"] [role=alert]').innerText()).toBe("VCC (supply voltage) must be above 0 and at most 30 V; got 50");
    expect(await page.getByRole("button", { name: "Create family" }).isDisabled()).toBe(true);
    await screenshot(page, "family-editor-invalid");
    await page.getByLabel("VCC in V").fill("5");
    await page.getByRole("button", { name: "Create family" }).click();
    await page.waitForURL(/\/families\/[0-9a-f-]{36}$/, { timeout: 20_000 });
    await expect.poll(() => page.getByLabel("IOL in mA").inputValue(), { timeout: 15_000 }).toBe("8");
    expect(await page.getByLabel("Source of IOL").inputValue()).toBe("measured");
    // the copy keeps the standard figures' sources
    expect(await page.getByLabel("Source of IIL").inputValue()).toMatch(/standard TTL figures/);

    await page.getByRole("button", { name: "Archive" }).click();
    await page.getByRole("button", { name: "Yes, archive" }).click();
    await expect.poll(() => page.getByTestId("archived-badge").count(), { timeout: 15_000 }).toBe(1);
    await screenshot(page, "family-archived");
    expect(owner.outside).toEqual([]);
  });

  it("shows the compatibility matrix with the formula of a chosen pair", async () => {
    const { page } = owner;
    await page.goto(`${BASE_URL}/w/ferrow-controls`);
    await page.getByRole("link", { name: "Compatibility" }).click();
    await page.waitForSelector('[data-testid="compat-matrix"]');
    // textbook standard TTL into itself: compatible; into CMOS thresholds (JESD7A, 3.15 V at 4.5 V): not compatible
    expect(await page.locator('[data-pair="ttl-std-5v>ttl-std-5v"]').getAttribute("data-verdict")).toBe("compatible");
    expect(await page.locator('[data-pair="ttl-std-5v>cmos-hc-5v"]').getAttribute("data-verdict")).toBe("not-compatible");
    // the demo's bench family guards its inputs to 2.2 V: standard TTL's 2.4 V leaves 0.2 V, a small margin
    expect(await page.locator('[data-pair="ttl-std-5v>ferrow-hct-cabinet"]').getAttribute("data-verdict")).toBe("small-margin");
    await page.locator('[data-pair="ttl-std-5v>cmos-hc-5v"]').click();
    await expect.poll(() => page.getByTestId("pair-detail").innerText()).toMatch(/NMH = VOH\(min\) − VIH\(min\) = 2\.4 − 3\.15 = -0\.75 V/);
    expect(await page.getByTestId("pair-detail").innerText()).toMatch(/pull-up resistor .* TTL-level inputs/);
    await screenshot(page, "compatibility-matrix");
    expect(owner.outside).toEqual([]);
  });

  it("checks a design's boundaries with other families in the workbench, beside the estimate cautions", async () => {
    const { page } = owner;
    await page.goto(`${BASE_URL}/w/ferrow-controls`);
    await page.getByRole("link", { name: "Paddle driver decode" }).click();
    await page.waitForURL(/\/d\//);
    // the demo's latest revision: the select latch (low-power Schottky) drives the bench-measured HCT inputs
    await expect.poll(() => page.getByLabel("Family driving the inputs").inputValue(), { timeout: 20_000 }).toBe("ttl-ls-5v");
    await page.getByRole("tab", { name: "Figures" }).click();
    const inputs = page.getByTestId("boundary-inputs");
    // handbook LS VOH(min) 2.7 V − the bench's VIH(min) 2.2 V = 0.5 V; VIL(max) 0.8 V − LS VOL(max) 0.5 V = 0.3 V
    await expect.poll(() => inputs.getAttribute("data-verdict"), { timeout: 30_000 }).toBe("compatible");
    expect(await inputs.innerText()).toMatch(/NMH 0\.5 V · NML 0\.3 V/);
    // outputs into 3.3 V CMOS inputs: the 4.5 V swing exceeds their 3.8 V limit (from memory: VDD + 0.5 V)
    const sent = page.waitForResponse((r) => /\/designs\/[0-9a-f-]{36}\/draft$/.test(r.url()) && r.request().method() === "PUT", { timeout: 20_000 });
    await page.getByLabel("Family the outputs drive").selectOption("lvcmos-3v3");
    // the draft keeps the setting (the demo seed leaves the outputs unchecked)
    expect((await sent).request().postDataJSON()).toMatchObject({ settings: { outputsDrive: "lvcmos-3v3" } });
    const outputs = page.getByTestId("boundary-outputs");
    await expect.poll(() => outputs.getAttribute("data-verdict"), { timeout: 30_000 }).toBe("not-compatible");
    expect(await outputs.innerText()).toMatch(/level translator/);
    expect(await page.getByTestId("figures").innerText()).toMatch(/check the data sheets/);
    // the picture shows the whole workbench, the schematic drawn
    await page.waitForSelector('[data-testid="schematic"] g[data-gate]', { timeout: 30_000 });
    await outputs.scrollIntoViewIfNeeded();
    await screenshot(page, "workbench-boundaries");
    await page.getByRole("tab", { name: /Notes/ }).click();
    await expect.poll(() => page.getByTestId("notes").innerText()).toMatch(/outputs driving Low-voltage CMOS, 3\.3 V: not compatible/);
    // leave the demo design as it was
    const kept = page.waitForResponse((r) => /\/designs\/[0-9a-f-]{36}\/draft$/.test(r.url()) && r.request().method() === "PUT", { timeout: 20_000 });
    await page.getByLabel("Family the outputs drive").selectOption({ label: "not checked" });
    expect((await kept).status()).toBe(200);
    expect((await kept).request().postDataJSON().settings.outputsDrive).toBeUndefined();
    expect(owner.outside).toEqual([]);
  });
});
