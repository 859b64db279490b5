import { describe, expect, it } from "vitest";
import { findUnstorableText, jsonDeeperThan, MAX_JSON_DEPTH } from "@/lib/api/body";

describe("JSON depth, counted without parsing", () => {
  it("counts objects and arrays, not brackets inside strings or after escapes", () => {
    expect(jsonDeeperThan('{"a":[1,{"b":2}]}', 3)).toBe(false);
    expect(jsonDeeperThan('{"a":[1,{"b":2}]}', 2)).toBe(true);
    expect(jsonDeeperThan('{"a":"[[[[[[\\"[[[["}', 1)).toBe(false);
    expect(jsonDeeperThan(`${"[".repeat(MAX_JSON_DEPTH)}${"]".repeat(MAX_JSON_DEPTH)}`)).toBe(false);
    expect(jsonDeeperThan(`${"[".repeat(MAX_JSON_DEPTH + 1)}${"]".repeat(MAX_JSON_DEPTH + 1)}`)).toBe(true);
    // A million levels: one pass, no stack to overflow.
    expect(jsonDeeperThan("[".repeat(1_000_000))).toBe(true);
  });
});

describe("text PostgreSQL cannot store as sent", () => {
  it("finds NUL and lone surrogates in values and keys, with their path", () => {
    expect(findUnstorableText({ a: ["ok", { b: "x\u0000y" }] })).toEqual({ path: "a.1.b", problem: "nul" });
    expect(findUnstorableText({ "k\u0000": 1 })).toEqual({ path: "k\\u0000", problem: "nul" });
    expect(findUnstorableText({ s: "half \ud83d pair" })).toEqual({ path: "s", problem: "surrogate" });
    expect(findUnstorableText({ s: "tail \ude00 only" })).toEqual({ path: "s", problem: "surrogate" });
    // Whole pairs (outside the BMP), combining marks, U+FEFF and U+FFFD are ordinary text.
    expect(findUnstorableText({ s: "\u{1F30A} e\u0301 \uFEFF \uFFFD \u2028", n: [1, null, true] })).toBeNull();
  });
});
