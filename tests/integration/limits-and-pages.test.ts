/** Compile limits as 422, and no page of the app serves captured mail. */
import { existsSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { LimitError, minimize } from "@/lib/minimize";
import { asAppError } from "@/lib/runtime/compile";
import { limitError } from "@/lib/pipeline";
import { AppError, errorResponse } from "@/lib/api/errors";

describe("compile limits", () => {
  it("a minimizer LimitError becomes 422 compile_limit saying what was reached and what to change", async () => {
    // The minimizer's own report of a design over its 30 inputs (lib/logic MAX_INPUTS).
    let thrown: unknown = null;
    try {
      minimize({ inputs: Array.from({ length: 31 }, (_, i) => `i${i}`), outputs: [] });
    } catch (err) {
      thrown = err;
    }
    expect(thrown).toBeInstanceOf(LimitError);
    const e = asAppError(limitError(thrown as LimitError));
    expect(e).toBeInstanceOf(AppError);
    const res = errorResponse(e);
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.error).toMatchObject({ code: "compile_limit", details: { limit: "limit", what: "limit of 30 inputs", hint: expect.stringMatching(/Split/) } });
    // The message is for people: what was reached and what to change, no code names.
    expect(body.error.message).toContain("31 inputs");
    expect(body.error.message).not.toContain("MAX_INPUTS");
  });
  it("a netlist the family cannot build is a 422 compile_errors at the mapping stage", async () => {
    const body = await errorResponse(asAppError({ code: "mapping", message: "the family offers no gate that inverts" })).json();
    expect(body.error).toMatchObject({ code: "compile_errors", details: { stage: "mapping" } });
  });
});

describe("captured mail", () => {
  it("the app has no page or route for it: only the mail catcher shows it, on its own loopback port", () => {
    // The browser tests ask the running server for /dev/mail too (404).
    expect(existsSync(path.resolve("app/dev"))).toBe(false);
  });
});
