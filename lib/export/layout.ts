/**
 * Layered layout data for drawing a schematic: node boxes for inputs, gates,
 * constants and outputs, with pins, and orthogonal edge routes, computed with
 * elkjs's layered algorithm (left to right).
 */
import ELK from "elkjs/lib/elk.bundled.js";
import type { ElkExtendedEdge, ElkNode } from "elkjs/lib/elk-api";
import type { GateType, Netlist } from "../map/netlist";
import { CONST0, CONST1 } from "../map/netlist";

export interface LayoutPort {
  id: string;
  x: number;
  y: number;
  side: "in" | "out";
  /** Pin index for gate inputs. */
  index?: number;
}

export interface LayoutNode {
  id: string;
  kind: "input" | "output" | "gate" | "const";
  /** Gate type for gates; the net or port name otherwise. */
  type?: GateType;
  label: string;
  x: number;
  y: number;
  width: number;
  height: number;
  ports: LayoutPort[];
}

export interface LayoutEdge {
  id: string;
  net: string;
  from: string;
  to: string;
  /** Route from the driving pin to the reading pin, bends included. */
  points: { x: number; y: number }[];
}

export interface Layout {
  width: number;
  height: number;
  nodes: LayoutNode[];
  edges: LayoutEdge[];
}

/** Sizes in drawing units (about one unit = one pixel at 100 %). */
const GATE_W = 60;
const PIN_PITCH = 14;
const PORT_H = 20;
/** Width of a port box: room for its whole name in the 10 px monospaced face (about 6.1 units a character). */
export function portWidth(label: string): number {
  return Math.max(40, Math.ceil(16 + label.length * 6.2));
}

/** Lays the netlist out; node and port ids are stable: "in:NAME", "out:NAME", gate ids, "const:0"/"const:1". */
export async function layoutNetlist(netlist: Netlist): Promise<Layout> {
  const elk = new ELK();
  const children: ElkNode[] = [];
  const edges: ElkExtendedEdge[] = [];
  const meta = new Map<string, Omit<LayoutNode, "x" | "y" | "width" | "height" | "ports">>();
  const driverPort = new Map<string, string>();
  const edgeNet = new Map<string, string>();

  const addPortNode = (id: string, kind: "input" | "output" | "const", label: string, side: "in" | "out") => {
    children.push({
      id,
      width: portWidth(label),
      height: PORT_H,
      layoutOptions: { "elk.portConstraints": "FIXED_ORDER", ...(kind === "input" || kind === "const" ? { "elk.layered.layering.layerConstraint": "FIRST" } : { "elk.layered.layering.layerConstraint": "LAST" }) },
      ports: [{ id: `${id}:${side === "out" ? "o" : "i0"}`, width: 1, height: 1, layoutOptions: { "elk.port.side": side === "out" ? "EAST" : "WEST" } }],
    });
    meta.set(id, { id, kind, label });
  };
  for (const i of [...netlist.inputs, ...netlist.complements.map((c) => c.net)]) {
    addPortNode(`in:${i}`, "input", i, "out");
    driverPort.set(i, `in:${i}:o`);
  }
  const usesConst = (c: string) => netlist.gates.some((g) => g.inputs.includes(c)) || netlist.outputs.some((o) => o.net === c);
  for (const c of [CONST0, CONST1]) if (usesConst(c)) {
    addPortNode(`const:${c}`, "const", c, "out");
    driverPort.set(c, `const:${c}:o`);
  }
  for (const g of netlist.gates) {
    const h = Math.max(30, g.inputs.length * PIN_PITCH + 6);
    children.push({
      id: g.id,
      width: GATE_W,
      height: h,
      layoutOptions: { "elk.portConstraints": "FIXED_ORDER" },
      ports: [
        ...g.inputs.map((_, k) => ({ id: `${g.id}:i${k}`, width: 1, height: 1, layoutOptions: { "elk.port.side": "WEST", "elk.port.index": String(g.inputs.length - k) } })),
        { id: `${g.id}:o`, width: 1, height: 1, layoutOptions: { "elk.port.side": "EAST" } },
      ],
    });
    meta.set(g.id, { id: g.id, kind: "gate", type: g.type, label: g.type });
    driverPort.set(g.output, `${g.id}:o`);
  }
  for (const o of netlist.outputs) addPortNode(`out:${o.name}`, "output", o.name, "in");
  let e = 0;
  const connect = (net: string, target: string) => {
    const src = driverPort.get(net);
    if (!src) throw new Error(`net "${net}" has no driver`);
    const id = `e${++e}`;
    edges.push({ id, sources: [src], targets: [target] });
    edgeNet.set(id, net);
  };
  for (const g of netlist.gates) g.inputs.forEach((net, k) => connect(net, `${g.id}:i${k}`));
  for (const o of netlist.outputs) connect(o.net, `out:${o.name}:i0`);

  const root: ElkNode = {
    id: "root",
    layoutOptions: {
      "elk.algorithm": "layered",
      "elk.direction": "RIGHT",
      "elk.edgeRouting": "ORTHOGONAL",
      "elk.layered.spacing.nodeNodeBetweenLayers": "40",
      "elk.spacing.nodeNode": "20",
    },
    children,
    edges,
  };
  const graph = await elk.layout(root);

  const nodes: LayoutNode[] = (graph.children ?? []).map((c) => ({
    ...meta.get(c.id)!,
    x: c.x ?? 0,
    y: c.y ?? 0,
    width: c.width ?? 0,
    height: c.height ?? 0,
    ports: (c.ports ?? []).map((p) => {
      const suffix = p.id.slice(c.id.length + 1);
      return {
        id: p.id,
        x: (c.x ?? 0) + (p.x ?? 0),
        y: (c.y ?? 0) + (p.y ?? 0),
        side: suffix === "o" ? "out" : "in",
        ...(suffix.startsWith("i") ? { index: Number(suffix.slice(1)) } : {}),
      } as LayoutPort;
    }),
  }));
  const outEdges: LayoutEdge[] = (graph.edges ?? []).map((ed) => {
    const points: { x: number; y: number }[] = [];
    for (const s of ed.sections ?? []) {
      points.push(s.startPoint, ...(s.bendPoints ?? []), s.endPoint);
    }
    return { id: ed.id, net: edgeNet.get(ed.id)!, from: ed.sources[0]!, to: ed.targets[0]!, points: points.map((p) => ({ x: p.x, y: p.y })) };
  });
  return { width: graph.width ?? 0, height: graph.height ?? 0, nodes, edges: outEdges };
}
