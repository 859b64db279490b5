/**
 * Distinctive-shape gate symbols after IEEE Std 91/91a: the flat-backed D for
 * AND, the curved shield for OR, the doubled back for XOR, the triangle for
 * buffers, and a small circle (the negation indicator) at the output of the
 * inverting forms. Drawn in a w × h box, inputs on the left, output on the right.
 */
import type { GateType } from "@/lib/families/types";

export type { GateType };

const BUBBLE = 4;

export function bubbleFor(type: GateType): boolean {
  return type === "NAND" || type === "NOR" || type === "XNOR" || type === "NOT";
}

/** The body outline of a gate, in local coordinates. */
function body(type: GateType, w: number, h: number): string {
  const bw = bubbleFor(type) ? w - 2 * BUBBLE : w;
  switch (type) {
    case "AND":
    case "NAND": {
      const r = h / 2;
      const flat = Math.max(0, bw - r);
      return `M0,0 H${flat} A${r},${r} 0 0 1 ${flat},${h} H0 Z`;
    }
    case "OR":
    case "NOR":
    case "XOR":
    case "XNOR": {
      const back = h * 0.22;
      return `M0,0 Q${bw * 0.55},0 ${bw},${h / 2} Q${bw * 0.55},${h} 0,${h} Q${back},${h / 2} 0,0 Z`;
    }
    case "NOT":
    case "BUF":
      return `M0,0 L${bw},${h / 2} L0,${h} Z`;
  }
}

export function GateSymbol({ type, width, height, pinYs, highlighted = false }: {
  type: GateType;
  width: number;
  height: number;
  /** Y of each input pin relative to the top of the box. */
  pinYs: number[];
  highlighted?: boolean;
}) {
  const stroke = highlighted ? "stroke-accent" : "stroke-ink";
  const bw = bubbleFor(type) ? width - 2 * BUBBLE : width;
  const isOrLike = type === "OR" || type === "NOR" || type === "XOR" || type === "XNOR";
  const pins = pinYs;
  return (
    <g className={`${stroke} fill-sheet`} strokeWidth={highlighted ? 2 : 1.3}>
      {(type === "XOR" || type === "XNOR") && (
        <path d={`M-5,0 Q${height * 0.22 - 5},${height / 2} -5,${height}`} fill="none" />
      )}
      <path d={body(type, width, height)} />
      {bubbleFor(type) && <circle cx={bw + BUBBLE} cy={height / 2} r={BUBBLE} />}
      {/* Input stubs reach the curved back of OR-like bodies. */}
      {isOrLike &&
        pins.map((y, i) => {
          const t = y / height;
          const depth = height * 0.22 * (1 - (2 * t - 1) ** 2) * 0.9;
          return <line key={i} x1={0} x2={depth} y1={y} y2={y} />;
        })}
    </g>
  );
}

export function gateLabel(type: GateType, width: number): string {
  return type === "NOT" || type === "BUF" ? type : `${type}${width}`;
}
