/** Compile limits as 422, and no page of the app serves captured mail. */
import { existsSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { LimitError } from "@/lib/minimize";
import { asAppError } from "@/lib/runtime/compile";
import { limitError } from "@/lib/pipeline";
import { AppError, errorResponse } from "@/lib/api/errors";

describe("compile limits", () => {
  it("a minimizer LimitError becomes 422 compile_limit saying what was reached and what to change", async () => {
    // Built the way lib/minimize reports a design over MAX_INPUTS (30 inputs).
    const e = asAppError(limitError(new LimitError("MAX_INPUTS", 30, "the design has 31 inputs", "Split the design into blocks of at most 30 inputs.")));
    expect(e).toBeInstanceOf(AppError);
    const res = errorResponse(e);
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.error).toMatchObject({ code: "compile_limit", details: { limit: "limit", hint: expect.stringMatching(/Split/) } });
    expect(body.error.message).toContain("31 inputs");
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
