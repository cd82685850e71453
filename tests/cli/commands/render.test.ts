/**
 * The command line's figure files and batch runs: --out by extension, bytes
 * reported as written, render --hold, labels for --from/--to, an unknown
 * --fold key, batch jobs; and the report's claims against the equilibrium
 * and timescales commands.
 */
import { describe, expect, it } from 'vitest';
import { runCli } from '../../../src/cli/run';
import { decimals, expectClose } from '../../helpers/tolerance';
import { memoryIo } from '../../helpers/cli';

const SLEEP = 'src/examples/sleep-stress.json';
const GREENHOUSE = 'src/examples/greenhouse.json';

async function run(argv: string[], files: Record<string, string> = {}) {
  const m = memoryIo(files);
  const code = await runCli(argv, m.io);
  return { code, ...m };
}

describe('figure files from the command line', () => {
  it('--out picks the format by extension; other extensions are refused with a message, nothing written', async () => {
    const svg = await run(['render', SLEEP, '--interval', '1 day', '--out', 'f.svg']);
    expect(svg.code, svg.err.join('\n')).toBe(0);
    expect(svg.files['f.svg']).toMatch(/^<\?xml/);
    // the size reported is the file's in bytes (UTF-8: "−", "≈", "·" take 2–3 bytes each)
    expect(svg.err).toContain(`wrote f.svg (${Buffer.byteLength(svg.files['f.svg'], 'utf8')} bytes)`);
    expect(Buffer.byteLength(svg.files['f.svg'], 'utf8')).toBeGreaterThan(svg.files['f.svg'].length);
    const png = await run(['render', SLEEP, '--interval', '1 day', '--width', 'column', '--dpi', '150', '--out', 'f.png']);
    expect(png.code, png.err.join('\n')).toBe(0);
    expect([...png.bytes['f.png'].subarray(1, 4)].map((c) => String.fromCharCode(c)).join('')).toBe('PNG');
    expect(png.err).toContain(`wrote f.png (${png.bytes['f.png'].length} bytes)`);
    const pdf = await run(['render', SLEEP, '--interval', '1 day', '--out', 'f.pdf']);
    expect(pdf.code, pdf.err.join('\n')).toBe(0);
    expect(Buffer.from(pdf.bytes['f.pdf'].subarray(0, 5)).toString('latin1')).toBe('%PDF-');
    const bad = await run(['render', SLEEP, '--interval', '1 day', '--out', 'f.jpg']);
    expect(bad.code).toBe(2);
    expect(bad.err.join('\n')).toMatch(/--out f\.jpg: the file's extension names its format; use \.svg, \.png or \.pdf \(not \.jpg\)/);
    expect(bad.files).toEqual({});
    const chart = await run(['curves', GREENHOUSE, '--from', 'soilWater', '--to', 'humidity', '--out', 'c.tiff']);
    expect(chart.code).toBe(2);
  }, 300_000);

  it('render --hold draws the held figure: the held variable carries the held role', async () => {
    const r = await run(['render', GREENHOUSE, '--interval', '1h', '--hold', 'heater=0', '--out', '-']);
    expect(r.code, r.err.join('\n')).toBe(0);
    expect(r.out[0]).toMatch(/data-variable="heater"[^>]*data-role="held"/);
    const bad = await run(['render', GREENHOUSE, '--interval', '1h', '--hold', 'nothing=0', '--out', '-']);
    expect(bad.code).toBe(2);
    expect(bad.err.join('\n')).toMatch(/--hold: the model has no variable "nothing"/);
  }, 120_000);

  it('an unknown --fold key is an error that names the blocks there are', async () => {
    const r = await run(['render', SLEEP, '--interval', '1 day', '--fold', 'stress+mood', '--out', '-']);
    expect(r.code).toBe(2);
    // at 1 day, rumination and stress are determined together (the example's fast loop)
    expect(r.err.join('\n')).toMatch(/--fold: "mood\+stress" is not a simultaneous block; the blocks at this interval are rumination\+stress/);
    const ok = await run(['render', SLEEP, '--interval', '1 day', '--fold', 'Stress+Rumination', '--out', '-']);
    expect(ok.code, ok.err.join('\n')).toBe(0);
    expect(ok.out[0]).toContain('data-folded="true"');
  }, 120_000);

  it('--from and --to take labels as well as ids', async () => {
    const byId = await run(['curves', GREENHOUSE, '--from', 'soilWater', '--to', 'humidity', '--json']);
    const byLabel = await run(['curves', GREENHOUSE, '--from', 'Soil water', '--to', 'humidity', '--json']);
    expect(byLabel.code, byLabel.err.join('\n')).toBe(0);
    expect(byLabel.out).toEqual(byId.out);
    const bad = await run(['curves', GREENHOUSE, '--from', 'Rain', '--to', 'humidity']);
    expect(bad.code).toBe(2);
    expect(bad.err.join('\n')).toMatch(/--from: the model has no variable "Rain" \(variables: .*soilWater \("Soil water"\)/);
  }, 120_000);

  it('print options are checked and need --out', async () => {
    const cases: [string[], RegExp][] = [
      [['render', SLEEP, '--interval', '1 day', '--width', 'wide', '--out', 'x.svg'], /--width: "wide" is not a width/],
      [['render', SLEEP, '--interval', '1 day', '--palette', 'rainbow', '--out', 'x.svg'], /--palette: "rainbow" is not a palette; choose default, colour-blind, greyscale/],
      [['render', SLEEP, '--interval', '1 day', '--background', 'blue', '--out', 'x.svg'], /--background: "blue"/],
      [['render', SLEEP, '--interval', '1 day', '--font-size', '5', '--out', 'x.svg'], /--font-size: "5" must be a size in points from 7 to 24/],
      [['render', SLEEP, '--interval', '1 day', '--dpi', '5', '--out', 'x.png'], /--dpi: "5" must be a number from 36 to 2400/],
      [['simulate', GREENHOUSE, '--until', '1 day', '--palette', 'greyscale'], /--palette shapes the figure: give --out FILE too/],
    ];
    for (const [argv, reason] of cases) {
      const r = await run(argv);
      expect(r.code, argv.join(' ')).toBe(2);
      expect(r.err.join('\n')).toMatch(reason);
      expect(r.files).toEqual({});
    }
  }, 120_000);
});

describe('loopfold batch', () => {
  it('runs every job in one process, paths relative to the batch file; a failing job fails the batch but not the others', async () => {
    const jobs = {
      jobs: [
        ['render', '../src/examples/lake.json', '--interval', '1 day', '--out', 'lake.svg'],
        { command: 'order', model: '../src/examples/lake.json', options: { interval: '3h', json: true }, stdout: 'order.json' },
        ['render', '../src/examples/lake.json', '--interval', '1 day', '--out', 'lake.gif'],
        { command: 'equilibrium', model: '../src/examples/greenhouse.json', options: { json: true }, stdout: 'eq.json' },
      ],
    };
    const r = await run(['batch', 'jobs/figures.json'], { 'jobs/figures.json': JSON.stringify(jobs) });
    expect(r.code).toBe(2);
    expect(r.files['jobs/lake.svg']).toMatch(/^<\?xml/);
    const order = JSON.parse(r.files['jobs/order.json']) as { blocks: unknown[] };
    expect(order.blocks.length).toBeGreaterThan(0);
    // the same answer as the command on its own
    const alone = await run(['order', 'src/examples/lake.json', '--interval', '3h', '--json']);
    expect(r.files['jobs/order.json'].trim()).toBe(alone.out.join('\n').trim());
    expect(JSON.parse(r.files['jobs/eq.json'])).toHaveProperty('values');
    expect(r.err.some((l) => /^\[3\/4 render\] loopfold render: --out .*lake\.gif/.test(l))).toBe(true);
    expect(r.files['jobs/lake.gif']).toBeUndefined();
  }, 300_000);

  it('a batch file that is not a list of jobs is refused naming the place', async () => {
    const r = await run(['batch', 'b.json'], { 'b.json': JSON.stringify({ jobs: [{ model: 'x.json' }] }) });
    expect(r.code).toBe(1);
    expect(r.err.join('\n')).toMatch(/jobs\[0\]\.command: name a command/);
  });
});

describe('the report agrees with the command line', () => {
  it('its equilibrium values and derived timescales are those of `equilibrium --json` and `timescales --json`, for every example', async () => {
    for (const ex of ['sleep-stress', 'lake', 'greenhouse', 'warehouse']) {
      const path = `src/examples/${ex}.json`;
      const rep = await run(['report', path, '--out', 'r.html', '--no-figures', '--date', '2026-01-01']);
      expect(rep.code, rep.err.join('\n')).toBe(0);
      const html = rep.files['r.html'];
      expect(html).toContain('data-spec="variables"');
      expect(html).toContain('generated 2026-01-01');
      const eq = JSON.parse((await run(['equilibrium', path, '--json'])).out[0]) as { values: Record<string, number> };
      const cells = [...html.matchAll(/data-equilibrium="([^"]+)">([^<]*)</g)];
      expect(cells.length).toBe(Object.keys(eq.values).length);
      for (const [, id, text] of cells) {
        const v = eq.values[id];
        // 4 significant digits in the report
        expectClose(Number(text.replace('−', '-')), v, decimals(Math.max(0, 3 - Math.floor(Math.log10(Math.abs(v) || 1)))), `${ex} ${id}`);
      }
      const ts = JSON.parse((await run(['timescales', path, '--json'])).out[0]) as { timescales: { state: string; derived: number | null }[] };
      for (const t of ts.timescales) {
        const m = new RegExp(`data-timescale="${t.state}" data-value="([^"]*)"`).exec(html);
        expect(m, `${ex} ${t.state}`).not.toBeNull();
        expect(m![1] === '' ? null : Number(m![1])).toEqual(t.derived);
      }
      expect(html).not.toMatch(/no equilibrium values/);
      // prose names equations in words: no equation ids outside code
      expect(html.replace(/<code>[^<]*<\/code>/g, '').replace(/<svg[\s\S]*?<\/svg>/g, '')).not.toMatch(/\b(formula|rate|hold)\([A-Za-z_]/);
    }
  }, 600_000);
});
