/**
 * Proves a netlist equal to its specification: every ON minterm gives 1 and
 * every OFF minterm gives 0 (don't-cares may give either). Exhaustive and
 * bit-parallel up to TRUTH_TABLE_MAX_INPUTS inputs; above that each gate is
 * encoded for the logic-solver SAT solver, which is asked for a minterm in
 * ON \ netlist or in netlist \ (ON ∪ DC).
 */
import type { Formula } from "logic-solver";
import { logicSolver } from "../verify/index";
import type { Cube } from "../logic/index";
import { TRUTH_TABLE_MAX_INPUTS, emptyTable, fullMask, tableFromCubes, cubeToString } from "../logic/index";
import type { Netlist } from "./netlist";
import { CONST0, CONST1, topoOrder } from "./netlist";
import { simulateNetlist } from "./simulate";

/** What one output must do: its ON-set (or OFF-set) and DC-set as cubes over the inputs. */
export interface VerifyTarget {
  name: string;
  /** ON-set cubes; when absent, `off` gives the OFF-set and everything else not in `dc` is ON. */
  on?: Cube[];
  off?: Cube[];
  dc: Cube[];
}

export interface Mismatch {
  output: string;
  /** Minterm index (first input = most significant bit). */
  minterm: number;
  /** The assignment as a string of 0/1 in input order. */
  assignment: string;
  expected: 0 | 1;
  got: 0 | 1;
}

export interface VerifyResult {
  ok: boolean;
  method: "exhaustive" | "sat";
  mismatches: Mismatch[];
}


/** Checks the netlist against each target output (matched by name). */
export function verifyNetlist(netlist: Netlist, inputs: string[], targets: VerifyTarget[]): VerifyResult {
  return inputs.length <= TRUTH_TABLE_MAX_INPUTS ? verifyExhaustive(netlist, inputs, targets) : verifySat(netlist, inputs, targets);
}

/** Word patterns for input variable at bit position p (p < 5) within one 32-minterm word. */
const LOW_PATTERNS = [0xaaaaaaaa, 0xcccccccc, 0xf0f0f0f0, 0xff00ff00, 0xffff0000];

function verifyExhaustive(netlist: Netlist, inputs: string[], targets: VerifyTarget[]): VerifyResult {
  const n = inputs.length;
  const words = emptyTable(n).length;
  const valid = n >= 5 ? 0xffffffff : fullMask(2 ** n);
  const tables: Uint32Array[] = inputs.map((_, i) => {
    const p = n - 1 - i;
    const t = new Uint32Array(words);
    for (let w = 0; w < words; w++) t[w] = p < 5 ? LOW_PATTERNS[p]! : ((w * 32) >>> p) & 1 ? 0xffffffff : 0;
    return t;
  });
  const byName = new Map(inputs.map((name, i) => [name, tables[i]!]));
  const outTables = simulateNetlist(
    netlist,
    netlist.inputs.map((name) => {
      const t = byName.get(name);
      if (!t) throw new Error(`the netlist's input "${name}" is not an input of the specification`);
      return t;
    }),
  );
  const nets = new Map(netlist.outputs.map((o, i) => [o.net, outTables[i]!]));
  const mismatches: Mismatch[] = [];
  for (const t of targets) {
    const o = netlist.outputs.find((x) => x.name === t.name);
    if (!o) throw new Error(`the netlist has no output "${t.name}"`);
    const got = nets.get(o.net);
    if (!got) throw new Error(`output "${t.name}" reads net "${o.net}", which nothing drives`);
    const dc = tableFromCubes(t.dc, n);
    const on = t.on ? tableFromCubes(t.on, n) : tableFromCubes(t.off ?? [], n).map((x, w) => ~x & ~dc[w]! >>> 0);
    for (let w = 0; w < words && mismatches.length < 8; w++) {
      const bad = ((on[w]! & ~got[w]!) | (got[w]! & ~on[w]! & ~dc[w]!)) & valid;
      if (bad !== 0) {
        const b = 31 - Math.clz32(bad & -bad);
        const m = w * 32 + b;
        const expected = (on[w]! >>> b) & 1 ? 1 : 0;
        mismatches.push({ output: t.name, minterm: m, assignment: cubeToString({ value: m, mask: fullMask(n) }, n), expected, got: expected ? 0 : 1 });
      }
    }
  }
  return { ok: mismatches.length === 0, method: "exhaustive", mismatches };
}

function cubeFormula(c: Cube, vars: string[]): Formula {
  const Logic = logicSolver();
  const n = vars.length;
  const lits: Formula[] = [];
  for (let i = 0; i < n; i++) {
    const bit = 1 << (n - 1 - i);
    if (c.mask & bit) lits.push(c.value & bit ? vars[i]! : Logic.not(vars[i]!));
  }
  return lits.length === 0 ? Logic.TRUE : Logic.and(...lits);
}

function verifySat(netlist: Netlist, inputs: string[], targets: VerifyTarget[]): VerifyResult {
  const Logic = logicSolver();
  const vars = inputs.map((_, i) => `x${i}`);
  const f = new Map<string, Formula>();
  f.set(CONST0, Logic.FALSE);
  f.set(CONST1, Logic.TRUE);
  inputs.forEach((name, i) => f.set(name, vars[i]!));
  for (const r of netlist.complements) f.set(r.net, Logic.not(f.get(r.input)!));
  for (const g of topoOrder(netlist)) {
    const ins = g.inputs.map((i) => {
      const x = f.get(i);
      if (x === undefined) throw new Error(`gate ${g.id} reads net "${i}", which nothing drives`);
      return x;
    });
    let v: Formula;
    switch (g.type) {
      case "AND": v = Logic.and(...ins); break;
      case "NAND": v = Logic.not(Logic.and(...ins)); break;
      case "OR": v = Logic.or(...ins); break;
      case "NOR": v = Logic.not(Logic.or(...ins)); break;
      case "XOR": v = Logic.xor(...ins); break;
      case "XNOR": v = Logic.not(Logic.xor(...ins)); break;
      case "NOT": v = Logic.not(ins[0]); break;
      case "BUF": v = ins[0]; break;
    }
    f.set(g.output, v);
  }
  const mismatches: Mismatch[] = [];
  for (const t of targets) {
    const o = netlist.outputs.find((x) => x.name === t.name);
    if (!o) throw new Error(`the netlist has no output "${t.name}"`);
    const got = f.get(o.net);
    if (got === undefined) throw new Error(`output "${t.name}" reads net "${o.net}", which nothing drives`);
    const dc = Logic.or(...t.dc.map((c) => cubeFormula(c, vars)));
    const on = t.on ? Logic.or(...t.on.map((c) => cubeFormula(c, vars))) : Logic.and(Logic.not(Logic.or(...(t.off ?? []).map((c) => cubeFormula(c, vars)))), Logic.not(dc));
    const cases: [Formula, 0 | 1][] = [
      [Logic.and(on, Logic.not(got)), 1],
      [Logic.and(got, Logic.not(on), Logic.not(dc)), 0],
    ];
    for (const [bad, expected] of cases) {
      const s = new Logic.Solver();
      s.require(bad);
      const sol = s.solve();
      if (sol) {
        const trueVars = new Set(sol.getTrueVars());
        let m = 0;
        vars.forEach((v, i) => {
          if (trueVars.has(v)) m |= 1 << (inputs.length - 1 - i);
        });
        m >>>= 0;
        mismatches.push({ output: t.name, minterm: m, assignment: cubeToString({ value: m, mask: fullMask(inputs.length) }, inputs.length), expected, got: expected ? 0 : 1 });
      }
    }
  }
  return { ok: mismatches.length === 0, method: "sat", mismatches };
}
