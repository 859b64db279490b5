/**
 * The netlist as an implementation for lib/verify, which proves it equal to a
 * specification: exhaustively on bit-parallel truth tables up to
 * TRUTH_TABLE_MAX_INPUTS inputs (simulateNetlist), by refuting both
 * inclusions with the logic-solver SAT solver above (one formula per gate).
 */
import type { Formula } from "logic-solver";
import type { Cube, FunctionSpec } from "../logic/index";
import { cubeToString, fullMask } from "../logic/index";
import { verifyImplementation, type Implementation, type LogicModule, type Verdict, type VerifyOptions } from "../verify/index";
import type { Netlist } from "./netlist";
import { CONST0, CONST1, topoOrder } from "./netlist";
import { simulateNetlist } from "./simulate";

export type { Verdict } from "../verify/index";
/** The verdict kept with a mapping (lib/verify's). */
export type VerifyResult = Verdict;

/**
 * The netlist as lib/verify's Implementation for a specification over
 * `inputs` with outputs `outputs` (names, in the specification's order).
 */
export function netlistImplementation(netlist: Netlist, inputs: readonly string[], outputs: readonly string[]): Implementation {
  const outIndex = outputs.map((name) => {
    const k = netlist.outputs.findIndex((o) => o.name === name);
    if (k < 0) throw new Error(`the netlist has no output "${name}"`);
    return k;
  });
  const position = new Map(inputs.map((name, i) => [name, i]));
  const inputAt = netlist.inputs.map((name) => {
    const i = position.get(name);
    if (i === undefined) throw new Error(`the netlist's input "${name}" is not an input of the specification`);
    return i;
  });
  return {
    simulate(tables) {
      const got = simulateNetlist(netlist, inputAt.map((i) => tables[i]!));
      return outIndex.map((k) => got[k]!);
    },
    encode(logic: LogicModule, vars: Formula[]) {
      const f = new Map<string, Formula>([[CONST0, logic.FALSE], [CONST1, logic.TRUE]]);
      netlist.inputs.forEach((name, j) => f.set(name, vars[inputAt[j]!]!));
      for (const r of netlist.complements) f.set(r.net, logic.not(f.get(r.input)!));
      for (const g of topoOrder(netlist)) {
        const ins = g.inputs.map((i) => {
          const x = f.get(i);
          if (x === undefined) throw new Error(`gate ${g.id} reads net "${i}", which nothing drives`);
          return x;
        });
        let v: Formula;
        switch (g.type) {
          case "AND": v = logic.and(ins); break;
          case "NAND": v = logic.not(logic.and(ins)); break;
          case "OR": v = logic.or(ins); break;
          case "NOR": v = logic.not(logic.or(ins)); break;
          case "XOR": v = logic.xor(ins); break;
          case "XNOR": v = logic.not(logic.xor(ins)); break;
          case "NOT": v = logic.not(ins[0]!); break;
          case "BUF": v = ins[0]!; break;
        }
        f.set(g.output, v);
      }
      return outIndex.map((k) => {
        const o = netlist.outputs[k]!;
        const v = f.get(o.net);
        if (v === undefined) throw new Error(`output "${o.name}" reads net "${o.net}", which nothing drives`);
        return v;
      });
    },
  };
}

/** Proves the netlist equal to the specification (lib/verify): exhaustive up to 20 inputs, SAT above. */
export function verifyNetlist(netlist: Netlist, spec: FunctionSpec, options: VerifyOptions = {}): Verdict {
  return verifyImplementation(spec, netlistImplementation(netlist, spec.inputs, spec.outputs.map((o) => o.name)), options);
}

/** One output's cover as the mapper takes it. */
interface CoverLike {
  name: string;
  form: "sop" | "pos";
  cubes: Cube[];
}

/**
 * Proves the netlist equal to two-level covers themselves (when no
 * specification is given): an SOP output against its products as the
 * ON-set; a POS output by its complement against the OFF-set's products
 * (each sum term with every literal inverted), so no complement of a cover
 * has to be computed.
 */
export function verifyAgainstCovers(netlist: Netlist, inputs: string[], outputs: readonly CoverLike[], options: VerifyOptions = {}): Verdict {
  const spec: FunctionSpec = {
    inputs,
    outputs: outputs.map((o) => ({
      name: o.name,
      on: o.form === "sop" ? o.cubes : o.cubes.map((c) => ({ value: (~c.value & c.mask) >>> 0, mask: c.mask })),
      dc: [],
    })),
  };
  const impl = netlistImplementation(netlist, inputs, outputs.map((o) => o.name));
  const pos = outputs.map((o) => o.form === "pos");
  return verifyImplementation(
    spec,
    {
      simulate(tables) {
        return impl.simulate!(tables).map((t, j) => (pos[j] ? t.map((x) => ~x >>> 0) : t));
      },
      encode(logic, vars) {
        return impl.encode!(logic, vars).map((f, j) => (pos[j] ? logic.not(f) : f));
      },
    },
    options,
  );
}

/** The failing input combination of a verdict, as 0/1 in input order. */
export function verdictAssignment(v: Extract<Verdict, { ok: false }>, n: number): string {
  return cubeToString({ value: v.minterm, mask: fullMask(n) }, n);
}
