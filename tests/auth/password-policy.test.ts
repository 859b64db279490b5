import { describe, expect, it } from "vitest";
import { passwordProblem } from "@/lib/auth/password-policy";

const account = { email: "orla.ferrow@ferrow.example", name: "Orla Ferrow" };

describe("password policy", () => {
  // The refused kinds are the ones NIST SP 800-63B (5.1.1.2) lists for checking new passwords
  // against: commonly used or breached values, repetitive or sequential characters, context-specific words.
  const refused: Array<[string, RegExp]> = [
    ["short-1", /shorter than 10/],
    ["aaaaaaaaaa", /repeats/],
    ["abcabcabcabc", /repeats/],
    ["abcdefghij", /run of characters/],
    ["1234567890", /passwords people use most|run of characters/],
    ["password123", /passwords people use most/],
    ["Password2024!", /passwords people use most/],
    ["qwertyuiop", /passwords people use most|neighbouring keys/],
    ["zxcvbnm,./", /neighbouring keys/],
    ["orla.ferrow@ferrow.example", /e-mail address or name/],
    ["OrlaFerrow-2026", /e-mail address or name/],
    ["ferrow-ferrow-ferrow", /e-mail address or name/],
  ];
  for (const [password, why] of refused) {
    it(`refuses ${JSON.stringify(password)}, saying what to change`, () => {
      const problem = passwordProblem(password, account);
      expect(problem).toMatch(why);
      expect(problem).toMatch(/three or four unrelated words/);
    });
  }

  for (const password of ["paddle-and-gate", "lock-keeper-pass", "weir-keeper-2026", "sluice gate heron tide"]) {
    it(`accepts ${JSON.stringify(password)}`, () => {
      expect(passwordProblem(password, account)).toBeNull();
    });
  }
});
