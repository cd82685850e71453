import { describe, expect, it } from 'vitest';
import { fromRows } from '../../../src/core/numeric/dense';
import { adviseInterval, lagReach, logGrid } from '../../../src/core/numeric/sampled';
import { decimals, expectClose } from '../../helpers/tolerance';
import { runPython } from '../../helpers/python';

type Ref = { links: { effect: number[]; peak: { interval: number; effect: number } | null; range: [number, number] | null }[]; best: number | null; score?: number };

// A greenhouse's soil water drives humidity, humidity drives mould; the heater is on a loop of its own
// (invented): no chain of links leads from the heater to mould.
const states = ['soil', 'humid', 'mould', 'heater'];
const A = fromRows([
  [-0.5, 0, 0, 0],
  [0.4, -0.2, 0, 0],
  [0, 0.3, -0.05, 0],
  [0, 0, 0, -1],
]);
const labels = { soil: 'Soil water', humid: 'Humidity', mould: 'Mould', heater: 'Heater' };
const grid = logGrid(0.05, 200, 61);

describe('interval advice', () => {
  it('gives each effect\'s absolute size at its peak and at the advised interval (SciPy expm), in labels, never ids', () => {
    const links = [{ from: 'soil', to: 'humid' }, { from: 'humid', to: 'mould' }];
    const ref = runPython<Ref>('tests/reference/link_curves.py', { drift: [[-0.5, 0, 0, 0], [0.4, -0.2, 0, 0], [0, 0.3, -0.05, 0], [0, 0, 0, -1]], states, intervals: grid, links, fraction: 0.5 });
    const a = adviseInterval(A, states, links, grid, 0.5, 'h', labels);
    expect(a.best).toBe(ref.best);
    const k = grid.indexOf(a.best!);
    a.links.forEach((l, i) => {
      expectClose(l.peak!.effect, ref.links[i].peak!.effect, decimals(8));
      expect(l.range).toEqual(ref.links[i].range);
      // scipy.linalg.expm(A·Δ)[to, from] at the advised grid interval
      expectClose(l.atBest!, ref.links[i].effect[k], decimals(10));
    });
    expect(a.explanation).toContain(`Soil water → Humidity peaks at Δ ≈ ${Number(ref.links[0].peak!.interval.toPrecision(3))} h with an effect of ${Number(ref.links[0].peak!.effect.toPrecision(3))}`);
    expect(a.explanation).toContain('per unit of Soil water');
    expect(a.explanation).not.toMatch(/\b(soil|humid|mould|heater)\b/);
  });

  it('leaves out a pair with no path between its states and still advises for the others', () => {
    const reach = lagReach(A);
    expect(reach[2][3]).toBe(false); // heater ↛ mould
    expect(reach[2][0]).toBe(true); // soil → humidity → mould
    const a = adviseInterval(A, states, [{ from: 'heater', to: 'mould' }, { from: 'soil', to: 'mould' }], grid, 0.5, 'h', labels);
    expect(a.links[0].noPath).toBe(true);
    expect(a.links[0].peak).toBeNull();
    expect(a.best).not.toBeNull();
    expect(a.explanation).toContain('Heater → Mould is left out: no chain of links leads from Heater to Mould');
    const ref = runPython<Ref>('tests/reference/link_curves.py', { drift: [[-0.5, 0, 0, 0], [0.4, -0.2, 0, 0], [0, 0.3, -0.05, 0], [0, 0, 0, -1]], states, intervals: grid, links: [{ from: 'heater', to: 'mould' }], fraction: 0.5 });
    // SciPy: the effect is exactly zero at every interval
    expect(Math.max(...ref.links[0].effect.map(Math.abs))).toBe(0);
  });
});
