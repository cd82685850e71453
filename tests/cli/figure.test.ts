import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/run';
import { memoryIo } from '../helpers/cli';
import { runPython } from '../helpers/python';

interface XNode { tag: string; ns: string; attrs: Record<string, string>; text: string; children: XNode[] }
const XML = fileURLToPath(new URL('../export/xmltree.py', import.meta.url));
/** Parsed by Python's strict XML parser (xml.etree.ElementTree). */
function parse(svg: string): XNode {
  const [p] = runPython<({ ok: true; root: XNode } | { ok: false; error: string })[]>(XML, [svg]);
  if (!p.ok) throw new Error(`not well-formed XML: ${p.error}`);
  return p.root;
}
const all = (n: XNode): XNode[] => [n, ...n.children.flatMap(all)];
const texts = (n: XNode) => all(n).filter((e) => e.tag === 'text').map((e) => e.text);

const GREENHOUSE = 'src/examples/greenhouse.json';
/** The greenhouse with no study in the file: no sampling interval unless --interval gives one. */
const NO_STUDY = 'tests/fixtures/greenhouse-without-study.json';

async function run(argv: string[]): Promise<{ code: number; out: string[]; err: string[]; files: Record<string, string> }> {
  const m = memoryIo();
  const code = await runCli(argv, m.io);
  return { code, out: m.out, err: m.err, files: m.files };
}

describe('--svg on simulate, sampled and curves', () => {
  it('simulate --out writes the chart of the first three states (as the app shows them); the table goes to stdout only with --table', async () => {
    const r = await run(['simulate', NO_STUDY, '--until', '1 day', '--every', '30 min', '--out', 'sim.svg']);
    expect(r.code, r.err.join('\n')).toBe(0);
    expect(r.err).toEqual([`wrote sim.svg (${new TextEncoder().encode(r.files['sim.svg']).length} bytes)`]);
    expect(r.out).toEqual([]);
    const withTable = await run(['simulate', NO_STUDY, '--until', '1 day', '--every', '30 min', '--out', 'sim.svg', '--table']);
    expect(withTable.out[0]).toContain('simulation to');
    expect(withTable.files['sim.svg']).toBe(r.files['sim.svg']);
    const root = parse(r.files['sim.svg']);
    // the greenhouse's states in file order: air temperature, humidity, soil water, dust (src/examples/greenhouse.json)
    expect(all(root).filter((e) => e.tag === 'polyline').map((e) => e.attrs['data-series'])).toEqual(['airTemp', 'humidity', 'soilWater']);
    expect(texts(root)).toContain('time since the start (min)');
    // no interval: no samples drawn, no caption
    expect(all(root).some((e) => e.tag === 'circle')).toBe(false);
    expect(all(root).some((e) => e.attrs['data-part'] === 'caption')).toBe(false);
  });

  it('simulate --svg - prints exactly one SVG document: --plot in its order, the samples and the caption of the study', async () => {
    const r = await run(['simulate', GREENHOUSE, '--until', '1 day', '--every', '30 min', '--plot', 'humidity,dust', '--interval', '6h', '--samples', '3', '--caption', '--svg', '-']);
    expect(r.code, r.err.join('\n')).toBe(0);
    expect(r.out).toHaveLength(1);
    expect(r.out[0].startsWith('<?xml')).toBe(true);
    const root = parse(r.out[0]);
    expect(all(root).filter((e) => e.tag === 'polyline').map((e) => e.attrs['data-series'])).toEqual(['humidity', 'dust']);
    // 3 samples every 6 h: a study of 18 h, samples at 0, 6, 12 and 18 h on each of the two panels (common practice)
    expect(all(root).filter((e) => e.tag === 'circle' && e.attrs.class === 'lf-chart-sample')).toHaveLength(8);
    // 3 × 6 h = 18 h
    expect(texts(root)).toContain('Sampling interval every 6 h · study 3 samples (18 h)');
  });

  it('sampled --svg: the lagged network\'s weights are SciPy\'s expm(A·Δ) of the drift `sampled --json` prints; --network same draws the partial correlations', async () => {
    const j = await run(['sampled', GREENHOUSE, '--interval', '1h', '--json']);
    const s = JSON.parse(j.out[0]) as { states: string[]; drift: number[][]; innovationPartialCorrelation: number[][] };
    const ref = runPython<{ phi: number[][] }>('tests/reference/numeric_cli.py', { drift: s.drift, interval: 60 });
    const lagged = await run(['sampled', GREENHOUSE, '--interval', '1h', '--samples', '50', '--caption', '--svg', '-']);
    expect(lagged.code, lagged.err.join('\n')).toBe(0);
    const root = parse(lagged.out[0]);
    expect(root.attrs['aria-label']).toBe('Lagged network at 1 h');
    // 50 × 1 h = 50 h = 2.08 days
    expect(texts(root)).toContain('Sampling interval every 1 h · study 50 samples (2.08 days)');
    const at = (id: string) => s.states.indexOf(id);
    // weightText: two decimals (common practice for path coefficients), minus sign U+2212
    const two = (x: number) => (Math.abs(x) >= 0.1 ? x.toFixed(2) : x.toPrecision(2)).replace('-', '−');
    const edges = all(root).filter((e) => e.attrs['data-edge']);
    expect(edges.length).toBeGreaterThan(0);
    for (const e of edges) {
      const [from, to] = e.attrs['data-edge'].split('>');
      expect(e.children.find((c) => c.tag === 'text')!.text).toBe(two(ref.phi[at(to)][at(from)]));
    }
    const same = await run(['sampled', GREENHOUSE, '--interval', '1h', '--network', 'same', '--svg', '-']);
    const sroot = parse(same.out[0]);
    expect(sroot.attrs['aria-label']).toBe('Same-interval network at 1 h');
    for (const e of all(sroot).filter((x) => x.attrs['data-edge'])) {
      const [a, b] = e.attrs['data-edge'].split('>');
      expect(e.children.find((c) => c.tag === 'text')!.text).toBe(two(s.innovationPartialCorrelation[at(b)][at(a)]));
    }
  });

  it('curves --svg: the peak `curves --json` reports, the breakpoints `breakpoints --json` lists, the current Δ', async () => {
    const argv = ['curves', GREENHOUSE, '--from', 'soilWater', '--to', 'humidity'];
    const c = JSON.parse((await run([...argv, '--json'])).out[0]) as { intervals: number[]; peak: { interval: number } };
    const b = JSON.parse((await run(['breakpoints', GREENHOUSE, '--samples', '20', '--json'])).out[0]) as { breakpoints: { interval: number }[] };
    const r = await run([...argv, '--interval', '2h', '--samples', '20', '--svg', '-']);
    expect(r.code, r.err.join('\n')).toBe(0);
    const root = parse(r.out[0]);
    expect(Number(all(root).find((e) => e.attrs['data-peak'])!.attrs['data-peak'])).toBe(c.peak.interval);
    const lo = c.intervals[0], hi = c.intervals[c.intervals.length - 1];
    expect(all(root).filter((e) => e.attrs['data-breakpoint']).map((e) => Number(e.attrs['data-breakpoint']))).toEqual(b.breakpoints.map((x) => x.interval).filter((x) => x >= lo && x <= hi));
    expect(Number(all(root).find((e) => e.attrs['data-current'])!.attrs['data-current'])).toBe(120);
  });

  it('bad input gets a one-line reason naming the option and a non-zero exit; nothing is written', async () => {
    const sim = ['simulate', GREENHOUSE, '--until', '1 day'];
    const cases: [string[], RegExp][] = [
      [[...sim, '--svg'], /--svg needs a value/],
      [[...sim, '--svg='], /--out needs a file name/],
      [[...sim, '--plot', 'humidity'], /--plot shapes the figure: give --out FILE too/],
      [[...sim, '--caption'], /--caption shapes the figure/],
      [[...sim, '--svg', 'x.svg', '--plot', 'nowhere'], /--plot: the model has no variable "nowhere"/],
      [[...sim, '--svg', 'x.svg', '--plot', 'sunlight'], /--plot: sunlight is an input/],
      [[...sim, '--svg', 'x.svg', '--plot', 'dust,dust'], /--plot names a variable twice/],
      [['simulate', NO_STUDY, '--until', '1 day', '--svg', 'x.svg', '--caption'], /--caption states the sampling interval .*give --interval/],
      [['simulate', NO_STUDY, '--until', '1 day', '--svg', 'x.svg', '--samples', '10'], /--window and --samples .*give --interval/],
      [[...sim, '--svg', '-', '--csv'], /--svg - prints the SVG instead/],
      [['sampled', GREENHOUSE, '--interval', '1h', '--svg', 'x.svg', '--network', 'both'], /--network must be lagged or same/],
      [['sampled', GREENHOUSE, '--interval', '1h', '--svg', 'x.svg', '--network', 'same', '--standardized'], /--standardized applies to the lagged network/],
      [['sampled', GREENHOUSE, '--interval', '1h', '--standardized'], /--standardized shapes the figure/],
      [['curves', GREENHOUSE, '--from', 'soilWater', '--to', 'humidity', '--interval', '1h'], /--interval shapes the figure/],
    ];
    for (const [argv, reason] of cases) {
      const r = await run(argv);
      expect(r.code, argv.join(' ')).toBe(2);
      const text = r.err.join('\n');
      expect(text).toMatch(reason);
      expect(text.trim().split('\n').length).toBe(1);
      expect(r.files).toEqual({});
    }
  });
});
