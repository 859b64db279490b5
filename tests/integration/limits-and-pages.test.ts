/** Compile limits as 422, and the captured-mail page hidden without the mail catcher. */
import { afterEach, describe, expect, it } from "vitest";
import { LimitError } from "@/lib/minimize";
import { asAppError } from "@/lib/api/compile";
import { limitError } from "@/lib/pipeline";
import { AppError, errorResponse } from "@/lib/api/errors";
import CapturedMail from "@/app/dev/mail/page";

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

describe("captured-mail page", () => {
  const saved = process.env.FANBOUND_MAIL_CATCHER;
  afterEach(() => {
    if (saved === undefined) delete process.env.FANBOUND_MAIL_CATCHER;
    else process.env.FANBOUND_MAIL_CATCHER = saved;
  });

  it("answers 404 unless FANBOUND_MAIL_CATCHER=1", async () => {
    delete process.env.FANBOUND_MAIL_CATCHER;
    // next/navigation's notFound() throws an error whose digest carries the 404.
    await expect(CapturedMail()).rejects.toMatchObject({ digest: expect.stringContaining("404") });
  });

  it("renders the captured messages when the catcher is in use", async () => {
    process.env.FANBOUND_MAIL_CATCHER = "1";
    const el = await CapturedMail();
    expect(el).toBeTruthy();
  });
});
