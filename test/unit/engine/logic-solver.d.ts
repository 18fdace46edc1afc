// Minimal typings for the parts of logic-solver (MiniSat in JavaScript) the tests use.
declare module "logic-solver" {
  type Formula = object | string;
  interface Solution {
    getTrueVars(): string[];
    evaluate(f: Formula): boolean;
  }
  class Solver {
    require(...f: Formula[]): void;
    forbid(...f: Formula[]): void;
    solve(): Solution | null;
    solveAssuming(f: Formula): Solution | null;
  }
  const Logic: {
    Solver: typeof Solver;
    TRUE: Formula;
    FALSE: Formula;
    and(...f: Formula[]): Formula;
    or(...f: Formula[]): Formula;
    not(f: Formula): Formula;
    implies(a: Formula, b: Formula): Formula;
    equiv(a: Formula, b: Formula): Formula;
    exactlyOne(...f: Formula[]): Formula;
  };
  export default Logic;
}
