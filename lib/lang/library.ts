/**
 * Library blocks: what the language asks of whoever supplies them. The core
 * reads no files and no database; the caller hands compileSource a resolver
 * (the server answers from revisions it loaded before parsing, the CLI from
 * its --library folders or the server's API), and the resolver answers
 * synchronously.
 */
import type { Range } from "./ast";
import { At, From, Identifier, lexer, Newline, Number_, Str, Use } from "./tokens";

/** One `use` line as the resolver is asked about it. */
export interface LibraryRequest {
  /** The library as written between the quotes, e.g. "lock-blocks" or "ferrow-controls/lock-blocks". */
  library: string;
  /** The block's name. */
  block: string;
  /** The number after `at`; null when the line has none (the resolver then answers with the latest). */
  revision: number | null;
}

/**
 * The resolver's answer: the block revision's source (a design of its own:
 * inputs, outputs, equations, never lines), or why it cannot be had, said as
 * what to write instead.
 */
export type LibraryAnswer =
  | {
      ok: true;
      /** The block revision's source text. */
      source: string;
      /** The revision this source is (the one asked for, or the latest when none was). */
      revision: number;
      /** The latest revision that may be used, when the resolver knows it. */
      latest?: number;
    }
  | { ok: false; message: string };

/** Answers `use` lines; must not throw (a thrown error is reported as the use line's error). */
export type LibraryResolver = (request: LibraryRequest) => LibraryAnswer;

/** A library block a compiled source brought in, with its ports. */
export interface UsedBlock {
  library: string;
  block: string;
  revision: number;
  /** Its inputs in order: the parameters of a call. */
  inputs: string[];
  /** Its outputs in order: the results of a call. */
  outputs: string[];
  /** The use line. */
  range: Range;
  /** The revision number on the use line (where an upgrade writes the new number). */
  revisionRange: Range;
}

/** A `use` line found by {@link findUses}. */
export interface UseLine extends LibraryRequest {
  range: Range;
  revisionRange: Range | null;
}

/**
 * The `use` lines of a source, found from its tokens alone (no parse): lets a
 * caller load the library revisions it needs before it compiles. Lines that
 * are not well-formed `use` lines are skipped; the compile reports them.
 */
export function findUses(source: string): UseLine[] {
  if (!/\buse\b/.test(source)) return [];
  const tokens = lexer.tokenize(source.charCodeAt(0) === 0xfeff ? source.slice(1) : source).tokens;
  const out: UseLine[] = [];
  for (let i = 0; i < tokens.length; i++) {
    if (tokens[i]!.tokenType !== Use) continue;
    if (i > 0 && tokens[i - 1]!.tokenType !== Newline) continue;
    const name = tokens[i + 1];
    const from = tokens[i + 2];
    const lib = tokens[i + 3];
    if (name?.tokenType !== Identifier || from?.tokenType !== From || lib?.tokenType !== Str) continue;
    const at = tokens[i + 4];
    const num = at?.tokenType === At ? tokens[i + 5] : undefined;
    const rev = num?.tokenType === Number_ ? num : undefined;
    const last = rev ?? lib;
    const t0 = tokens[i]!;
    out.push({
      library: lib.image.slice(1, -1),
      block: name.image,
      revision: rev ? Number(rev.image) : null,
      range: { line: t0.startLine!, column: t0.startColumn!, endLine: last.endLine!, endColumn: last.endColumn! + 1 },
      revisionRange: rev ? { line: rev.startLine!, column: rev.startColumn!, endLine: rev.endLine!, endColumn: rev.endColumn! + 1 } : null,
    });
  }
  return out;
}

/** The key a resolver's answers are kept under: library, block and revision as written. */
export function requestKey(r: LibraryRequest): string {
  return JSON.stringify([r.library, r.block, r.revision]);
}

/**
 * A resolver that answers from a list made beforehand (keyed by {@link requestKey}),
 * and otherwise with `fallback`'s message. The server and the CLI load what
 * the use lines name, then hand this to compileSource.
 */
export function resolverFrom(answers: ReadonlyMap<string, LibraryAnswer>, fallback: (r: LibraryRequest) => string): LibraryResolver {
  return (r) => answers.get(requestKey(r)) ?? { ok: false, message: fallback(r) };
}
