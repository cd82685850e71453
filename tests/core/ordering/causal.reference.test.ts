import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { causalOrder } from '../../../src/core/ordering/causal';
import type { EquationSystem } from '../../../src/core/ordering/structure';
import { runPython } from '../../helpers/python';
import { seededRandom } from '../../../src/core/stats/random';

const SCRIPT = fileURLToPath(new URL('../../reference/ordering_reference.py', import.meta.url));

const rng = (seed: number): (() => number) => seededRandom(seed).uniform;

interface Spec { ne: number; nv: number; exo: number; planted: boolean; width: number; seed: number }

function makeSystem(s: Spec): { nv: number; equations: number[][]; exogenous: number[] } {
  const r = rng(s.seed);
  const exogenous = Array.from({ length: s.exo }, (_, i) => s.nv - 1 - i);
  const unknown = s.nv - s.exo;
  const perm = Array.from({ length: unknown }, (_, i) => i);
  for (let i = unknown - 1; i > 0; i--) {
    const j = Math.floor(r() * (i + 1));
    [perm[i], perm[j]] = [perm[j], perm[i]];
  }
  const equations = Array.from({ length: s.ne }, (_, i) => {
    const vs = new Set<number>();
    if (s.planted && i < unknown) vs.add(perm[i]);
    const k = 1 + Math.floor(r() * s.width);
    for (let j = 0; j < k; j++) vs.add(Math.floor(r() * s.nv));
    return [...vs];
  });
  return { nv: s.nv, equations, exogenous };
}

const specs: Spec[] = [
  { ne: 2000, nv: 2000, exo: 0, planted: true, width: 2, seed: 1 }, // square, solvable, big cyclic blocks
  { ne: 2000, nv: 2010, exo: 10, planted: true, width: 1, seed: 2 }, // square with inputs, mostly acyclic
  { ne: 1500, nv: 1700, exo: 50, planted: false, width: 2, seed: 3 }, // under-determined parts
  { ne: 1800, nv: 1500, exo: 20, planted: true, width: 2, seed: 4 }, // over-determined parts
  { ne: 600, nv: 600, exo: 0, planted: false, width: 2, seed: 5 }, // all three parts
  { ne: 300, nv: 400, exo: 100, planted: true, width: 3, seed: 6 },
];

describe('causal order against NetworkX/SciPy (tests/reference/ordering_reference.py)', () => {
  const systems = specs.map(makeSystem);
  const ref = runPython<{ results: { nx_matching: number; scipy_matching: number; blocks: { vars: number[]; eqs: number[]; det: string; level: number }[] }[] }>(
    SCRIPT,
    { systems },
  ).results;

  specs.forEach((spec, i) => {
    it(`system ${i + 1}: ${spec.ne} equations, ${spec.nv} variables — same matching size and same blocks with levels`, () => {
      const sys = systems[i];
      const system: EquationSystem = {
        equations: sys.equations.map((vs, r) => ({ id: `f${String(r).padStart(5, '0')}`, variables: vs.map((v) => `x${String(v).padStart(5, '0')}`) })),
        exogenous: sys.exogenous.map((v) => `x${String(v).padStart(5, '0')}`),
        variables: Array.from({ length: sys.nv }, (_, v) => `x${String(v).padStart(5, '0')}`),
      };
      const ours = causalOrder(system);
      expect(ref[i].nx_matching).toBe(ref[i].scipy_matching);
      expect(ours.matchingSize).toBe(ref[i].nx_matching);
      const key = (vars: string[], eqs: string[], det: string, level: number) => `${det}|${level}|${vars.join(',')}|${eqs.join(',')}`;
      const theirs = ref[i].blocks
        .map((b) => key(b.vars.map((v) => `x${String(v).padStart(5, '0')}`), b.eqs.map((e) => `f${String(e).padStart(5, '0')}`), b.det, b.level))
        .sort();
      const mine = ours.blocks.map((b) => key(b.variables, b.equations, b.determination, b.level)).sort();
      expect(mine).toEqual(theirs);
    });
  });

  it('the reference systems exercise every part: over, under and cyclic well-determined blocks', () => {
    const dets = new Set(ref.flatMap((r) => r.blocks.map((b) => b.det)));
    expect([...dets].sort()).toEqual(['over', 'under', 'well']);
    expect(ref.some((r) => r.blocks.some((b) => b.det === 'well' && b.vars.length > 1))).toBe(true);
  });
});
