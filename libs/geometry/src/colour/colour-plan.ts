/**
 * Colour plans: which piece is cut from which colour of stock, by a rule over the base solid's faces.
 *
 * Rules (faces are numbered 0…faceCount−1; piece i lies in face i):
 *  - 'neighbour-distinct': two faces sharing an edge (two vertices) never share a colour.
 *  - 'vertex-distinct': all faces around each vertex have different colours.
 *  - 'opposite-match': each pair of opposite faces (parallel planes, normals pointing apart) shares a colour,
 *    and faces sharing an edge differ. Faces with no opposite face only obey the second part.
 *
 * Balance: with n faces and k colours, every colour is used floor(n/k) or ceil(n/k) times (equal counts when
 * k divides n). Under 'opposite-match' each opposite pair counts twice, so balance is sought over faces as
 * well. If the rule can be met only with unequal counts, the most even plan (the counts nearest n/k) is
 * returned with feasible = true and balanced = false; if it cannot be met at all, feasible = false, message
 * says "no plan exists" and fewestColours is the smallest count that meets it (found by trying k + 1, k + 2,
 * … colours).
 *
 * Solved as a Boolean satisfiability problem with logic-solver (MiniSat compiled to JavaScript): one variable
 * per face and colour, exactly one colour per face, the rule as clauses, balance as cardinality constraints
 * over a sequential counter per colour (see ColourCounter).
 * Counting: distinctPlans counts plans up to renaming of the colours (two plans that differ only by a
 * permutation of colour indices count once), found by enumeration under a value-precedence symmetry break
 * (colour c may appear only after colour c−1 has appeared on a lower-numbered face), stopped at countCap.
 * It counts balanced plans when a balanced plan exists, otherwise all plans.
 */
import Logic from 'logic-solver';

export type ColourRule = 'vertex-distinct' | 'opposite-match' | 'neighbour-distinct';

export interface ColourPlanInput {
  faceCount: number;
  /** Vertex indices of each face (any order). */
  faceVertices: readonly (readonly number[])[];
  /** Opposite face pairs; when absent for 'opposite-match', derived from normals. */
  opposite?: readonly (readonly [number, number])[];
  /** Outward unit normals per face, used to derive opposite pairs (normals within 1e-6 of antiparallel). */
  normals?: readonly (readonly [number, number, number])[];
  rule: ColourRule;
  /** Number of colours of stock, ≥ 1. */
  count: number;
  /** Piece id per face, used as keys of the assignment (default: the face index as a string). */
  pieceIds?: readonly string[];
  /** Stop counting plans at this many (default 1000); 0 skips counting. */
  countCap?: number;
}

export interface ColourPlan {
  rule: ColourRule;
  count: number;
  feasible: boolean;
  /** Colour index (0 … count−1) per piece id; empty when infeasible. */
  assignment: Record<string, number>;
  /** Colour counts meet floor/ceil(n / count). */
  balanced: boolean;
  /** Plans up to renaming of colours, counted up to countCap. */
  distinctPlans?: number;
  /** True when counting stopped at the cap (there are at least that many). */
  distinctPlansCapped?: boolean;
  /** Pieces per colour in the returned assignment. */
  colourCounts: number[];
  /** When no plan exists: the fewest colours with which the rule can be met (balanced or not). */
  fewestColours?: number;
  message?: string;
}

export class ColourPlanInputError extends Error {}

/** Pairs of faces sharing at least two vertices (an edge). */
export function edgeAdjacentFaces(faceVertices: readonly (readonly number[])[]): [number, number][] {
  const pairs: [number, number][] = [];
  const sets = faceVertices.map((f) => new Set(f));
  for (let i = 0; i < sets.length; i++)
    for (let j = i + 1; j < sets.length; j++) {
      let shared = 0;
      for (const v of sets[i]!) if (sets[j]!.has(v)) shared++;
      if (shared >= 2) pairs.push([i, j]);
    }
  return pairs;
}

/** Faces around each vertex: vertex index → face indices. */
export function facesAroundVertices(faceVertices: readonly (readonly number[])[]): Map<number, number[]> {
  const map = new Map<number, number[]>();
  faceVertices.forEach((f, i) => {
    for (const v of new Set(f)) {
      const list = map.get(v) ?? [];
      list.push(i);
      map.set(v, list);
    }
  });
  return map;
}

/** Opposite face pairs from outward normals: n_i · n_j ≈ −1. */
export function oppositePairsFromNormals(
  normals: readonly (readonly [number, number, number])[],
): [number, number][] {
  const pairs: [number, number][] = [];
  const used = new Set<number>();
  for (let i = 0; i < normals.length; i++) {
    if (used.has(i)) continue;
    const a = normals[i]!;
    const la = Math.hypot(a[0], a[1], a[2]);
    for (let j = i + 1; j < normals.length; j++) {
      if (used.has(j)) continue;
      const b = normals[j]!;
      const lb = Math.hypot(b[0], b[1], b[2]);
      const dot = (a[0] * b[0] + a[1] * b[1] + a[2] * b[2]) / (la * lb);
      if (dot < -1 + 1e-6) {
        pairs.push([i, j]);
        used.add(i);
        used.add(j);
        break;
      }
    }
  }
  return pairs;
}

function validate(input: ColourPlanInput): void {
  const { faceCount, faceVertices, count } = input;
  if (!Number.isInteger(faceCount) || faceCount < 1) throw new ColourPlanInputError('faceCount must be ≥ 1');
  if (faceVertices.length !== faceCount)
    throw new ColourPlanInputError(`faceVertices has ${faceVertices.length} faces, expected ${faceCount}`);
  if (!Number.isInteger(count) || count < 1)
    throw new ColourPlanInputError('count must be a whole number ≥ 1');
  if (!['vertex-distinct', 'opposite-match', 'neighbour-distinct'].includes(input.rule))
    throw new ColourPlanInputError(`unknown rule "${String(input.rule)}"`);
  if (input.pieceIds && input.pieceIds.length !== faceCount)
    throw new ColourPlanInputError(`pieceIds has ${input.pieceIds.length} ids, expected ${faceCount}`);
  if (input.pieceIds && new Set(input.pieceIds).size !== faceCount)
    throw new ColourPlanInputError('pieceIds must be distinct');
  for (const [a, b] of input.opposite ?? [])
    if (!(a >= 0 && a < faceCount && b >= 0 && b < faceCount && a !== b))
      throw new ColourPlanInputError(`opposite pair [${a}, ${b}] is not a pair of faces`);
  if (input.normals && input.normals.length !== faceCount)
    throw new ColourPlanInputError(`normals has ${input.normals.length} entries, expected ${faceCount}`);
}

const v = (face: number, colour: number): string => `f${face}c${colour}`;

/**
 * The SAT solver (MiniSat compiled to asm.js with a fixed 64 MB heap, in logic-solver) aborts by throwing a
 * string when a proof outgrows its memory; the solver is unusable after that (a new one works). Such an abort
 * becomes GAVE_UP; any other error is thrown on.
 */
const GAVE_UP = Symbol('gave up');
function attempt(solve: () => Logic.Solution | null): Logic.Solution | null | typeof GAVE_UP {
  try {
    return solve();
  } catch (e) {
    if (typeof e === 'string' && /abort/i.test(e)) return GAVE_UP;
    throw e;
  }
}

/**
 * Finds a colour plan for the rule and colour count (see the module comment for the rules, balance and
 * counting). When no plan exists and `searchFewest` (default), also finds the fewest colours that meet the
 * rule. Throws ColourPlanInputError for malformed input.
 */
export function solveColourPlan(input: ColourPlanInput, searchFewest = true): ColourPlan {
  validate(input);
  const { faceCount: n, faceVertices, rule, count: k } = input;
  const cap = input.countCap ?? 1000;
  const solver = new Logic.Solver();
  for (let f = 0; f < n; f++) {
    const vars: string[] = [];
    for (let c = 0; c < k; c++) vars.push(v(f, c));
    solver.require(Logic.exactlyOne(vars));
  }
  const distinct = (a: number, b: number) => {
    for (let c = 0; c < k; c++) solver.forbid(Logic.and(v(a, c), v(b, c)));
  };
  if (rule === 'vertex-distinct') {
    for (const faces of facesAroundVertices(faceVertices).values())
      for (let c = 0; c < k; c++) solver.require(Logic.atMostOne(faces.map((f) => v(f, c))));
  } else {
    for (const [a, b] of edgeAdjacentFaces(faceVertices)) distinct(a, b);
  }
  let oppositeCount = 0;
  let pairs: readonly (readonly [number, number])[] = [];
  if (rule === 'opposite-match') {
    pairs = input.opposite ?? (input.normals ? oppositePairsFromNormals(input.normals) : []);
    oppositeCount = pairs.length;
    for (const [a, b] of pairs) for (let c = 0; c < k; c++) solver.require(Logic.equiv(v(a, c), v(b, c)));
  }
  // Faces that must share a colour count together: what counts per colour are possible at all is plain
  // arithmetic, asked before the solver (which would take minutes to prove a parity bound by search).
  const counting = countingBound(n, k, pairs);
  // Value precedence: colour c on face f needs colour c−1 on some lower face (one plan per colour renaming).
  for (let f = 0; f < n; f++)
    for (let c = 1; c < k; c++) {
      const earlier: string[] = [];
      for (let g = 0; g < f; g++) earlier.push(v(g, c - 1));
      solver.require(Logic.implies(v(f, c), Logic.or(earlier)));
    }
  const lo = Math.floor(n / k);
  const hi = Math.ceil(n / k);
  const counters = Array.from({ length: k }, (_, c) => new ColourCounter(solver, n, c));
  /** Every colour used between `min` and `max` times. */
  const band = (min: number, max: number) =>
    Logic.and(counters.flatMap((t) => [t.atLeast(min), Logic.not(t.atLeast(max + 1))]));
  const balance = band(lo, hi);
  /** The solver gave up (see attempt) while refining a plan it had found: the plan is kept as it is. */
  let gaveUp = false;
  const refine = (solve: () => Logic.Solution | null): Logic.Solution | null => {
    if (gaveUp) return null;
    const found = attempt(solve);
    if (found === GAVE_UP) gaveUp = true;
    return found === GAVE_UP ? null : found;
  };
  const first = counting.fewestOutside(lo, hi) === 0 ? attempt(() => solver.solveAssuming(balance)) : null;
  const any = first === null ? attempt(() => solver.solve()) : first;
  if (any === GAVE_UP) {
    // Not even whether a plan exists could be settled: said so, never "no plan exists".
    return {
      rule,
      count: k,
      feasible: false,
      assignment: {},
      balanced: false,
      colourCounts: [],
      message:
        `no plan found: the search for a plan under rule "${rule}" with ${k} colour${k === 1 ? '' : 's'} ` +
        `ran out of memory on these ${n} pieces; try another colour count or rule`,
    };
  }
  let solution: Logic.Solution | null = any;
  if (first === null && solution) {
    // No balanced plan: any plan at all? Then the most even one: first the band around n/k widened one count
    // at a time up to the spread of the plan found (so an answer that exists is never missed: an icosahedron
    // under 'opposite-match' in 4 colours gets 6/6/4/4, not 8/4/4/4), then within that band the fewest
    // colours used other than floor(n/k) or ceil(n/k) times (a pentagonal prism in 7 colours gets
    // 2/1/1/1/1/1/0, not 2/2/1/1/1/0/0). Assumptions only: the plans counted below are all plans.
    {
      const stray = (x: number) => Math.max(lo - x, x - hi);
      const spread = Math.max(...readCounts(solution, n, k).map(stray));
      let within = band(Math.max(0, lo - spread), Math.min(n, hi + spread));
      let reach = spread;
      for (let d = 1; d < spread; d++) {
        // Tighter bands have no plan, so one here strays d from n/k: when the counting rules that out, skip.
        if (!Number.isFinite(counting.fewestOutside(lo - d, hi + d, d))) continue;
        const tighter = band(Math.max(0, lo - d), Math.min(n, hi + d));
        const even = refine(() => solver.solveAssuming(tighter));
        if (gaveUp) break;
        if (even) {
          solution = even;
          within = tighter;
          reach = d;
          break;
        }
      }
      const outside = Logic.sum(counters.map((t) => Logic.or(Logic.not(t.atLeast(lo)), t.atLeast(hi + 1))));
      const offCount = (s: Logic.Solution) => readCounts(s, n, k).filter((x) => stray(x) > 0).length;
      let off = offCount(solution);
      // No plan within the band has fewer colours off n/k than the counting allows, given that no tighter band
      // has a plan (some colour strays `reach`): stop there.
      const fewestOff = counting.fewestOutside(lo - reach, hi + reach, reach);
      while (off > fewestOff && !gaveUp) {
        const better = refine(() =>
          solver.solveAssuming(Logic.and(within, Logic.lessThan(outside, Logic.constantBits(off)))),
        );
        if (!better) break;
        solution = better;
        off = offCount(better);
      }
    }
  }
  const base = { rule, count: k };
  if (!solution) {
    const infeasible: ColourPlan = {
      ...base,
      feasible: false,
      assignment: {},
      balanced: false,
      colourCounts: [],
      message: `no plan exists: rule "${rule}" cannot be met with ${k} colour${k === 1 ? '' : 's'}`,
    };
    if (!searchFewest) return infeasible;
    // With as many colours as faces every rule can be met (each face, or each opposite pair, its own
    // colour), so the search for the fewest that work ends by n. Under 'vertex-distinct' it starts at the
    // most faces around one vertex (a pyramid's apex); the faces of a convex solid form a planar map, so
    // 'neighbour-distinct' needs at most 4 (the four colour theorem) and the search stays short.
    const aroundVertex =
      rule === 'vertex-distinct'
        ? Math.max(0, ...[...facesAroundVertices(faceVertices).values()].map((f) => f.length))
        : 0;
    let fewest = Math.max(k + 1, aroundVertex);
    while (fewest < n && !solveColourPlan({ ...input, count: fewest, countCap: 0 }, false).feasible) fewest++;
    return {
      ...infeasible,
      fewestColours: fewest,
      message: `${infeasible.message}; it needs at least ${fewest}`,
    };
  }
  const colours = readColours(solution, n, k);
  const assignment: Record<string, number> = {};
  colours.forEach((c, f) => (assignment[input.pieceIds?.[f] ?? String(f)] = c));
  const colourCounts = Array.from({ length: k }, (_, c) => colours.filter((x) => x === c).length);
  const balanced = colourCounts.every((x) => x >= lo && x <= hi);
  const plan: ColourPlan = { ...base, feasible: true, assignment, balanced, colourCounts };
  const notes: string[] = [];
  if (!balanced)
    notes.push(
      gaveUp
        ? 'no plan with equal colour counts was found; a more even one than this may exist (the search ran out of memory)'
        : 'the rule can be met only with unequal colour counts',
    );
  if (rule === 'opposite-match' && oppositeCount === 0) notes.push('the solid has no opposite faces');
  // Plans are counted with the same solver: not once it has given up.
  if (cap > 0 && !gaveUp) {
    if (balanced) solver.require(balance);
    let found = 0;
    let s: Logic.Solution | null = solution;
    while (s && found < cap) {
      found++;
      solver.forbid(Logic.and(s.getTrueVars().filter((name) => /^f\d+c\d+$/.test(name))));
      s = found < cap ? solver.solve() : null;
    }
    plan.distinctPlans = found;
    plan.distinctPlansCapped = found >= cap;
  }
  if (notes.length > 0) plan.message = notes.join('; ');
  return plan;
}

/**
 * How many faces take colour c, as a sequential counter (C. Sinz, "Towards an optimal CNF encoding of Boolean
 * cardinality constraints", CP 2005, with both directions of each definition): r(i, j) is true exactly when at
 * least j of faces 0 … i−1 have colour c. Bounds on a colour's count are then single literals, and unit
 * propagation alone sees a bound reached or out of reach. Binary adders (logic-solver's sums) hide that from
 * propagation: a 40-sided antiprism in 12 colours took some 20 s through them before the solver gave up on a
 * more even plan, about 2 s through counters (its last question, whether 80 triangles fit 11 colours of at
 * most 7, is a pigeonhole argument, which resolution cannot make short). Columns j are added when a bound
 * first asks for them.
 */
class ColourCounter {
  private columns = 0;
  constructor(
    private readonly solver: Logic.Solver,
    private readonly n: number,
    private readonly colour: number,
  ) {}

  /** True exactly when colour c is on at least j faces. */
  atLeast(j: number): Logic.Formula {
    if (j > this.n) return Logic.FALSE;
    while (this.columns < j) this.addColumn(this.columns + 1);
    return this.r(this.n, j);
  }

  private r(i: number, j: number): Logic.Formula {
    if (j <= 0) return Logic.TRUE;
    if (j > i) return Logic.FALSE;
    return `n${this.colour}_${i}_${j}`;
  }

  private addColumn(j: number): void {
    for (let i = j; i <= this.n; i++) {
      const x = v(i - 1, this.colour);
      const here = this.r(i, j);
      const before = this.r(i - 1, j);
      const less = this.r(i - 1, j - 1);
      // r(i, j) ⇔ r(i−1, j) ∨ (x_i ∧ r(i−1, j−1)).
      this.solver.require(Logic.implies(before, here));
      this.solver.require(Logic.implies(Logic.and(x, less), here));
      this.solver.require(Logic.implies(here, Logic.or(before, x)));
      this.solver.require(Logic.implies(here, Logic.or(before, less)));
    }
    this.columns = j;
  }
}

/**
 * What the counting alone allows. Faces joined by opposite pairs must share a colour, so each colour's count is
 * a sum of the joined groups' sizes. With groups of one and two faces (pairs from normals: each face in one pair
 * at most), a colour with count x takes an odd number of single faces when x is odd and an even number (maybe 0)
 * when x is even, so counts x₁ … x_k are possible exactly when they sum to n and at most S of them (S single
 * faces) are odd. `fewestOutside(min, max, stray)` is the fewest colours whose count lies outside [lo, hi] among
 * such counts within [min, max] of which at least one lies `stray` or more from [lo, hi] (Infinity when there
 * are none), by dynamic programming over the colours. With larger
 * groups (explicit pairs that chain faces) it returns 0 and leaves every question to the solver.
 */
function countingBound(
  n: number,
  k: number,
  pairs: readonly (readonly [number, number])[],
): { fewestOutside: (min: number, max: number, stray?: number) => number } {
  const paired = new Set<number>();
  let simple = true;
  for (const [a, b] of pairs) {
    if (paired.has(a) || paired.has(b)) simple = false;
    paired.add(a);
    paired.add(b);
  }
  const singles = n - paired.size;
  const lo = Math.floor(n / k);
  const hi = Math.ceil(n / k);
  return {
    fewestOutside(min: number, max: number, stray = 0): number {
      if (!simple) return 0;
      const from = Math.max(0, min);
      const to = Math.min(n, max);
      const far = (x: number) => (Math.max(lo - x, x - hi) >= stray ? 1 : 0);
      // best[reached][sum][odd]: fewest counts outside [lo, hi] among the colours so far, by whether one of them
      // lies `stray` away, their total and how many are odd.
      const table = () =>
        [0, 1].map(() => Array.from({ length: n + 1 }, () => new Array<number>(k + 1).fill(Infinity)));
      let best = table();
      (best[0]![0] as number[])[0] = 0;
      for (let c = 0; c < k; c++) {
        const next = table();
        for (const reached of [0, 1]) {
          for (let sum = 0; sum <= n; sum++) {
            for (let odd = 0; odd <= c; odd++) {
              const here = (best[reached]![sum] as number[])[odd] as number;
              if (!Number.isFinite(here)) continue;
              for (let x = from; x <= to && sum + x <= n; x++) {
                const o = odd + (x % 2);
                const cost = here + (x < lo || x > hi ? 1 : 0);
                const row = next[reached | far(x)]![sum + x] as number[];
                if (cost < (row[o] as number)) row[o] = cost;
              }
            }
          }
        }
        best = next;
      }
      let fewest = Infinity;
      (best[1]![n] as number[]).forEach((cost, odd) => {
        if (odd <= singles && cost < fewest) fewest = cost;
      });
      return fewest;
    },
  };
}

function readCounts(solution: Logic.Solution, n: number, k: number): number[] {
  const colours = readColours(solution, n, k);
  return Array.from({ length: k }, (_, c) => colours.filter((x) => x === c).length);
}

function readColours(solution: Logic.Solution, n: number, k: number): number[] {
  const out: number[] = new Array<number>(n).fill(-1);
  for (let f = 0; f < n; f++) for (let c = 0; c < k; c++) if (solution.evaluate(v(f, c))) out[f] = c;
  return out;
}
