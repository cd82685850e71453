import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { bandInterval, buildReport, htmlEscape, prefixSvgIds } from '../../src/report/html';
import { bands } from '../../src/core/ordering/index';
import { parseModel } from '../../src/core/model/schema';
import type { Model } from '../../src/core/model/types';
import { EXAMPLES } from '../../src/examples/index';
import { layoutInNode } from '../../src/layout/node';
import { runPython } from '../helpers/python';
import { runCli } from '../../src/cli/run';

const SCRIPT = fileURLToPath(new URL('./html_reference.py', import.meta.url));
type Read = { errors: string[]; duplicateIds: string[]; bands: number[]; scripts: number; external: string[]; text: string; titles: string[] };
const read = (html: string) => runPython<Read>(SCRIPT, { html });

function example(id: string): Model {
  const r = parseModel(EXAMPLES.find((e) => e.id === id)!.model);
  if (!r.ok) throw new Error(`example ${id} does not load`);
  return r.model;
}

describe('the HTML report', () => {
  it('walks every band of every example, well-formed and self-contained (read by Python html.parser)', async () => {
    for (const ex of EXAMPLES) {
      const model = example(ex.id);
      const html = await buildReport(model);
      const r = read(html);
      expect(r.errors, ex.id).toEqual([]);
      expect(r.duplicateIds, ex.id).toEqual([]);
      expect(r.scripts).toBe(0);
      expect(r.external).toEqual([]);
      expect(r.bands.length, ex.id).toBe(bands(model, { samples: model.settings?.samples }).length);
      expect(r.text).toMatch(/Perfect adaptation/);
      if (model.caution) expect(r.text).toContain(model.caution);
    }
  });

  it('has one inline SVG figure per band when a layout engine is given, with ids kept apart', async () => {
    const model = example('greenhouse');
    const html = await buildReport(model, { layout: (vm) => layoutInNode(vm) });
    const r = read(html);
    expect(r.errors).toEqual([]);
    expect(r.bands.every((n) => n === 1)).toBe(true);
    expect(r.duplicateIds).toEqual([]);
    expect(html).not.toContain('<?xml');
  });

  it('escapes model text: a label cannot inject markup', async () => {
    const model: Model = {
      format: 'loopfold-model', version: 1, name: 'Tag <script>alert(1)</script> & co', timeUnit: 'h',
      variables: [{ id: 'a', kind: 'input', label: '<img src=x onerror=alert(1)>' }, { id: 'b', kind: 'derived', formula: '2 * a', label: '"quoted"' }],
      links: [],
    };
    const html = await buildReport(model);
    const r = read(html);
    expect(r.scripts).toBe(0);
    expect(r.external).toEqual([]);
    expect(r.text).toContain('Tag <script>alert(1)</script> & co');
    expect(htmlEscape(`<a href="x">'&'</a>`)).toBe('&lt;a href=&quot;x&quot;&gt;&#39;&amp;&#39;&lt;/a&gt;');
  });

  it('gives the equilibrium and the derived timescales of a model with formulas, and of a sketch too', async () => {
    const html = await buildReport(example('greenhouse'));
    const r = read(html);
    expect(r.titles).toContain('Equilibrium and timescales');
    // Hand-derived from the example's formulas: 0 = (8 − T)/12 + 0.04·2·(21 − T) + 0.3·0.6·(1 − 0.4) ⇒ T = 2.4547/0.163333 = 15.03.
    expect(r.text).toMatch(/Air temperature\s*15\.03/);
    expect(r.text).toMatch(/Timescales at the equilibrium/);
    const sketch: Model = { format: 'loopfold-model', version: 1, name: 'Sketch', timeUnit: 'h', variables: [{ id: 'a', kind: 'input' }, { id: 'b', kind: 'derived' }], links: [{ from: 'a', to: 'b', kind: 'instantaneous' }] };
    // the sketch's semantics: b = 1 · a with the input a at its default value 0 (common practice: v = Σ sign·weight·source)
    const st = read(await buildReport(sketch)).text;
    expect(st).not.toMatch(/no equilibrium values/);
    expect(st).toMatch(/Equilibrium \(every state settled\)/);
  });

  it('lists the commutation check of a hold in each band', async () => {
    const html = await buildReport(example('greenhouse'), { hold: { heater: 0 } });
    expect(html).toMatch(/Holding Heating power = 0/);
    expect(html).toMatch(/differ\./);
    // With formulas, the held equilibrium: heater off ⇒ 0 = (8 − T)/12 + 0.108 ⇒ T = 9.296 (hand-derived from the example).
    const r = read(html);
    expect(r.titles).toContain('The intervention with the formulas');
    expect(r.text).toMatch(/Air temperature\s*15\.03\s*9\.296/);
  });

  it('picks a representative interval inside each band (common practice: the geometric middle on a log axis)', () => {
    expect(bandInterval({ from: 2, to: 8, roles: {} })).toBe(4);
    expect(bandInterval({ from: 0, to: 8, roles: {} })).toBe(4);
    expect(bandInterval({ from: 3, to: Infinity, roles: {} })).toBe(6);
    expect(prefixSvgIds('<?xml version="1.0"?>\n<svg><marker id="m"/><path marker-end="url(#m)"/></svg>', 'b1-')).toBe('<svg><marker id="b1-m"/><path marker-end="url(#b1-m)"/></svg>');
  });
});

describe('loopfold report', () => {
  it('writes the report to --out and says so', async () => {
    const files: Record<string, string> = {};
    const out: string[] = [];
    const err: string[] = [];
    const io = {
      out: (t: string) => out.push(t),
      err: (t: string) => err.push(t),
      readFile: (p: string) => (p === 'm.json' ? JSON.stringify(example('warehouse')) : (() => { throw new Error('no such file'); })()),
      writeFile: (p: string, c: string) => { files[p] = c; },
    };
    expect(await runCli(['report', 'm.json', '--out', 'r.html', '--no-figures'], io)).toBe(0);
    expect(files['r.html']).toMatch(/^<!DOCTYPE html>/);
    expect(err[0]).toBe(`wrote r.html (${new TextEncoder().encode(files['r.html']).length} bytes)`);
    expect(out).toEqual([]);
    expect(await runCli(['report', 'm.json'], io)).toBe(2);
    expect(err[1]).toMatch(/name the output file/);
  });
});
