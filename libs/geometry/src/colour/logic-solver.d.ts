// Minimal typings for logic-solver 2.0.1 (MiniSat compiled to JavaScript); only what colour plans use.
declare module 'logic-solver' {
  namespace Logic {
    type Formula = string | number | FormulaObject;
    interface FormulaObject {
      readonly __formula: true;
    }
    interface Bits {
      readonly bits: Formula[];
    }
    interface Solution {
      getTrueVars(): string[];
      evaluate(f: Formula): boolean;
      evaluate(b: Bits): number;
    }
    class Solver {
      require(...f: (Formula | Formula[])[]): void;
      forbid(...f: (Formula | Formula[])[]): void;
      solve(): Solution | null;
      solveAssuming(f: Formula): Solution | null;
    }
    const TRUE: Formula;
    const FALSE: Formula;
    function not(f: Formula): Formula;
    function or(...f: (Formula | Formula[])[]): Formula;
    function and(...f: (Formula | Formula[])[]): Formula;
    function implies(a: Formula, b: Formula): Formula;
    function equiv(a: Formula, b: Formula): Formula;
    function exactlyOne(...f: (Formula | Formula[])[]): Formula;
    function atMostOne(...f: (Formula | Formula[])[]): Formula;
    function sum(...f: (Formula | Bits | (Formula | Bits)[])[]): Bits;
    function constantBits(n: number): Bits;
    function lessThanOrEqual(a: Bits, b: Bits): Formula;
    function greaterThanOrEqual(a: Bits, b: Bits): Formula;
    function lessThan(a: Bits, b: Bits): Formula;
    function greaterThan(a: Bits, b: Bits): Formula;
  }
  export = Logic;
}
