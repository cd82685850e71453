/**
 * Random equation systems for the property tests, and simple independent
 * references: Simon's original definition of causal ordering by exhaustive
 * search, and a plain augmenting-path (Kuhn) matcher.
 */
import fc from 'fast-check';
import type { EquationSystem } from '../../../src/core/ordering/structure';
import type { BipartiteGraph, Matching } from '../../../src/core/ordering/matching';

/** Seed for every property test here; fast-check prints it (with the failing path) on failure. */
export const SEED = Number(process.env.LOOPFOLD_SEED ?? 20240611);

export interface RandomSystem {
  system: EquationSystem;
}

/**
 * A self-contained system: n equations over n unknowns with a planted
 * perfect matching (equation i involves x(perm[i])), plus random further
 * unknowns and exogenous variables.
 */
export function selfContainedSystem(maxEquations = 8): fc.Arbitrary<EquationSystem> {
  return fc
    .record({
      n: fc.integer({ min: 1, max: maxEquations }),
      exo: fc.integer({ min: 0, max: 3 }),
      seedPerm: fc.array(fc.nat(), { minLength: maxEquations, maxLength: maxEquations }),
      extra: fc.array(fc.array(fc.nat({ max: 40 }), { maxLength: 3 }), { minLength: maxEquations, maxLength: maxEquations }),
    })
    .map(({ n, exo, seedPerm, extra }) => {
      const perm = Array.from({ length: n }, (_, i) => i);
      for (let i = n - 1; i > 0; i--) {
        const j = seedPerm[i] % (i + 1);
        [perm[i], perm[j]] = [perm[j], perm[i]];
      }
      const pool = [...Array.from({ length: n }, (_, i) => `x${i + 1}`), ...Array.from({ length: exo }, (_, i) => `w${i + 1}`)];
      const equations = Array.from({ length: n }, (_, i) => ({
        id: `f${i + 1}`,
        variables: [...new Set([`x${perm[i] + 1}`, ...extra[i].map((k) => pool[k % pool.length])])],
      }));
      return { equations, exogenous: Array.from({ length: exo }, (_, i) => `w${i + 1}`) };
    });
}

/** Any small system: equations and unknowns in any numbers (over-, under- and well-determined parts). */
export function anySystem(maxEquations = 8): fc.Arbitrary<EquationSystem> {
  return fc
    .record({
      nv: fc.integer({ min: 1, max: 8 }),
      exo: fc.integer({ min: 0, max: 2 }),
      eqs: fc.array(fc.array(fc.nat({ max: 40 }), { minLength: 0, maxLength: 4 }), { minLength: 0, maxLength: maxEquations }),
      loose: fc.array(fc.nat({ max: 40 }), { maxLength: 2 }),
    })
    .map(({ nv, exo, eqs, loose }) => {
      const pool = [...Array.from({ length: nv }, (_, i) => `x${i + 1}`), ...Array.from({ length: exo }, (_, i) => `w${i + 1}`)];
      return {
        equations: eqs.map((vs, i) => ({ id: `f${i + 1}`, variables: [...new Set(vs.map((k) => pool[k % pool.length]))] })),
        exogenous: Array.from({ length: exo }, (_, i) => `w${i + 1}`),
        variables: loose.map((k) => `x${(k % nv) + 1}`),
      };
    });
}

/** A permutation of xs driven by a list of numbers. */
export function permute<T>(xs: readonly T[], keys: readonly number[]): T[] {
  const out = [...xs];
  for (let i = out.length - 1; i > 0; i--) {
    const j = (keys[i % Math.max(keys.length, 1)] ?? 0) % (i + 1);
    [out[i], out[j]] = [out[j], out[i]];
  }
  return out;
}

/** The same system with equations, their variable lists and the exogenous list reordered. */
export function shuffled(s: EquationSystem, keys: readonly number[]): EquationSystem {
  return {
    equations: permute(s.equations, keys).map((e, i) => ({ id: e.id, variables: permute(e.variables, keys.slice(i)) })),
    exogenous: permute(s.exogenous ?? [], keys),
    variables: s.variables ? permute(s.variables, keys) : undefined,
  };
}

/**
 * Kuhn's augmenting-path matching, visiting rows and columns in the given
 * orders: a different maximum matching from Hopcroft–Karp's in general.
 */
export function kuhnMatcher(rowOrder: (n: number) => number[], reverseColumns: boolean): (g: BipartiteGraph) => Matching {
  return (g) => {
    const rowMate = new Int32Array(g.rows).fill(-1);
    const colMate = new Int32Array(g.cols).fill(-1);
    let size = 0;
    const adj = (r: number) => {
      const xs = Array.from(g.colIdx.subarray(g.rowPtr[r], g.rowPtr[r + 1]));
      return reverseColumns ? xs.reverse() : xs;
    };
    const tryRow = (r: number, seen: Set<number>): boolean => {
      for (const c of adj(r)) {
        if (seen.has(c)) continue;
        seen.add(c);
        if (colMate[c] < 0 || tryRow(colMate[c], seen)) {
          colMate[c] = r;
          rowMate[r] = c;
          return true;
        }
      }
      return false;
    };
    for (const r of rowOrder(g.rows)) if (tryRow(r, new Set())) size++;
    return { rowMate, colMate, size };
  };
}

export interface SimonBlock {
  variables: string[];
  equations: string[];
  level: number;
}

/**
 * Simon's definition (Simon 1953, "Causal ordering and identifiability",
 * definitions 3.1–3.4), by exhaustive search: each exogenous variable w is
 * the one-variable equation "w = constant"; the complete subsets of order 0
 * are the minimal subsets of equations with as many variables as equations;
 * remove them, treat their variables as known, and repeat for orders 1, 2, …
 * Only for self-contained systems (every subset has at least as many
 * variables as equations, and the whole has exactly as many).
 */
export function simonOrder(system: EquationSystem): SimonBlock[] {
  const eqs = [
    ...system.equations.map((e) => ({ id: e.id, vars: [...new Set(e.variables)] })),
    ...(system.exogenous ?? []).map((w) => ({ id: `=${w}`, vars: [w] })),
  ];
  const known = new Set<string>();
  let remaining = eqs.map((_, i) => i);
  const out: SimonBlock[] = [];
  for (let order = 0; remaining.length > 0; order++) {
    const n = remaining.length;
    if (n > 16) throw new Error('too large for exhaustive search');
    const varsOf = (mask: number): Set<string> => {
      const s = new Set<string>();
      for (let i = 0; i < n; i++) if (mask & (1 << i)) for (const v of eqs[remaining[i]].vars) if (!known.has(v)) s.add(v);
      return s;
    };
    const popcount = (m: number) => { let c = 0; while (m) { m &= m - 1; c++; } return c; };
    const complete: number[] = [];
    for (let mask = 1; mask < 1 << n; mask++) if (varsOf(mask).size === popcount(mask)) complete.push(mask);
    const minimal = complete.filter((m) => !complete.some((o) => o !== m && (o & m) === o));
    if (minimal.length === 0) throw new Error('not self-contained');
    const used = new Set<number>();
    const newlyKnown: string[] = [];
    for (const m of minimal) {
      const vars = [...varsOf(m)].sort();
      const es: string[] = [];
      for (let i = 0; i < n; i++) if (m & (1 << i)) { used.add(i); es.push(eqs[remaining[i]].id); }
      out.push({ variables: vars, equations: es.filter((e) => !e.startsWith('=')).sort(), level: order });
      newlyKnown.push(...vars);
    }
    for (const v of newlyKnown) known.add(v);
    remaining = remaining.filter((_, i) => !used.has(i));
  }
  return out;
}
