/**
 * Large models: the summary view (the chosen variables and their neighbours, other blocks folded, the rest
 * left out and counted in the title) is legible at two-column width where the whole ordering is not, and
 * `--text paths` gives an SVG that renders the same without any font installed (resvg with no font at all
 * against resvg with DejaVu Sans on the text version, pixels decoded by pngjs and compared channel by channel).
 */
import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { PNG } from 'pngjs';
import { Resvg } from '@resvg/resvg-js';
import type { ViewModel } from '../../../src/core/view/types';
import { printView, viewOf } from '../../../src/export/print/figure';
import { MIN_TEXT_PT, WIDTH_PRESETS } from '../../../src/export/print/options';
import { neighbourhood } from '../../../src/export/print/summary';
import { svgDocument } from '../../../src/export/svg';
import { layoutInNode } from '../../../src/layout/node';
import { runCli } from '../../../src/cli/run';
import { generatedSketch } from '../../helpers/sketches';
import { runPython } from '../../helpers/python';
import { memoryIo } from '../../helpers/cli';
import { decimals, expectClose } from '../../helpers/tolerance';
import { writeFileSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const MEASURE = fileURLToPath(new URL('./print_measure.py', import.meta.url));
const layoutOf = (vm: ViewModel) => layoutInNode(vm);
const TWO = { width: { mm: WIDTH_PRESETS['two-columns'] } };

describe('large models at two-column width', () => {
  it('a 60- and an 80-variable model: the summary around two variables keeps its text at 7 pt or more, shows them and their neighbours only, and says what it leaves out', async () => {
    for (const n of [60, 80]) {
      const model = generatedSketch(n, 7);
      const states = model.variables.filter((v) => v.kind === 'state');
      const focus = [states[0].id, states[Math.floor(states.length / 2)].id];
      const req = { model, view: 'ordering' as const, design: { interval: 1 }, caption: true };
      const whole = await printView(req, TWO, layoutOf);
      const summary = await printView(req, TWO, layoutOf, focus);
      const [mWhole, mSummary] = runPython<{ smallestPt: number; widthPt: number }[]>(MEASURE, [svgDocument(whole.root), svgDocument(summary.root)]);
      // both 17.8 cm wide (504.6 pt); the whole ordering says when it does not fit legibly, the summary fits
      expectClose(mSummary.widthPt, (178 * 72) / 25.4, decimals(1), 'width in pt');
      expect(whole.notes.some((x) => /does not fit .* legibly/.test(x))).toBe(mWhole.smallestPt < MIN_TEXT_PT - 1e-6);
      expect(mSummary.smallestPt, `${n} variables: ${summary.notes.join('; ')}`).toBeGreaterThanOrEqual(MIN_TEXT_PT);
      // what is drawn: the focus and its neighbours (by the links of the full view), nothing else unfolded
      const keep = neighbourhood(viewOf(req), focus);
      const svg = svgDocument(summary.root);
      const drawn = new Set([...svg.matchAll(/data-variable="([^"]+)"/g)].map((m) => m[1]));
      for (const f of focus) expect(drawn.has(f), `${f} drawn`).toBe(true);
      for (const v of drawn) expect(keep.has(v), `${v} is the focus or a neighbour`).toBe(true);
      expect(drawn.size).toBeLessThan(n);
      expect(svg).toMatch(/summary around .*\(\d+ of \d+ variables left out\)/);
      expect(summary.notes[0]).toMatch(/^summary: /);
    }
  }, 300_000);

  it('`render --text paths`: no text element is left, and without any font the file renders as the text version does with DejaVu Sans', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'lf-paths-'));
    const out: Record<string, string> = {};
    for (const [name, extra] of [['text', []], ['paths', ['--text', 'paths']]] as const) {
      const m = memoryIo();
      const code = await runCli(['render', 'src/examples/sleep-stress.json', '--interval', '1 day', '--width', 'column', ...extra, '--out', `${name}.svg`], m.io);
      expect(code, m.err.join('\n')).toBe(0);
      out[name] = m.files[`${name}.svg`];
      writeFileSync(join(dir, `${name}.svg`), out[name]);
    }
    expect(out.text).toMatch(/<text[\s>]/);
    expect(out.paths).not.toMatch(/<text[\s>]/);
    // the words are still there for a reader (the figure's accessible name)
    expect(out.paths).toContain('aria-label=');
    const render = (svg: string, fonts: boolean) => {
      const r = new Resvg(svg, {
        fitTo: { mode: 'width', value: 800 },
        font: fonts
          ? { fontFiles: [fileURLToPath(new URL('../../../node_modules/dejavu-fonts-ttf/ttf/DejaVuSans.ttf', import.meta.url)), fileURLToPath(new URL('../../../node_modules/dejavu-fonts-ttf/ttf/DejaVuSans-Bold.ttf', import.meta.url)), fileURLToPath(new URL('../../../node_modules/dejavu-fonts-ttf/ttf/DejaVuSans-Oblique.ttf', import.meta.url))], loadSystemFonts: false, defaultFontFamily: 'DejaVu Sans' }
          : { fontFiles: [], loadSystemFonts: false },
      });
      return PNG.sync.read(Buffer.from(r.render().asPng()));
    };
    const a = render(out.text, true), b = render(out.paths, false), none = render(out.text, false);
    const share = (p: PNG, q: PNG) => {
      expect([q.width, q.height]).toEqual([p.width, p.height]);
      let d = 0;
      for (let k = 0; k < p.data.length; k += 4) if (Math.abs(p.data[k] - q.data[k]) > 48 || Math.abs(p.data[k + 1] - q.data[k + 1]) > 48 || Math.abs(p.data[k + 2] - q.data[k + 2]) > 48) d++;
      return d / (p.width * p.height);
    };
    // outlines without fonts ≈ text with DejaVu (anti-aliasing of glyph edges aside); text without fonts loses its words
    const same = share(a, b), lost = share(a, none);
    expect(same).toBeLessThan(0.01);
    expect(lost).toBeGreaterThan(5 * same);
  }, 120_000);
});
