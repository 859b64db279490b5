/**
 * A multi-level logic network as the mapper takes it: each output is an
 * expression over the inputs of AND, OR, XOR and NOT; a sub-expression used
 * in several places is the same object, and is built once.
 */

export type LogicExpr =
  | { kind: "const"; value: boolean }
  /** Input `index` of the network's inputs. */
  | { kind: "input"; index: number }
  | { kind: "not"; arg: LogicExpr }
  | { kind: "and" | "or" | "xor"; args: LogicExpr[] };

export interface LogicNetwork {
  inputs: string[];
  outputs: { name: string; expr: LogicExpr }[];
}

export const TRUE: LogicExpr = { kind: "const", value: true };
export const FALSE: LogicExpr = { kind: "const", value: false };

/** The expression's complement: a NOT around it, or the NOT removed. */
export function negate(e: LogicExpr): LogicExpr {
  if (e.kind === "const") return e.value ? FALSE : TRUE;
  if (e.kind === "not") return e.arg;
  return { kind: "not", arg: e };
}

/** Evaluates the expression for one input assignment (inputs[i] = value of input i). */
export function evaluate(e: LogicExpr, inputs: readonly boolean[], memo = new Map<LogicExpr, boolean>()): boolean {
  const hit = memo.get(e);
  if (hit !== undefined) return hit;
  let v: boolean;
  switch (e.kind) {
    case "const": v = e.value; break;
    case "input": v = inputs[e.index]!; break;
    case "not": v = !evaluate(e.arg, inputs, memo); break;
    case "and": v = e.args.every((a) => evaluate(a, inputs, memo)); break;
    case "or": v = e.args.some((a) => evaluate(a, inputs, memo)); break;
    case "xor": v = e.args.reduce((s, a) => s !== evaluate(a, inputs, memo), false); break;
  }
  memo.set(e, v);
  return v;
}
