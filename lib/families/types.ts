/**
 * The logic-family data model. Every electrical figure is optional so that a
 * user's family may give only a fan-in and a fan-out; the analysis omits what
 * it cannot estimate and says so.
 *
 * Units: volts, milliamps (currents flowing into a pin are positive, so IOH
 * and IIL are negative or given as magnitudes — the formulas use |x|),
 * picofarads, ohms, nanoseconds.
 */
export type GateType = "AND" | "OR" | "NAND" | "NOR" | "XOR" | "XNOR" | "NOT" | "BUF";

export const GATE_TYPES: readonly GateType[] = ["AND", "OR", "NAND", "NOR", "XOR", "XNOR", "NOT", "BUF"];

/** Widest gate input a family may offer or a user may allow (matches the design settings' fan-in limit). */
export const MAX_GATE_WIDTH = 64;
/** Most gates of one width a family may put in one package. */
export const MAX_PER_PACKAGE = 64;
/** Largest fan-out a family may set, in unit loads (matches the design settings' limit). */
export const MAX_FAN_OUT = 10000;

/** One input width of a gate type, and how many such gates one package holds. */
export interface GateWidth {
  width: number;
  perPackage: number;
}

export interface GateOffer {
  type: GateType;
  widths: GateWidth[];
}

/** Transistors for a gate of n inputs: base + perInput · n. */
export interface TransistorModel {
  base: number;
  perInput: number;
}

/** Figures a family may carry; each key can have a source note in Family.sources. */
export interface FamilyFigures {
  /** Supply voltage, V. */
  supplyV?: number;
  /** Lowest guaranteed output high level, V. */
  vohMin?: number;
  /** Highest guaranteed output low level, V. */
  volMax?: number;
  /** Lowest input level read as high, V. */
  vihMin?: number;
  /** Highest input level read as low, V. */
  vilMax?: number;
  /**
   * Highest voltage an input tolerates (its absolute maximum), V. A CMOS
   * driver swings to its own supply, so one whose supply is higher cannot
   * feed these inputs directly.
   */
  inputMaxV?: number;
  /** Output high current at which VOH(min) holds, mA (sourcing; sign ignored). */
  iohMa?: number;
  /** Output low current at which VOL(max) holds, mA. */
  iolMa?: number;
  /** Input high current, mA. */
  iihMa?: number;
  /** Input low current, mA (sign ignored). */
  iilMa?: number;
  /** Capacitance of one input (one unit load), pF. */
  inputCapPf?: number;
  /** Output resistance used for edge-rate estimates, Ω. */
  outputOhms?: number;
  /** Longest input transition time the family allows, ns. */
  maxTransitionNs?: number;
  /** Wiring capacitance assumed per net, pF. */
  wiringPf?: number;
  /** Delay model: intrinsic propagation delay, ns. */
  intrinsicNs?: number;
  /** Delay model: added delay per unit load driven, ns. */
  perLoadNs?: number;
  /** Static supply current per gate, mA (average of the high and low states). */
  staticMaPerGate?: number;
  /** Internal power-dissipation capacitance per gate, pF (adds to the load in C·V²·f). */
  powerCapPf?: number;
  /**
   * Extra supply current per input held at a TTL high level (about 2.4 V)
   * instead of at the supply rail, mA. CMOS with TTL-level inputs draws it;
   * the static power estimate charges it to inputs fed from outside the design.
   */
  ttlHighInputMa?: number;
}

/**
 * A second, heavier output operating point (CMOS outputs are specified both
 * at a light CMOS load and at a rated current). Used when checking whether a
 * driver can feed a receiver family that draws more input current.
 */
export interface RatedDrive {
  /** mA, sign ignored. */
  iohMa: number;
  /** mA. */
  iolMa: number;
  /** V at iohMa. */
  vohMin: number;
  /** V at iolMa. */
  volMax: number;
  source: string;
}

export type FigureKey = keyof FamilyFigures;

export interface Family extends FamilyFigures {
  /** Stable identifier, lower case with dashes, e.g. "ttl-std-5v". */
  id: string;
  /** Generic display name. */
  name: string;
  technology?: "bipolar" | "cmos" | "other";
  description?: string;
  /** Gate types and widths on offer. When absent, every type is offered at widths 2..fanIn. */
  gates?: GateOffer[];
  /** Transistor counts per gate type (CMOS families); absent types are not counted. */
  transistors?: Partial<Record<GateType, TransistorModel>>;
  /** Widest gate input the user allows; when set it caps the widths on offer. */
  fanIn?: number;
  /** Fan-out set by the user, in unit loads; overrides the derived figure. */
  fanOut?: number;
  /** Where each figure comes from: handbook table, standard, "from memory", "user". */
  sources?: Partial<Record<FigureKey | "gates" | "transistors", string>>;
  /** Optional heavier output operating point, see RatedDrive. */
  ratedDrive?: RatedDrive;
  builtIn?: boolean;
}
