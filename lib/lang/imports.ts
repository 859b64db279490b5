/**
 * Use lines → library blocks. Each `use` line is answered by the caller's
 * resolver with the source of one block revision; that source is a design of
 * its own (inputs, outputs, equations, never lines), checked here and turned
 * into a block whose parameters are its inputs and whose results are its
 * outputs, in declared order. Every failure is one error on the use line,
 * saying what to write instead.
 */
import type { Program, Range, Statement } from "./ast";
import { checkProgram, hasErrors, type BlockInfo, type BlockStatement, type Imports } from "./check";
import { error, type Diagnostic } from "./diagnostics";
import type { LibraryAnswer, LibraryResolver, UsedBlock } from "./library";
import type { LanguageLimits } from "./limits";
import { parseSource } from "./parse";

type UseStatement = Extract<Statement, { kind: "use" }>;

const NO_RESOLVER =
  "library blocks are looked up by the server (in the workbench, the API) or by the CLI (FANBOUND_URL and FANBOUND_TOKEN, or --library NAME=DIR); here there is no library to read";

/** Resolves the use lines of a parsed program. Errors are appended to `diagnostics`. */
export function importBlocks(
  program: Program,
  resolve: LibraryResolver | undefined,
  limits: Required<LanguageLimits>,
  diagnostics: Diagnostic[],
): Imports & { used: UsedBlock[] } {
  const blocks = new Map<string, BlockInfo>();
  const failed = new Set<string>();
  const used: UsedBlock[] = [];
  const seen = new Map<string, UseStatement>();
  for (const s of program.statements) {
    if (s.kind !== "use") continue;
    const name = s.name.text;
    const fail = (message: string, range: Range = s.range) => {
      diagnostics.push(error(message, range));
      if (!blocks.has(name)) failed.add(name);
    };
    const prior = seen.get(name);
    if (prior) {
      fail(
        `block '${name}' is brought in twice (first at line ${prior.range.line}); keep one use line, or give the other block a local name by copying it`,
        s.name.range,
      );
      continue;
    }
    seen.set(name, s);
    if (!resolve) {
      fail(`${NO_RESOLVER}, so block '${name}' from "${s.library}" cannot be used`);
      continue;
    }
    let answer: LibraryAnswer;
    try {
      answer = resolve({ library: s.library, block: name, revision: s.revision });
    } catch (e) {
      answer = { ok: false, message: `looking up block '${name}' in "${s.library}" failed: ${e instanceof Error ? e.message : String(e)}` };
    }
    if (!answer.ok) {
      fail(answer.message);
      continue;
    }
    if (s.revision === null || !s.revisionRange) {
      fail(
        `say which revision of '${name}' this design uses: write use ${name} from "${s.library}" at ${answer.latest ?? answer.revision}` +
          ` (the latest); a design pins the revisions it uses, so a new revision never changes it unasked`,
      );
      continue;
    }
    const made = blockFromSource(s, answer.source, answer.revision, limits);
    if (typeof made === "string") {
      fail(made);
      continue;
    }
    blocks.set(name, made);
    used.push({
      library: s.library,
      block: name,
      revision: answer.revision,
      inputs: made.statement.params.map((p) => p.text),
      outputs: made.statement.results.map((r) => r.text),
      range: s.range,
      revisionRange: s.revisionRange,
    });
  }
  return { blocks, failed, used };
}

/** The block a library source makes, or what is wrong with it. */
function blockFromSource(use: UseStatement, source: string, revision: number, limits: Required<LanguageLimits>): BlockInfo | string {
  const label = `block '${use.name.text}' from "${use.library}" at ${revision}`;
  const parsed = parseSource(source, limits);
  const d: Diagnostic[] = [...parsed.diagnostics];
  if (!hasErrors(d)) {
    const nested = parsed.program.statements.find((x) => x.kind === "use");
    if (nested) {
      return `${label} uses library blocks itself (line ${nested.range.line}), which a library block may not; publish a revision that copies that block in`;
    }
  }
  const checked = hasErrors(d) ? null : checkProgram(parsed.program, d);
  const firstError = d.find((x) => x.severity === "error");
  if (!checked || firstError) {
    return `${label} does not compile (its line ${firstError?.line ?? 1}: ${firstError?.message ?? "errors"}); use another revision`;
  }
  const design = checked.design;
  for (const o of design.outputs) {
    const def = design.defs.get(o.text);
    const v = def?.statement.value;
    const dc = v && (v.kind === "expr" ? v.dc !== null : v.clauses.some((c) => c.kind === "dc"));
    if (dc) {
      return `${label} gives don't-cares on its output '${o.text}'; a library block's outputs must be fully specified (impossible input combinations are written as never lines), so use another revision`;
    }
  }
  const statement: BlockStatement = {
    kind: "block",
    name: use.name,
    params: design.inputs,
    results: design.outputs,
    body: [],
    range: use.range,
    headerRange: use.range,
  };
  return {
    statement,
    scope: design,
    blocks: checked.blocks,
    nevers: checked.nevers,
    library: { library: use.library, revision },
  };
}

/**
 * The checks a block's source must pass to be published to a library: it
 * compiles as a design of its own, uses no library blocks itself, and its
 * outputs are fully specified (no dc(...); impossible input combinations are
 * never lines). Diagnostics are located in the block's own source.
 */
export function checkBlockSource(source: string, limits: Required<LanguageLimits>): { diagnostics: Diagnostic[]; inputs: string[]; outputs: string[] } {
  const d: Diagnostic[] = [];
  const parsed = parseSource(source, limits);
  d.push(...parsed.diagnostics);
  const inputs: string[] = [];
  const outputs: string[] = [];
  if (!hasErrors(d)) {
    const uses = parsed.program.statements.flatMap((s) => (s.kind === "use" ? [s.name.text] : []));
    const checked = checkProgram(parsed.program, d, { blocks: new Map(), failed: new Set(uses) });
    inputs.push(...checked.design.inputs.map((n) => n.text));
    outputs.push(...checked.design.outputs.map((n) => n.text));
    for (const s of parsed.program.statements) {
      if (s.kind === "use") {
        d.push(error(`a library block cannot use other library blocks; copy block '${s.name.text}' into this source as a block … end`, s.range));
      }
      if (s.kind === "assign") {
        const v = s.value;
        const dc = v.kind === "expr" ? v.dc : v.clauses.find((c) => c.kind === "dc");
        if (dc) {
          d.push(error(`a library block's outputs must be fully specified, so it cannot have dc(...); write impossible input combinations as never lines instead`, dc.range));
        }
      }
    }
  }
  return { diagnostics: d, inputs, outputs };
}
