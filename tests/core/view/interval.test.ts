import { describe, expect, it } from 'vitest';
import { parseModel } from '../../../src/core/model/schema';
import type { Model } from '../../../src/core/model/types';
import { breakpoints, orderingAt } from '../../../src/core/ordering/index';
import { bandOfCuts, cutsOf, fromPosition, intervalRange, passed, stepInterval, toPosition } from '../../../src/core/view/interval';
import { EXAMPLES } from '../../../src/examples/index';
import { runPython } from '../../helpers/python';
import { expectClose } from '../../helpers/tolerance';
import { writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

function example(id: string): Model {
  const r = parseModel(EXAMPLES.find((e) => e.id === id)!.model);
  if (!r.ok) throw new Error('bad example');
  return r.model;
}

describe('interval axis', () => {
  it('is logarithmic: positions 0…1 give numpy.geomspace between the ends (reference: NumPy)', () => {
    const range = { min: 0.01, max: 5000 };
    const script = join(tmpdir(), 'lf-geomspace.py');
    writeFileSync(script, 'import json,sys,numpy as np\nd=json.load(sys.stdin)\nprint(json.dumps(np.geomspace(d["a"],d["b"],d["n"]).tolist()))\n');
    const ref = runPython<number[]>(script, { a: range.min, b: range.max, n: 11 });
    expectClose(Array.from({ length: 11 }, (_, i) => fromPosition(range, i / 10)), ref, { relTol: 1e-12 });
    for (const x of ref) expectClose(toPosition(range, x), ref.indexOf(x) / 10, { absTol: 1e-12 });
  });

  it.each(EXAMPLES.map((e) => e.id))('%s: the range covers every breakpoint and timescale with a margin', (id) => {
    const m = example(id);
    const bps = breakpoints(m, { samples: 50 });
    const r = intervalRange(m, bps);
    for (const b of bps) {
      expect(b.interval).toBeGreaterThan(r.min * 1.5);
      expect(b.interval).toBeLessThan(r.max / 1.5);
    }
  });

  it('keys visit every band once, up then down, and each band has one ordering (compared with orderingAt)', () => {
    for (const e of EXAMPLES) {
      const m = example(e.id);
      const bps = breakpoints(m, { samples: 50 });
      const cuts = cutsOf(bps);
      const r = intervalRange(m, bps);
      const seen: number[] = [];
      let x = r.min;
      for (let i = 0; i < 100; i++) {
        seen.push(bandOfCuts(cuts, x));
        if (x >= r.max) break;
        x = stepInterval(r, cuts, x, 'PageUp');
      }
      if (seen.at(-1) === seen.at(-2)) seen.pop(); // the last PageUp goes to the end of the top band
      // each PageUp enters the next band: 0, 1, 2, …, n (two breakpoints at one place may share a band)
      const distinct = [...new Set(seen)];
      expect(distinct).toEqual(seen);
      expect(seen[0]).toBe(0);
      expect(seen.at(-1)).toBe(cuts.length);
      // arrows never skip a band
      let y = r.max;
      let last = bandOfCuts(cuts, y);
      for (let i = 0; i < 2000 && y > r.min; i++) {
        y = stepInterval(r, cuts, y, 'ArrowDown');
        const b = bandOfCuts(cuts, y);
        expect(last - b).toBeLessThanOrEqual(cuts.filter((c) => c.at === cuts.find((d) => passed(d, y * 1.0000001) && !passed(d, y))?.at).length || 1);
        last = b;
      }
      expect(last).toBe(0);
      // roles: at each breakpoint's entry the changed variables have their new role (orderingAt, the core)
      for (const b of bps) {
        const at = b.exclusive ? b.interval * (1 + 1e-9) : b.interval;
        const o = orderingAt(m, { interval: at, samples: 50 });
        for (const c of b.changes) expect(o.roles[c.variable], `${e.id} ${c.variable} at ${at}`).toBe(c.to);
      }
    }
  });

  it('Home and End go to the ends; PageDown goes back one band', () => {
    const r = { min: 1, max: 1000 };
    const cuts = [{ at: 10 }, { at: 100, exclusive: true }];
    expect(stepInterval(r, cuts, 50, 'Home')).toBe(1);
    expect(stepInterval(r, cuts, 50, 'End')).toBe(1000);
    expect(bandOfCuts(cuts, stepInterval(r, cuts, 500, 'PageDown'))).toBe(1);
    expect(bandOfCuts(cuts, stepInterval(r, cuts, 50, 'PageDown'))).toBe(0);
    expect(bandOfCuts(cuts, 100)).toBe(1); // exclusive: 100 itself is still below
    expect(bandOfCuts(cuts, stepInterval(r, cuts, 50, 'PageUp'))).toBe(2);
  });
});
