/**
 * Settings of one cover search. They change how fast a search closes, never
 * what it proves: every bound stays a proven bound whatever the values.
 */
export interface CoverTuning {
  /** Dominance tests at inner nodes: bit 0 columns, bit 1 rows (the root always runs both). */
  nodeDominance: number;
  /** Subgradient steps at the root and at inner nodes. */
  rootIters: number;
  nodeIters: number;
  /** Steps without improvement before the step size halves. */
  stall: number;
  /** First step size at inner nodes (the root starts at 2). */
  nodeLambda: number;
  /** Coordinate-ascent sweeps after the subgradient steps, at the root and at inner nodes. */
  rootAscent: number;
  ascent: number;
  /** Where a row multiplier moves between its two cheapest columns' reduced costs (0: the cheapest). */
  ascentMid: number;
  /** Depth down to which the Lagrangian primal heuristic runs, every `heurEvery` steps. */
  heurDepth: number;
  heurEvery: number;
  /** Largest core (live rows) a root-only search solves the LP of: its cost grows with rows². */
  rootOnlyMaxRows: number;
  /** Under a column budget, nodes down to depth `lpDepth` also solve the LP when at most `lpMaxRows` rows are live. */
  lpMaxRows: number;
  lpDepth: number;
  /** Rounds of at most `cutsPerRound` cuts at an LP root (root-only searches: `rootCutRounds`), stopping at round `cutStall` + 1 without gain. */
  cutRounds: number;
  rootCutRounds: number;
  cutsPerRound: number;
  cutStall: number;
  /** The LP dive: at most `diveSteps` steps, fixing at once every column at `diveFixAbove` or more. */
  diveSteps: number;
  diveFixAbove: number;
  /** LPs of `rowGenMin` rows or more start on the fraction `rowGenStart` of them and add the others as needed. */
  rowGenMin: number;
  rowGenStart: number;
  /**
   * Covers of fewest columns with at least `localMinRows` live rows at the root: a local search (./local)
   * looks for a smaller cover, for at most `localStepsPerRow` steps a row and the share `localTimeShare`
   * of the time left, among the columns whose reduced cost at the root's multipliers is below
   * `localTheta` (and the incumbent's, and each row's cheapest).
   */
  localMinRows: number;
  localStepsPerRow: number;
  localTimeShare: number;
  localTheta: number;
}

/** The settings every search uses unless its problem carries others. */
export const DEFAULT_TUNING: Readonly<CoverTuning> = Object.freeze({
  nodeDominance: 1,
  rootIters: 600,
  nodeIters: 100,
  stall: 15,
  nodeLambda: 2,
  rootAscent: 1,
  ascent: 2,
  ascentMid: 0.25,
  heurDepth: 0,
  heurEvery: 25,
  rootOnlyMaxRows: 400,
  lpMaxRows: 400,
  lpDepth: Infinity,
  cutRounds: 10,
  rootCutRounds: 10,
  cutsPerRound: 20,
  cutStall: 2,
  diveSteps: 60,
  diveFixAbove: 0.9,
  rowGenMin: 60,
  rowGenStart: 0.5,
  localMinRows: 1000,
  localStepsPerRow: 100,
  localTimeShare: 0.7,
  localTheta: 0.03,
});
