/**
 * 2-SAT by strongly connected components of the implication graph (Aspvall, Plass & Tarjan, 1979).
 * Variable i has literals 2i (true) and 2i + 1 (false).
 */
export const lit = (variable: number, value: boolean): number => 2 * variable + (value ? 0 : 1);

/** Solves clauses (x ∨ y) over literals; returns an assignment or null when unsatisfiable. */
export function solveTwoSat(
  variableCount: number,
  clauses: readonly (readonly [number, number])[],
): boolean[] | null {
  const n = 2 * variableCount;
  const adj: number[][] = Array.from({ length: n }, () => []);
  for (const [x, y] of clauses) {
    adj[x ^ 1]?.push(y); // ¬x → y
    adj[y ^ 1]?.push(x); // ¬y → x
  }
  // Iterative Tarjan.
  const index = new Array<number>(n).fill(-1);
  const low = new Array<number>(n).fill(0);
  const comp = new Array<number>(n).fill(-1);
  const onStack = new Array<boolean>(n).fill(false);
  const stack: number[] = [];
  let counter = 0;
  let compCount = 0;
  for (let s = 0; s < n; s++) {
    if (index[s] !== -1) continue;
    const work: [number, number][] = [[s, 0]];
    while (work.length) {
      const top = work[work.length - 1] as [number, number];
      const [v, k] = top;
      if (k === 0) {
        index[v] = low[v] = counter++;
        stack.push(v);
        onStack[v] = true;
      }
      const edges = adj[v] ?? [];
      if (k < edges.length) {
        top[1] = k + 1;
        const w = edges[k] as number;
        if (index[w] === -1) work.push([w, 0]);
        else if (onStack[w]) low[v] = Math.min(low[v] as number, index[w] as number);
        continue;
      }
      work.pop();
      const parent = work[work.length - 1];
      if (parent) low[parent[0]] = Math.min(low[parent[0]] as number, low[v] as number);
      if (low[v] === index[v]) {
        let w: number;
        do {
          w = stack.pop() as number;
          onStack[w] = false;
          comp[w] = compCount;
        } while (w !== v);
        compCount++;
      }
    }
  }
  const result: boolean[] = [];
  for (let i = 0; i < variableCount; i++) {
    const t = comp[2 * i] as number;
    const f = comp[2 * i + 1] as number;
    if (t === f) return null;
    // Tarjan numbers components in reverse topological order: pick the literal whose component comes
    // later in topological order (smaller number).
    result.push(t < f);
  }
  return result;
}
