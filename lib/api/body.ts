import { AppError } from "./errors";

/** Largest accepted request body, in bytes: 256 KiB. */
export const MAX_BODY_BYTES = 256 * 1024;

/**
 * Deepest nesting of objects and arrays a JSON body may have: 32 levels (the
 * body's own object is level 1). Nothing the API takes comes near it; deeper
 * bodies are refused before parsing, so no later step recurses into them.
 */
export const MAX_JSON_DEPTH = 32;

/**
 * Whether JSON text nests objects and arrays deeper than `limit`, counted in
 * one pass over the text (no parsing, no recursion); brackets inside strings
 * do not count.
 */
export function jsonDeeperThan(text: string, limit = MAX_JSON_DEPTH): boolean {
  let depth = 0;
  let inString = false;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (inString) {
      if (c === 0x5c) i++; // a backslash escapes the next character
      else if (c === 0x22) inString = false;
    } else if (c === 0x22) inString = true;
    else if (c === 0x7b || c === 0x5b) {
      if (++depth > limit) return true;
    } else if (c === 0x7d || c === 0x5d) depth--;
  }
  return false;
}

const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/** A string PostgreSQL cannot store as it is: NUL (U+0000), or half of a UTF-16 surrogate pair (not Unicode text). */
function badText(s: string): "nul" | "surrogate" | null {
  if (s.includes("\u0000")) return "nul";
  if (LONE_SURROGATE.test(s)) return "surrogate";
  return null;
}

/**
 * The first string in a parsed JSON value, key or value, that cannot be stored
 * byte for byte, with its path (dots between keys and indexes, as the API's
 * validation errors name fields); null when every string is fine. Walks with
 * an explicit stack.
 */
export function findUnstorableText(value: unknown): { path: string; problem: "nul" | "surrogate" } | null {
  const stack: Array<[unknown, string[]]> = [[value, []]];
  while (stack.length) {
    const [v, at] = stack.pop()!;
    if (typeof v === "string") {
      const problem = badText(v);
      if (problem) return { path: at.join("."), problem };
    } else if (Array.isArray(v)) {
      for (let i = v.length - 1; i >= 0; i--) stack.push([v[i], [...at, String(i)]]);
    } else if (v && typeof v === "object") {
      const entries = Object.entries(v);
      for (let i = entries.length - 1; i >= 0; i--) {
        const [k, child] = entries[i]!;
        const problem = badText(k);
        if (problem) return { path: [...at, JSON.stringify(k).slice(1, -1)].join("."), problem };
        stack.push([child, [...at, k]]);
      }
    }
  }
  return null;
}

/** The 400 for a string that cannot be stored, naming where it is. */
export function unstorableTextError(where: string, found: { path: string; problem: "nul" | "surrogate" }): AppError {
  const field = found.path ? `${where}.${found.path}` : where;
  const message =
    found.problem === "nul"
      ? `The ${where} has a NUL character (U+0000, "\\u0000") in ${field}; remove it: text here cannot hold it.`
      : `The ${where} has half of a UTF-16 surrogate pair in ${field}, which is not Unicode text; send the whole character or remove it.`;
  return new AppError("invalid_input", message, [{ path: found.path, code: found.problem === "nul" ? "nul_character" : "lone_surrogate", message }]);
}

/**
 * Reads a JSON body, refusing non-JSON (415), bodies over `maxBytes` (413,
 * counted while reading, whatever Content-Length claims), text that is not
 * JSON (400), JSON nested deeper than MAX_JSON_DEPTH (400) and strings that
 * cannot be stored as sent — NUL or a lone surrogate, anywhere (400, naming
 * the field). Default limit MAX_BODY_BYTES.
 */
export async function readJsonBody(req: Request, maxBytes = MAX_BODY_BYTES): Promise<unknown> {
  const type = req.headers.get("content-type") ?? "";
  if (!/^application\/(?:[\w.+-]+\+)?json\s*(?:;|$)/i.test(type)) {
    throw new AppError("unsupported_media_type", "Send the body as JSON with `Content-Type: application/json`.", {
      contentType: type || null,
    });
  }
  const text = await readBodyText(req, maxBytes);
  if (text.trim() === "") throw new AppError("malformed_json", "The body is empty; send a JSON object.");
  if (jsonDeeperThan(text, MAX_JSON_DEPTH)) {
    throw new AppError("invalid_input", `The body nests objects and arrays more than ${MAX_JSON_DEPTH} levels deep; flatten it.`, [
      { path: "", code: "too_deep", message: `at most ${MAX_JSON_DEPTH} levels of objects and arrays` },
    ]);
  }
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch (e) {
    throw new AppError("malformed_json", `The body is not valid JSON: ${(e as Error).message}`);
  }
  const bad = findUnstorableText(value);
  if (bad) throw unstorableTextError("body", bad);
  return value;
}

/**
 * The body as UTF-8 text, refusing bodies over `maxBytes` (413, counted while
 * reading, whatever Content-Length claims) and bytes that are not UTF-8 (400).
 */
export async function readBodyText(req: Request, maxBytes = MAX_BODY_BYTES): Promise<string> {
  const tooLarge = () =>
    new AppError("payload_too_large", `The body is larger than ${maxBytes} bytes; send less at once.`, { maxBytes });
  const declared = Number(req.headers.get("content-length") ?? NaN);
  if (Number.isFinite(declared) && declared > maxBytes) throw tooLarge();
  const chunks: Uint8Array[] = [];
  let total = 0;
  if (req.body) {
    const reader = req.body.getReader();
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      total += value.byteLength;
      if (total > maxBytes) {
        await reader.cancel().catch(() => {});
        throw tooLarge();
      }
      chunks.push(value);
    }
  }
  const bytes = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    bytes.set(c, at);
    at += c.byteLength;
  }
  try {
    return new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    throw new AppError("malformed_json", "The body is not valid UTF-8 text.");
  }
}
