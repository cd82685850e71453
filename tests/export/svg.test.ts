import { describe, expect, it } from 'vitest';
import { parseModel } from '../../src/core/model/schema';
import type { Model } from '../../src/core/model/types';
import { orderingAt } from '../../src/core/ordering/index';
import { mechanismView, orderingView } from '../../src/core/view/derive';
import { renderSvg, xmlEscape } from '../../src/export/svg';
import { instantLayout } from '../../src/layout/instant';
import { renderFigure } from '../../src/cli/commands/render';
import { runCli } from '../../src/cli/run';
import { EXAMPLES } from '../../src/examples/index';
import { runPython } from '../helpers/python';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const XML = fileURLToPath(new URL('./xmlcheck.py', import.meta.url));
type Parsed = { ok: boolean; error?: string; root: string; texts: string[]; variables: string[]; edges: [string, string, string][]; groups: string[]; hrefs: string[] };
const parse = (svgs: string[]) => runPython<Parsed[]>(XML, svgs);

function example(id: string): Model {
  const r = parseModel(EXAMPLES.find((e) => e.id === id)!.model);
  if (!r.ok) throw new Error('bad example');
  return r.model;
}

/** A model whose labels and name carry every character XML reserves. */
const nasty: Model = {
  format: 'loopfold-model', version: 1, name: 'Tom & Jerry\'s "<loop>"', timeUnit: 'h', caution: 'a < b & c > d',
  variables: [
    { id: 'a', kind: 'input', label: 'load <peak> & "rush"' },
    { id: 'b', kind: 'state', label: "it's > 3", timescale: '10 min' },
    { id: 'c', kind: 'derived', label: ']]> <!-- x -->' },
  ],
  links: [{ from: 'a', to: 'b', kind: 'integrating', sign: '+' }, { from: 'b', to: 'c', kind: 'instantaneous', sign: '-' }],
};

describe('the SVG renderer', () => {
  it('escapes the five XML characters (XML 1.0 §2.4, predefined entities)', () => {
    expect(xmlEscape(`<a href="x">&'</a>`)).toBe('&lt;a href=&quot;x&quot;&gt;&amp;&apos;&lt;/a&gt;');
  });

  it('writes strict XML that keeps every label as text, even with <, & and quotes (checked by Python\'s XML parser)', () => {
    const views = [
      mechanismView(nasty),
      orderingView(nasty, orderingAt(nasty, { interval: 2, samples: 50 }), { mode: 'ordering', interval: 2, samples: 50 }),
      orderingView(nasty, orderingAt(nasty, { interval: 2, samples: 50 }), { mode: 'unrolled', interval: 2, samples: 50 }),
    ];
    const svgs = views.map((vm) => renderSvg(vm, instantLayout(vm, undefined), { caption: true, captionText: 'every 2 h & more' }));
    const parsed = parse(svgs);
    for (const [i, p] of parsed.entries()) {
      expect(p.ok, p.error).toBe(true);
      expect(p.root).toBe('{http://www.w3.org/2000/svg}svg');
      for (const v of nasty.variables) expect(p.texts).toContain(v.label);
      expect(p.texts).toContain('a < b & c > d');
      expect(p.texts.some((t) => t.includes('Tom & Jerry\'s "<loop>"'))).toBe(true);
      // self-contained: no external references other than in-document markers
      expect(p.hrefs).toEqual([]);
      expect(svgs[i]).not.toMatch(/<link|@import|<image|url\((?!#)/);
    }
  });

  it('keeps the distinctions in grayscale: roles differ by outline dash, width or glyph, link kinds by dash and head', async () => {
    const m = example('sleep-stress');
    const design = { interval: 24 * 7, window: 24 * 14 }; // weekly for 2 weeks: stress, cortisol, sleep debt settle; coping frozen
    const svg = await renderFigure({ model: m, view: 'ordering', design, caption: false });
    const nodeOf = (v: string) => new RegExp(`<g data-variable="${v}"[^>]*>[\\s\\S]*?</g>`).exec(svg)![0];
    const settled = nodeOf('stress'), frozen = nodeOf('coping'), dynamic = nodeOf('mood');
    expect(settled).toContain('≈');
    expect(frozen).toContain('‖');
    expect(frozen).toMatch(/stroke-dasharray="5 3"/);
    expect(dynamic).not.toMatch(/stroke-dasharray|≈|‖/);
    const edge = (kind: string) => new RegExp(`<g data-edge="[^"]*" data-kind="${kind}"[^>]*>[\\s\\S]*?</g>`).exec(svg)?.[0] ?? '';
    expect(edge('instantaneous')).not.toMatch(/stroke-dasharray/);
  });

  it('draws an integrating link dashed with the hollow head', async () => {
    // a → b accumulates (b's timescale 10 min); sampled every minute, b moves within the study, so the link is drawn.
    const svg = await renderFigure({ model: nasty, view: 'ordering', design: { interval: 1 / 60, samples: 50 }, caption: false });
    const edge = new RegExp('<g data-edge="[^"]*" data-kind="integrating"[^>]*>[\\s\\S]*?</g>').exec(svg)?.[0];
    expect(edge, 'the figure has the integrating link a → b').toBeDefined();
    expect(edge).toMatch(/stroke-dasharray="7 4"[^>]*marker-end="url\(#lf-head-integrating\)"/);
  });

  it.each(EXAMPLES.map((e) => e.id))('%s: `loopfold render` draws the nodes, blocks and edges of orderingAt at the interval', async (id) => {
    const m = example(id);
    const path = fileURLToPath(new URL(`../../src/examples/${id}.json`, import.meta.url));
    const intervals = ['10 min', '6h', '3 days', '8 weeks'];
    const svgs: string[] = [];
    for (const iv of intervals) {
      const files: Record<string, string> = {};
      const code = await runCli(['render', path, '--interval', iv, '--samples', '40', '--caption', '--out', 'fig.svg'], {
        out: () => undefined, err: () => undefined, readFile: (p) => readFileSync(p, 'utf8'), writeFile: (p, c) => { files[p] = c; },
      });
      expect(code).toBe(0);
      svgs.push(files['fig.svg']);
    }
    const parsed = parse(svgs);
    const hours: Record<string, number> = { '10 min': 1 / 6, '6h': 6, '3 days': 72, '8 weeks': 8 * 7 * 24 };
    const perUnit = { s: 1 / 3600, min: 1 / 60, h: 1, day: 24, week: 168, month: 730.5, year: 8766 }[m.timeUnit];
    for (const [i, p] of parsed.entries()) {
      expect(p.ok, p.error).toBe(true);
      const o = orderingAt(m, { interval: hours[intervals[i]] / perUnit, samples: 40 });
      expect(p.variables).toEqual(m.variables.map((v) => v.id).sort());
      expect(p.groups).toEqual(o.blocks.filter((b) => b.variables.length > 1).map((b) => b.variables.join(' ')).sort());
      // the ordering's edges, and inside each block every link drawn between two of its members (both directions of a loop)
      const inBlock = (a: string, b: string) => o.blocks.some((k) => k.variables.length > 1 && k.variables.includes(a) && k.variables.includes(b));
      const want = [...new Set([...o.edges.map((e) => JSON.stringify([e.from, e.to, e.kind])), ...m.links.filter((l) => l.from !== l.to && inBlock(l.from, l.to)).map((l) => JSON.stringify([l.from, l.to, 'instantaneous']))])].map((s) => JSON.parse(s) as string[]).sort();
      expect(p.edges.map((e) => JSON.stringify(e)).sort()).toEqual(want.map((e) => JSON.stringify(e)).sort());
      for (const v of m.variables) expect(p.texts).toContain(v.label ?? v.id);
      // the title names the interval; the caption adds what the title does not (roles and link counts)
      expect(svgs[i]).toMatch(/aria-label="[^"]*every \d/);
      expect(p.texts.join(' ')).toMatch(/links? within the instant/);
    }
  });

  it('`loopfold render` explains a missing interval and a bad view in one line', async () => {
    const errs: string[] = [];
    const io = { out: () => undefined, err: (t: string) => { errs.push(t); }, readFile: (p: string) => readFileSync(p, 'utf8'), writeFile: () => undefined };
    const path = fileURLToPath(new URL('../../src/examples/sleep-stress.json', import.meta.url));
    // a file without a study names no interval
    expect(await runCli(['render', fileURLToPath(new URL('../fixtures/greenhouse-without-study.json', import.meta.url)), '--out', 'x.svg'], io)).toBe(2);
    expect(errs.at(-1)).toMatch(/--interval is needed/);
    expect(await runCli(['render', path, '--interval', '3h', '--view', 'sideways', '--out', 'x.svg'], io)).toBe(2);
    expect(errs.at(-1)).toMatch(/--view must be ordering, mechanism or unrolled/);
  });
});
