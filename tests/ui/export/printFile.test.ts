/**
 * The export dialog's files are the command line's files: the app's export
 * code path (`printedFigure` → `printedSvg`, with ELK in Node as the worker's
 * ELK runs in the browser) against `loopfold render` / `sampled --out` run
 * in process with the same options, compared byte for byte. The command
 * lines are written out by hand here (not by the dialog's own builder), and
 * the builder's line is checked separately by running it.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/run';
import { sampledOf } from '../../../src/core/numeric/answers';
import type { Model } from '../../../src/core/model/types';
import { laggedNetwork } from '../../../src/export/charts';
import { picturesAt } from '../../../src/core/pictures/index';
import { rankCurveCaption, rankCurveFigure } from '../../../src/export/pictures';
import { studyCaption } from '../../../src/export/caption';
import { parseWidth } from '../../../src/export/print/options';
import { nodeElk } from '../../../src/layout/node';
import { cliArgs, commandText, pngPixels, printArgs, printedFigure, printedSvg, shellWord, type FigureSource } from '../../../src/ui/export/printFile';
import { memoryIo } from '../../helpers/cli';

const SLEEP = 'src/examples/sleep-stress.json';
const model = JSON.parse(readFileSync(SLEEP, 'utf8')) as Model;
const elk = () => Promise.resolve(nodeElk());

async function cli(argv: string[]): Promise<string> {
  const m = memoryIo();
  const code = await runCli(argv, m.io);
  expect(code, m.err.join('\n')).toBe(0);
  return m.files['cli.svg'];
}

function width(text: string) {
  const w = parseWidth(text);
  if (!w.ok) throw new Error(w.message);
  return w.value;
}

describe("the export dialog's files equal the command line's", () => {
  it('the ordering at 1 day, one column, greyscale: the same bytes as `render --width column --palette greyscale`', async () => {
    const source: FigureSource = { kind: 'view', request: { model, view: 'ordering', design: { interval: 24, samples: 50 }, caption: true } };
    const fig = await printedFigure(source, { width: width('column'), palette: 'greyscale' }, elk);
    const app = printedSvg(fig!);
    const file = await cli(['render', SLEEP, '--interval', '1 day', '--samples', '50', '--caption', '--width', 'column', '--palette', 'greyscale', '--out', 'cli.svg']);
    expect(app).toBe(file);
    // 8.5 cm wide on the page (the one-column preset)
    expect(app).toMatch(/<svg[^>]* width="85mm"/);
  });

  it('the three instants with every option set: font size, colour-blind palette, paper ground, no title, caption text, a held variable', async () => {
    const source: FigureSource = { kind: 'view', request: { model, view: 'unrolled', design: { interval: 3, window: 240, hold: { workload: 2 } }, caption: true } };
    const opts = { width: width('120mm'), fontSize: 8, palette: 'colour-blind' as const, background: 'paper' as const, title: false, caption: 'Held workload; an "odd" caption & <markup>' };
    const app = printedSvg((await printedFigure(source, opts, elk))!);
    const file = await cli(['render', SLEEP, '--interval', '3h', '--window', '240', '--view', 'unrolled', '--hold', 'workload=2', '--caption', '--width', '120mm', '--font-size', '8', '--palette', 'colour-blind', '--background', 'paper', '--no-title', '--caption-text', 'Held workload; an "odd" caption & <markup>', '--out', 'cli.svg']);
    expect(app).toBe(file);
    expect(app).not.toContain('<markup>');
  });

  it('the mechanism at two columns: the same bytes as `render --view mechanism`', async () => {
    const source: FigureSource = { kind: 'view', request: { model, view: 'mechanism', design: {}, caption: false } };
    const app = printedSvg((await printedFigure(source, { width: width('two-columns'), background: 'transparent' }, elk))!);
    const file = await cli(['render', SLEEP, '--view', 'mechanism', '--width', 'two-columns', '--background', 'transparent', '--out', 'cli.svg']);
    expect(app).toBe(file);
  });

  it("a Numbers pane chart (the lagged network) equals `sampled --out` with the same options", async () => {
    const answer = sampledOf(model, 24);
    if (!answer.ok) throw new Error(answer.reason);
    const source: FigureSource = {
      kind: 'chart',
      build: (o) => laggedNetwork(model, answer, false, o),
      caption: studyCaption(model, { interval: 24, samples: 50 }),
      cli: ['sampled', '--interval', '24', '--samples', '50', '--caption'],
    };
    const opts = { width: width('1.5-column'), palette: 'greyscale' as const };
    const app = printedSvg((await printedFigure(source, opts, elk))!);
    const file = await cli(['sampled', SLEEP, '--interval', '1 day', '--samples', '50', '--caption', '--width', '1.5-column', '--palette', 'greyscale', '--out', 'cli.svg']);
    expect(app).toBe(file);
    // with the title off and a caption of the user's, as --no-title --caption-text
    const bare = printedSvg((await printedFigure(source, { ...opts, title: false, caption: 'Own words' }, elk))!);
    const bareFile = await cli(['sampled', SLEEP, '--interval', '24', '--no-title', '--caption-text', 'Own words', '--width', '1.5-column', '--palette', 'greyscale', '--out', 'cli.svg']);
    expect(bare).toBe(bareFile);
    expect(bare).not.toBe(app);
  });

  it('the rank curve of the Pictures pane equals `rank --out` with the same options (the pane computes its pictures with persons and person SDs; the curve does not depend on them)', async () => {
    // the pane's own call (src/ui/pictures/PicturesPane.tsx): the study's interval and prompts, persons, person SDs, two factors,
    // the analysed states in the order the modeller ticked them
    const observed = ['mood', 'stress', 'sleepDebt', 'cortisol'];
    const r = picturesAt(model, { interval: 2.4, samples: 70, persons: 40, observed, personSD: { workload: 1 }, factors: 2 });
    if (!r.ok) throw new Error(r.reason);
    const P = r.pictures;
    const source: FigureSource = {
      kind: 'chart',
      build: (o) => rankCurveFigure(model, P, o),
      caption: rankCurveCaption(model, P),
      cli: ['rank', '--interval', '2.4', '--observed', observed.join(','), '--caption'],
    };
    const opts = { width: width('column'), palette: 'greyscale' as const, background: 'paper' as const, fontSize: 8 };
    const fig = (await printedFigure(source, opts, elk))!;
    // drawn narrower for the column, so its text stays at 7 pt or more (8 pt asked: the ticks at 8 pt)
    expect(fig.smallestPt).toBeGreaterThanOrEqual(7);
    expect(fig.notes).toEqual([]);
    const app = printedSvg(fig);
    const file = await cli(['rank', SLEEP, '--interval', '2.4h', '--observed', 'mood,stress,sleepDebt,cortisol', '--caption', '--width', 'column', '--palette', 'greyscale', '--background', 'paper', '--font-size', '8', '--out', 'cli.svg']);
    expect(app).toBe(file);
    expect(app).toMatch(/<svg[^>]* width="85mm"/);
    expect(app).toContain('data-chart="rank-curve"');
    // the caption names the analysed states by their labels and both marks
    expect(app).toContain('Sleep debt');
    expect(app).toMatch(/dashed: the long interval/);
    // the dialog's own command line (run with .svg) gives the same file, and no title / own caption as --no-title --caption-text
    expect(await cli(cliArgs(source, SLEEP, opts, 'cli.svg')!)).toBe(app);
    const bare = printedSvg((await printedFigure(source, { ...opts, title: false, caption: 'Own words' }, elk))!);
    expect(await cli(cliArgs(source, SLEEP, { ...opts, title: false, caption: 'Own words' }, 'cli.svg')!)).toBe(bare);
    expect(bare).not.toContain('data-part="title"');
    expect(app).toContain('data-part="title"');
  });

  it('the command line the dialog shows for PDF draws the same figure (run here with .svg in place of .pdf)', async () => {
    const request = { model, view: 'ordering' as const, design: { interval: 5, samples: 40, hold: { coping: 0.5 } }, folded: [], caption: true };
    const opts = { width: width('two-columns'), fontSize: 10, palette: 'greyscale' as const, background: 'paper' as const, title: false, caption: "It's ours" };
    const args = cliArgs({ kind: 'view', request }, SLEEP, opts, 'cli.svg')!;
    const app = printedSvg((await printedFigure({ kind: 'view', request }, opts, elk))!);
    expect(await cli(args)).toBe(app);
    const text = commandText(cliArgs({ kind: 'view', request }, 'sleep-stress.json', opts, 'fig.pdf')!);
    expect(text).toBe("npm run -s loopfold -- render sleep-stress.json --interval 5 --samples 40 --hold coping=0.5 --caption --width two-columns --font-size 10 --palette greyscale --background paper --no-title --caption-text 'It'\\''s ours' --out fig.pdf");
    // a chart with no command of its own has no command line
    expect(cliArgs({ kind: 'chart', build: () => null }, SLEEP, opts, 'f.pdf')).toBeNull();
  });

  it('shell quoting and the PNG size at a DPI (inches × DPI, as `--out f.png --dpi N`)', async () => {
    // POSIX shell quoting: a single quote closes, is escaped, and reopens (common practice)
    expect(shellWord("a b'c")).toBe("'a b'\\''c'");
    expect(shellWord('1.5-column')).toBe('1.5-column');
    expect(printArgs({ width: { px: 800 } }, 300)).toEqual(['--width', '800px', '--dpi', '300']);
    const fig = (await printedFigure({ kind: 'view', request: { model, view: 'mechanism', design: {}, caption: false } }, { width: width('column') }, elk))!;
    // 85 mm = 3.346 in; at 300 dpi 1004 pixels
    expect(pngPixels(fig, { width: width('column') }, 300).width).toBe(1004);
  });
});
