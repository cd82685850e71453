import { readdirSync, readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseModel, parseModelText } from '../../../src/core/model/schema';
import type { Link, Model, Variable } from '../../../src/core/model/types';
import { sampledAt } from '../../../src/core/numeric/index';
import { bands, breakpoints, orderingAt } from '../../../src/core/ordering/index';
import { defaultInterval } from '../../../src/core/study/design';
import { fileModel, serializeModel } from '../../../src/state/files';

// Version-1 files as they were written before version 2: the four examples of the gallery.
const dir = new URL('../../fixtures/model-v1/', import.meta.url);
const fixtures = readdirSync(dir).filter((f) => f.endsWith('.json')).map((f) => [f, readFileSync(new URL(f, dir), 'utf8')] as const);

function open(text: string): Model {
  const r = parseModelText(text);
  if (!r.ok) throw new Error(r.issues.map((i) => `${i.path} ${i.message}`).join('; '));
  return r.model;
}

/** Everything the program computes from a model's structure and study length, for comparing meanings. */
function meaning(model: Model, intervals: number[]) {
  return {
    breakpoints: breakpoints(model),
    bands: bands(model),
    orderings: intervals.map((interval) => orderingAt(model, { interval })),
    mechanism: orderingAt(model, {}),
  };
}

describe('version-1 model files open as version 2 with the same meaning', () => {
  it('finds the version-1 files', () => expect(fixtures.length).toBeGreaterThanOrEqual(4));
  it.each(fixtures)('%s', (_name, text) => {
    const raw = JSON.parse(text) as Model;
    expect(raw.version).toBe(1);
    const r = parseModelText(text);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.migratedFrom).toBe(1);
    const m = r.model;
    expect(m.version).toBe(2);
    expect(m.settings?.samples).toBeUndefined();
    expect(m.study?.length).toBe(raw.settings?.samples);
    expect(m.study?.schedule).toEqual({ kind: 'fixed' });
    // the interval is the one a version-1 file opened at: the middle of the control for its length
    expect(m.study?.interval).toBe(defaultInterval(raw, { samples: raw.settings!.samples! }));
    // saving writes version 2, and reading it back gives the same model
    const saved = serializeModel(m);
    expect(JSON.parse(saved).version).toBe(2);
    const again = parseModelText(saved);
    expect(again.ok && again.migratedFrom).toBe(undefined);
    expect(again.ok && again.model).toEqual(fileModel(m));
    // the same orderings and numbers as the version-1 file read as it was
    const intervals = bands(raw).map((b) => (b.to === Infinity ? b.from * 2 : b.from === 0 ? b.to / 2 : Math.sqrt(b.from * b.to)));
    expect(meaning(m, intervals)).toEqual(meaning(raw, intervals));
    const at = m.study!.interval as number;
    const a = sampledAt(raw, at);
    const b = sampledAt(m, at);
    expect(b).toEqual(a);
  });
});

describe('migration details', () => {
  const v1 = {
    format: 'loopfold-model', version: 1, name: 'tank', timeUnit: 'h',
    variables: [{ id: 'inflow', kind: 'input', value: 1 }, { id: 'level', kind: 'state', timescale: 2 }, { id: 'temp', kind: 'state', timescale: '30 min' }],
    links: [{ from: 'inflow', to: 'level', kind: 'integrating', sign: '+' }, { from: 'level', to: 'temp', kind: 'integrating', sign: '-', weight: 0.5 }],
    settings: { separation: 4, samples: 30, noise: { level: 0.25, temp: 2 } },
  };
  it('moves settings.noise to the states and settings.samples to study.length, keeping the separation', () => {
    const m = open(JSON.stringify(v1));
    expect(m.variables.find((v) => v.id === 'level')?.noise).toBe(0.25);
    expect(m.variables.find((v) => v.id === 'temp')?.noise).toBe(2);
    expect(m.variables.find((v) => v.id === 'inflow')?.noise).toBeUndefined();
    expect(m.settings).toEqual({ separation: 4 });
    expect(m.study?.length).toBe(30);
    // Σ and Φ of the exact sampled model depend on the noise: the same before and after
    expect(sampledAt(m, 1)).toEqual(sampledAt(v1 as unknown as Model, 1));
  });
  it('gives a version-1 file without a study length no study (it opens at the default design, as before)', () => {
    const { settings: _s, ...noLength } = v1;
    const m = open(JSON.stringify({ ...noLength, settings: { noise: { level: 1 } } }));
    expect(m.study).toBeUndefined();
    expect(m.settings).toBeUndefined();
  });
  it('says which version a newer file is', () => {
    const r = parseModel({ ...v1, version: 7 });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues).toEqual([{ path: 'version', message: expect.stringMatching(/is 7: this file was written by a newer Loopfold \(model file version 7\); this one reads versions 1 and 2/) }]);
  });
  it('explains version-1 settings found in a version-2 file', () => {
    const r = parseModel({ ...v1, version: 2 });
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.issues).toContainEqual({ path: 'settings.samples', message: 'belongs to version 1: in version 2 the study length is "study.length"' });
      expect(r.issues).toContainEqual({ path: 'settings.noise', message: 'belongs to version 1: in version 2 each state has its own "noise"' });
    }
  });
  it('writes a model built in code the version-1 way as version 2', () => {
    const saved = JSON.parse(serializeModel(v1 as unknown as Model));
    expect(saved.version).toBe(2);
    expect(Object.keys(saved).slice(0, 3)).toEqual(['format', 'version', 'name']);
    expect(saved.settings).toEqual({ separation: 4 });
  });
});

/** A random version-1 sketch: states with timescales, inputs, derived variables, links of both kinds, noise, study length. */
const v1Sketch = fc
  .record({
    n: fc.integer({ min: 2, max: 9 }),
    seed: fc.integer({ min: 0, max: 1e6 }),
    samples: fc.option(fc.integer({ min: 2, max: 5000 }), { nil: undefined }),
    separation: fc.option(fc.double({ min: 1, max: 20, noNaN: true }), { nil: undefined }),
    unit: fc.constantFrom('min', 'h', 'day', 'week'),
  })
  .map(({ n, seed, samples, separation, unit }) => {
    let s = seed + 1;
    const r = () => ((s = (s * 16807) % 2147483647) / 2147483647);
    const variables: Variable[] = [];
    const noise: Record<string, number> = {};
    for (let i = 0; i < n; i++) {
      const kind = i === 0 ? 'input' : r() < 0.6 ? 'state' : 'derived';
      const v: Variable = { id: `v${i}`, kind };
      if (kind === 'state') {
        v.timescale = r() < 0.5 ? Math.exp(6 * r() - 3) : `${Math.ceil(r() * 90)} min`;
        if (r() < 0.5) noise[v.id] = r() * 3;
      }
      variables.push(v);
    }
    const links: Link[] = [];
    for (let i = 1; i < n; i++) {
      const from = variables[Math.floor(r() * i)];
      links.push({ from: from.id, to: variables[i].id, kind: variables[i].kind === 'state' ? 'integrating' : 'instantaneous', sign: r() < 0.5 ? '+' : '-', weight: 0.2 + r() });
    }
    const settings: Record<string, unknown> = {};
    if (samples !== undefined) settings.samples = samples;
    if (separation !== undefined) settings.separation = separation;
    if (Object.keys(noise).length > 0) settings.noise = noise;
    return { format: 'loopfold-model', version: 1, name: 'random', timeUnit: unit, variables, links, ...(Object.keys(settings).length ? { settings } : {}) } as unknown as Model;
  });

describe('property: version 1 → version 2 → saved → opened keeps the meaning', () => {
  it('the same breakpoints, bands, orderings and sampled model', () => {
    fc.assert(
      fc.property(v1Sketch, fc.double({ min: -3, max: 3, noNaN: true }), (raw, logInterval) => {
        const migrated = open(JSON.stringify(raw));
        const reopened = open(serializeModel(migrated));
        const interval = Math.exp(logInterval);
        const intervals = [interval, ...bands(raw).map((b) => (b.to === Infinity ? b.from * 2 : b.from === 0 ? b.to / 2 : (b.from + b.to) / 2))];
        expect(meaning(reopened, intervals)).toEqual(meaning(raw, intervals));
        const a = sampledAt(raw, interval);
        const b = sampledAt(reopened, interval);
        expect(b.ok).toBe(a.ok);
        if (a.ok && b.ok) {
          expect(Array.from(b.sampled.phi.data)).toEqual(Array.from(a.sampled.phi.data));
          expect(b.sampled.stationary && Array.from(b.sampled.stationary.data)).toEqual(a.sampled.stationary && Array.from(a.sampled.stationary.data));
          expect(Array.from(b.sampled.innovation.data)).toEqual(Array.from(a.sampled.innovation.data));
        }
      }),
      { numRuns: 60, seed: 20261204 },
    );
  });
});
