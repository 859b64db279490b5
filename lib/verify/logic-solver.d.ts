// Minimal typings for the parts of logic-solver (MIT) used by lib/verify.
declare module "logic-solver" {
  export type Formula = object | string;
  export interface Solution {
    getTrueVars(): string[];
    evaluate(f: Formula): boolean;
  }
  export class Solver {
    require(...f: Formula[]): void;
    forbid(...f: Formula[]): void;
    solve(): Solution | null;
    solveAssuming(f: Formula): Solution | null;
  }
  export const TRUE: Formula;
  export const FALSE: Formula;
  export function not(f: Formula): Formula;
  export function and(...f: (Formula | Formula[])[]): Formula;
  export function or(...f: (Formula | Formula[])[]): Formula;
  export function xor(...f: (Formula | Formula[])[]): Formula;
  export function implies(a: Formula, b: Formula): Formula;
  export function equiv(a: Formula, b: Formula): Formula;
  const Logic: {
    Solver: typeof Solver;
    TRUE: Formula;
    FALSE: Formula;
    not: typeof not;
    and: typeof and;
    or: typeof or;
    xor: typeof xor;
    implies: typeof implies;
    equiv: typeof equiv;
  };
  export default Logic;
}
