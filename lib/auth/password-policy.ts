/**
 * What a new password may not be: shorter than 10 characters, one of the
 * passwords people use most (or close to one), a repeat ("aaaaaaaaaa",
 * "abcabcabc"), a run ("1234567890", "abcdefghij"), a row of neighbouring
 * keys ("qwertyuiop", "asdfghjkl;"), or built from the account's own e-mail
 * address or name. Guessability is zxcvbn's estimate (@zxcvbn-ts/core with its
 * common dictionaries and keyboard layouts, all shipped in the package; it
 * fetches nothing): a password must need at least 10^8 guesses (its score 3).
 */
import { ZxcvbnFactory, type ZxcvbnResult } from "@zxcvbn-ts/core";
import * as common from "@zxcvbn-ts/language-common";

/** Fewest characters a password may have. */
export const MIN_PASSWORD_LENGTH = 10;
/** Lowest zxcvbn score accepted: 3 ("safely unguessable", at least 10^8 guesses). */
export const MIN_PASSWORD_SCORE = 3;

let factory: ZxcvbnFactory | null = null;
function estimator(): ZxcvbnFactory {
  // The dictionaries are large: built on first use, once per process.
  return (factory ??= new ZxcvbnFactory({ dictionary: { ...common.dictionary }, graphs: common.adjacencyGraphs }));
}

const ADVICE = "Choose at least 10 characters that are hard to guess, for example three or four unrelated words.";

const squash = (s: string) => s.toLowerCase().replace(/[^\p{L}\p{N}]+/gu, "");

/** Why zxcvbn found the password easy, in our words. */
function reason(r: ZxcvbnResult): string {
  switch (r.feedback.warning) {
    case "simpleRepeat":
    case "extendedRepeat":
      return "repeats the same characters (like “aaaa” or “abcabc”)";
    case "sequences":
      return "is a run of characters in order (like “abcd” or “6789”)";
    case "straightRow":
    case "keyPattern":
      return "is a row or pattern of neighbouring keys on the keyboard (like “qwerty” or “asdf”)";
    case "topTen":
    case "topHundred":
    case "common":
    case "similarToCommon":
    case "wordByItself":
    case "pwned":
      return "is one of the passwords people use most, or close to one";
    case "userInputs":
      return "is made from your e-mail address or name";
    case "dates":
    case "recentYears":
      return "is mostly a date or a year";
    case "namesByThemselves":
    case "commonNames":
    case "commonNamesByThemselves":
      return "is mostly a common name";
    default:
      return "is too easy to guess";
  }
}

/**
 * Why `password` will not do for the account with this e-mail and name, as a
 * sentence that says what to change; null when it is fine.
 */
export function passwordProblem(password: string, account: { email: string; name?: string }): string | null {
  if (password.length < MIN_PASSWORD_LENGTH) return `The password is shorter than ${MIN_PASSWORD_LENGTH} characters. ${ADVICE}`;
  const email = account.email.trim().toLowerCase();
  const local = email.split("@")[0] ?? "";
  const own = [squash(email), squash(local), squash(account.name ?? ""), ...(account.name ?? "").split(/\s+/).map(squash)].filter((s) => s.length >= 4);
  const p = squash(password);
  if (own.some((s) => p.includes(s))) return `The password contains your e-mail address or name. ${ADVICE}`;
  const r = estimator().check(password.slice(0, 100), [email, local, account.name ?? ""].filter(Boolean));
  if (r.score < MIN_PASSWORD_SCORE) return `The password ${reason(r)}. ${ADVICE}`;
  return null;
}
