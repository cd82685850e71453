import { describe, expect, it } from 'vitest';
import type { Link, Model, Variable } from '../../../src/core/model/types';
import { DEFAULT_TOTAL_GAIN, linkStrengths } from '../../../src/core/model/strength';
import { fromRows, toRows } from '../../../src/core/numeric/dense';
import { driftAtEquilibrium } from '../../../src/core/numeric/index';
import { dynamicsDiagnostics, growingModes } from '../../../src/core/numeric/stability';
import { runPython } from '../../helpers/python';
import { decimals, expectClose } from '../../helpers/tolerance';
import { seededRandom } from '../../../src/core/stats/random';

const SCRIPT = 'tests/reference/sketch_stability.py';
type Ref = { drift: number[][]; re: number[]; im: number[]; participation: number[][] };

/** A psychologist's six-variable diary sketch, typed without strengths (invented for this test). */
function diarySketch(weight?: number): Model {
  const links: Link[] = [
    { from: 'workload', to: 'stress', kind: 'integrating', sign: '+' },
    { from: 'rumination', to: 'stress', kind: 'integrating', sign: '+' },
    { from: 'stress', to: 'sleep', kind: 'integrating', sign: '-' },
    { from: 'sleep', to: 'fatigue', kind: 'instantaneous', sign: '-' },
    { from: 'stress', to: 'fatigue', kind: 'instantaneous', sign: '+' },
    { from: 'fatigue', to: 'mood', kind: 'integrating', sign: '-' },
    { from: 'mood', to: 'rumination', kind: 'instantaneous', sign: '-' },
    { from: 'fatigue', to: 'rumination', kind: 'instantaneous', sign: '+' },
  ];
  return {
    format: 'loopfold-model', version: 1, name: 'diary sketch', timeUnit: 'h',
    variables: [
      { id: 'workload', kind: 'input', label: 'Workload', value: 1 },
      { id: 'stress', kind: 'state', label: 'Stress', timescale: '2 h' },
      { id: 'sleep', kind: 'state', label: 'Sleep quality', timescale: '1 day' },
      { id: 'fatigue', kind: 'derived', label: 'Daytime fatigue' },
      { id: 'mood', kind: 'state', label: 'Mood', timescale: '3 days' },
      { id: 'rumination', kind: 'derived', label: 'Rumination' },
    ],
    links: weight === undefined ? links : links.map((l) => ({ ...l, weight })),
  };
}

function maxRe(r: Ref): number {
  return Math.max(...r.re);
}

describe('growing modes', () => {
  it('finds exactly the eigenvalues NumPy gives a positive real part, with NumPy\'s participation factors', () => {
    const r = seededRandom(12).uniform;
    const matrices: number[][][] = [];
    for (let c = 0; c < 12; c++) {
      const n = 2 + (c % 6);
      // Gaussian-ish entries shifted so that some matrices have growing modes and some do not.
      matrices.push(Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (r() - 0.5) * 2 - (i === j ? 0.3 + 0.5 * (c % 4) : 0))));
    }
    const refs = runPython<Ref[]>(SCRIPT, { matrices });
    let sawGrowth = 0, sawStable = 0;
    matrices.forEach((m, c) => {
      const states = m.map((_, i) => `x${i}`);
      const got = growingModes(fromRows(m), states);
      const ref = refs[c];
      // numpy.linalg.eigvals: one growing mode per real eigenvalue or complex pair with Re > 0.
      const want = ref.re.map((re, k) => ({ re, im: ref.im[k], p: ref.participation[k] })).filter((e) => e.re > 1e-9 && e.im >= 0).sort((a, b) => b.re - a.re);
      expect(got.map((g) => g.rate), `case ${c}`).toHaveLength(want.length);
      got.forEach((g, k) => {
        expectClose(g.rate, want[k].re, decimals(10));
        expectClose(g.im, Math.abs(want[k].im), decimals(10));
        expectClose(g.doubling, Math.LN2 / want[k].re, decimals(8));
        for (const carrier of g.carriers) expectClose(carrier.share, want[k].p[states.indexOf(carrier.state)], decimals(8));
        // every state with at least 5 % of the mode is named
        expect(g.carriers.map((x) => x.state).sort()).toEqual(states.filter((_, i) => want[k].p[i] >= 0.05).sort());
      });
      if (want.length > 0) sawGrowth++; else sawStable++;
    });
    expect(sawGrowth).toBeGreaterThan(2);
    expect(sawStable).toBeGreaterThan(2);
  });

  it('a diary sketch with every strength at 1 grows (NumPy), and the check names the growing mode, its rate and the states that carry it', () => {
    const m = diarySketch(1);
    const [ref] = runPython<Ref[]>(SCRIPT, { cases: [m] });
    const d = driftAtEquilibrium(m);
    expect(d.ok).toBe(true);
    if (!d.ok) return;
    toRows(d.drift).forEach((row, i) => row.forEach((x, j) => expectClose(x, ref.drift[i][j], decimals(12))));
    const growth = maxRe(ref);
    expect(growth).toBeGreaterThan(0);
    const w = dynamicsDiagnostics(m).filter((x) => x.code === 'growing-mode');
    expect(w).toHaveLength(1);
    expect(w[0].level).toBe('warning');
    expect(w[0].message).toContain(`+${Number(growth.toPrecision(3))} per h`);
    for (const name of ['Stress', 'Sleep quality', 'Mood']) expect(w[0].message).toContain(name);
    expect(w[0].message).not.toMatch(/\bsleep\b|\bstress\b/); // labels, never ids
    expect(w[0].message).toMatch(/loop .* gain of 1\b/);
    expect(w[0].message).toMatch(/settling, the rest point and the timescales are not valid/);
    expect(w[0].variables.sort()).toEqual(['mood', 'sleep', 'stress']);
  });

  it('names missing self-regulation when a carrier state is not self-regulating', () => {
    const m: Model = {
      format: 'loopfold-model', version: 1, name: 'tank', timeUnit: 'h',
      variables: [
        { id: 'level', kind: 'state', label: 'Water level', timescale: 2, selfRegulating: false },
        { id: 'algae', kind: 'state', label: 'Algae', timescale: 5 },
      ],
      links: [
        { from: 'algae', to: 'level', kind: 'integrating', sign: '+', weight: 0.5 },
        { from: 'level', to: 'algae', kind: 'integrating', sign: '+', weight: 0.5 },
      ],
    };
    const [ref] = runPython<Ref[]>(SCRIPT, { cases: [m] });
    expect(maxRe(ref)).toBeGreaterThan(0);
    const w = dynamicsDiagnostics(m).find((x) => x.code === 'growing-mode');
    expect(w?.message).toMatch(/Water level has no self-regulation/);
  });
});

describe('default strengths', () => {
  it('share 0.8 among the links into one variable', () => {
    const s = linkStrengths(diarySketch());
    // stress has two integrating links in: 0.4 each; sleep one: 0.8
    expect(s[0]).toEqual({ value: DEFAULT_TOTAL_GAIN / 2, given: false, sharedBy: 2 });
    expectClose(s[2].value, 0.8, decimals(15));
  });

  it('keep the six-variable diary sketch without strengths at rest (NumPy: every eigenvalue has a negative real part); no growing-mode warning', () => {
    const m = diarySketch();
    const [ref] = runPython<Ref[]>(SCRIPT, { cases: [m] });
    const d = driftAtEquilibrium(m);
    if (!d.ok) throw new Error(d.reason);
    toRows(d.drift).forEach((row, i) => row.forEach((x, j) => expectClose(x, ref.drift[i][j], decimals(12))));
    expect(maxRe(ref)).toBeLessThan(0);
    expect(dynamicsDiagnostics(m).filter((x) => x.code === 'growing-mode')).toEqual([]);
  });

  it('keep random sketches without strengths (up to 30 variables, any signs and timescales) stable: NumPy eigenvalues', () => {
    const models: Model[] = [];
    for (let seed = 1; seed <= 25; seed++) {
      const r = seededRandom(seed).uniform;
      const n = 4 + Math.floor(r() * 27);
      const variables: Variable[] = [];
      for (let i = 0; i < n; i++) {
        const kind = i === 0 ? 'input' : r() < 0.55 ? 'state' : 'derived';
        variables.push({ id: `v${i}`, kind, ...(kind === 'state' ? { timescale: Number((0.1 * 10 ** (3 * r())).toPrecision(3)) } : {}) });
      }
      const links: Link[] = [];
      const seen = new Set<string>();
      // Derived variables read only lower-numbered derived variables (no instantaneous loop), anything else freely.
      for (const v of variables) {
        if (v.kind === 'input') continue;
        const k = 1 + Math.floor(r() * 4);
        for (let t = 0; t < k; t++) {
          const from = variables[Math.floor(r() * n)];
          if (from.id === v.id || seen.has(`${from.id}>${v.id}`)) continue;
          if (v.kind === 'derived' && from.kind === 'derived' && Number(from.id.slice(1)) > Number(v.id.slice(1))) continue;
          seen.add(`${from.id}>${v.id}`);
          links.push({ from: from.id, to: v.id, kind: v.kind === 'state' ? 'integrating' : 'instantaneous', sign: r() < 0.5 ? '+' : '-' });
        }
      }
      models.push({ format: 'loopfold-model', version: 1, name: `random ${seed}`, timeUnit: 'h', variables, links });
    }
    const refs = runPython<Ref[]>(SCRIPT, { cases: models });
    models.forEach((m, c) => {
      if (refs[c].re.length === 0) return;
      expect(maxRe(refs[c]), `${m.name}`).toBeLessThan(0);
      expect(dynamicsDiagnostics(m).filter((x) => x.code === 'growing-mode'), m.name).toEqual([]);
    });
  });
});

describe('timescale typed vs timescale of the links', () => {
  it('names both figures and the link that makes the difference, in one message', () => {
    // A lake's nutrient pool (typed 3 weeks) tied to a fast algae state by a strong loop (invented for this test).
    const m: Model = {
      format: 'loopfold-model', version: 1, name: 'pond', timeUnit: 'h',
      variables: [
        { id: 'nutrients', kind: 'state', label: 'Nutrient pool', timescale: '3 weeks' },
        { id: 'algae', kind: 'state', label: 'Algae', timescale: '6 h' },
      ],
      links: [
        { from: 'algae', to: 'nutrients', kind: 'integrating', sign: '-', weight: 40 },
        { from: 'nutrients', to: 'algae', kind: 'integrating', sign: '+', weight: 0.5 },
      ],
    };
    const [ref] = runPython<Ref[]>(SCRIPT, { cases: [m] });
    // The nutrient pool's timescale: 1/|Re λ| of the mode it participates in most (NumPy participation factors).
    const k = 0;
    let best = 0;
    ref.participation.forEach((p, j) => { if (p[k] > ref.participation[best][k] + 1e-12) best = j; });
    const derivedHours = 1 / Math.abs(ref.re[best]);
    expect(derivedHours * 4).toBeLessThan(504);
    const w = dynamicsDiagnostics(m).filter((x) => x.code === 'timescale-mismatch');
    expect(w).toHaveLength(1);
    expect(w[0].message).toContain('Nutrient pool responds on a timescale of');
    expect(w[0].message).toContain('3 weeks typed');
    expect(w[0].message).toContain(`${Number(derivedHours.toPrecision(3))} h`);
    expect(w[0].message).toContain('The link Algae → Nutrient pool makes the difference');
  });

  it('stays quiet on every example', async () => {
    const { EXAMPLES } = await import('../../../src/examples/index');
    const { parseModel } = await import('../../../src/core/model/schema');
    for (const e of EXAMPLES) {
      const p = parseModel(e.model);
      if (!p.ok) throw new Error(e.id);
      expect(dynamicsDiagnostics(p.model).map((d) => d.message), e.id).toEqual([]);
    }
  });
});
