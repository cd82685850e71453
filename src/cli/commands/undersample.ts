/** Commands `undersample` (the measured graph at rate u) and `unsample` (the causal-step graphs behind a measured graph). */
import {
  causalGraphsFor, edgeList, explainMeasured, has, inverseLimit, measuredGraph, nearestMeasuredGraphs, parseGraphText,
  type GraphFile, type InverseAnswer, type MeasuredGraph, type NearestAnswer,
} from '../../core/undersample/index';
import { measuredGraphFigure } from '../../export/undersample';
import { svgTarget, writeSvg } from '../figure';
import { PRINT_OPTIONS } from '../output/write';
import { CliError, type CliArgs, type CliCommand, type CliIO } from './types';
import { readInput } from '../load';
import { fixedText } from '../../present/index';

/** Default rates tried by `unsample` when neither the command nor the file names one. */
export const DEFAULT_MAX_RATE = 5;

function loadGraph(args: CliArgs, io: CliIO): GraphFile {
  const path = args.positional[0];
  if (!path) throw new CliError('name a graph file, e.g. loopfold undersample graph.json --rate 2 (a Loopfold model file works too)', 2);
  const text = readInput(path, io);
  const r = parseGraphText(text);
  if (!r.ok) throw new CliError(`${path} is not a valid graph: ${r.issues.map((i) => `${i.path} ${i.message}`).join('; ')}`);
  return r.file;
}

function rateOption(args: CliArgs, name: string): number | undefined {
  const v = args.options[name];
  if (v === undefined) return undefined;
  const u = Number(v);
  if (v === true || !Number.isInteger(u) || u < 1 || u > 1000) throw new CliError(`--${name} must be a whole number from 1 to 1000, e.g. --${name} 2`, 2);
  return u;
}

const pairs = (xs: [string, string][], arrow: string) => xs.map(([a, b]) => `${a} ${arrow} ${b}`).join(', ') || 'none';

function causalEdges(g: { names: readonly string[] }, rows: readonly number[]): [string, string][] {
  const out: [string, string][] = [];
  for (let i = 0; i < rows.length; i++) for (let j = 0; j < rows.length; j++) if (has(rows[i], j)) out.push([g.names[i], g.names[j]]);
  return out;
}

function nearestJson(h: MeasuredGraph, near: NearestAnswer) {
  const nm = (p: [number, number][]) => p.map(([i, j]) => [h.names[i], h.names[j]]);
  return {
    distance: near.distance,
    complete: near.complete,
    graphs: near.graphs.map((g) => ({
      rate: g.rate,
      rates: g.rates,
      ...edgeList(g.measured),
      added: { directed: nm(g.added.directed), bidirected: nm(g.added.bidirected) },
      removed: { directed: nm(g.removed.directed), bidirected: nm(g.removed.bidirected) },
      example: causalEdges(h, g.example),
    })),
  };
}

function summary(h: MeasuredGraph, rates: number[], r: InverseAnswer): string[] {
  const where = rates.length === 1 ? `at u = ${rates[0]}` : `at any u ≤ ${rates[rates.length - 1]}`;
  const lines: string[] = [];
  if (r.count === 0) {
    lines.push(r.complete ? `No causal graph ${where} gives this measured graph.` : `No causal graph ${where} was found before the search stopped (it did not finish).`);
    lines.push('This is common for graphs estimated from data: one edge missed or added by a test is enough. The nearest measured graphs that a causal graph does give:');
    return lines;
  }
  lines.push(`${r.count}${r.complete ? '' : ' or more'} causal-step graph${r.count === 1 ? '' : 's'} ${where} give${r.count === 1 ? 's' : ''} this measured graph (a model-based reading of the graph, not a finding).`);
  for (const b of r.byRate) {
    if (b.count === 0) continue;
    lines.push(`  u = ${b.rate}: ${b.count} graph${b.count === 1 ? '' : 's'}; in every one: ${pairs(causalEdges(h, b.always), '→')}; in some only: ${pairs(causalEdges(h, b.sometimes.map((x, i) => x & ~b.always[i])), '→')}`);
  }
  return lines;
}

export const undersampleCommands: CliCommand[] = [
  {
    name: 'undersample',
    summary: 'the graph seen when an integer-step process is measured every u-th step (directed and bidirected edges, with reasons)',
    usage: 'GRAPH.json --rate U [--json] [--out FILE.svg|.png|.pdf [print options: --width, --font-size, --palette, --background, --no-title, --caption-text, --dpi, --text paths]]',
    options: { rate: true, json: false, svg: true, ...PRINT_OPTIONS },
    async run(args, io) {
      const file = loadGraph(args, io);
      const u = rateOption(args, 'rate');
      if (u === undefined) throw new CliError('--rate is required, e.g. --rate 2 (measured every second step)', 2);
      const g = file.graph;
      const bi = g.bidirected.findIndex((r) => r !== 0);
      if (bi >= 0) throw new CliError(`the file has bidirected edges (at ${g.names[bi]}): a causal-step graph has none; to find the causal graphs behind a measured graph use "loopfold unsample"`, 2);
      const svg = svgTarget(args, []);
      if (svg === '-' && args.options.json) throw new CliError('--svg - prints the SVG instead of the graph: leave out --json, or write the SVG to a file', 2);
      const h = measuredGraph(g, u);
      const reasons = explainMeasured(g, u);
      if (svg !== undefined) {
        const text = args.options['caption-text'];
        await writeSvg(svg, measuredGraphFigure({ causal: g, rate: u, reasons }, { heading: args.options['no-title'] !== true, caption: typeof text === 'string' ? text : 'A model-based reading: the edges an analysis of data taken at this rate would show, if the causal-step graph is right.' }), io, args);
        if (svg === '-') return 0;
      }
      const edges = edgeList(h);
      if (args.options.json) {
        io.out(JSON.stringify({ variables: g.names, rate: u, ...edges, reasons: reasons.map((r) => r.text) }, null, 2));
        return 0;
      }
      const lines = [`${file.name ?? 'Graph'}: measured every ${u === 1 ? 'step' : `${u} steps`} (u = ${u}; model-based)`, ''];
      for (const note of file.notes) lines.push(`  (${note})`);
      if (file.notes.length) lines.push('');
      lines.push(`directed:   ${pairs(edges.directed, '→')}`, `bidirected: ${pairs(edges.bidirected, '↔')}`, '');
      for (const r of reasons) lines.push(`  ${r.text}`);
      io.out(lines.join('\n'));
      return 0;
    },
  },
  {
    name: 'unsample',
    summary: 'every causal-step graph that gives a measured graph at rate u (or any u ≤ U); the nearest consistent graphs when none does',
    usage: 'GRAPH.json [--rate U | --max-rate U] [--method search|solver] [--limit N] [--json]',
    options: { rate: true, 'max-rate': true, method: true, limit: true, json: false },
    run(args, io) {
      const file = loadGraph(args, io);
      const h = file.graph;
      const rate = rateOption(args, 'rate');
      const maxRate = rateOption(args, 'max-rate');
      if (rate !== undefined && maxRate !== undefined) throw new CliError('give --rate or --max-rate, not both', 2);
      const rates = rate !== undefined ? [rate] : maxRate !== undefined ? Array.from({ length: maxRate }, (_, i) => i + 1) : file.rate !== undefined ? [file.rate] : Array.from({ length: DEFAULT_MAX_RATE }, (_, i) => i + 1);
      const m = args.options.method;
      if (m !== undefined && m !== 'search' && m !== 'solver') throw new CliError('--method must be "search" (up to 5 variables) or "solver" (up to 10)', 2);
      const lv = args.options.limit;
      const limit = lv === undefined ? 1000 : Number(lv);
      if (lv === true || !Number.isInteger(limit) || limit < 0) throw new CliError('--limit must be a whole number ≥ 0 (the most solutions listed; all are counted)', 2);
      const why = inverseLimit(h, m as 'search' | 'solver' | undefined);
      if (why) throw new CliError(why);
      let last = Date.now();
      const r = causalGraphsFor(h, rates, {
        method: m as 'search' | 'solver' | undefined,
        maxSolutions: limit,
        onProgress: (p) => {
          const now = Date.now();
          if (now - last < 2000) return;
          last = now;
          io.err(`searching u = ${p.rate} (${p.rateIndex + 1} of ${p.rates}): ${fixedText(100 * p.fraction, 1, { ascii: true })} % of the space, ${p.nodes} nodes, ${p.count} found`);
        },
      });
      const near = r.count === 0 ? nearestMeasuredGraphs(h, rates) : null;
      if (args.options.json) {
        io.out(JSON.stringify({
          variables: h.names,
          rates,
          solutions: r.solutions.map((s) => ({ rate: s.rate, directed: causalEdges(h, s.directed) })),
          count: r.count,
          complete: r.complete,
          truncated: r.truncated,
          cost: r.byRate.map((b) => ({ rate: b.rate, method: b.method, count: b.count, nodes: b.nodes, ms: b.ms, complete: b.complete })),
          ...(near ? { consistent: false, nearest: nearestJson(h, near) } : { consistent: true }),
        }, null, 2));
        return 0;
      }
      const lines = [`${file.name ?? 'Measured graph'}: directed ${pairs(edgeList(h).directed, '→')}; bidirected ${pairs(edgeList(h).bidirected, '↔')}`, ''];
      if (rate === undefined && maxRate === undefined && file.rate === undefined) lines.push(`(no rate given: trying every u ≤ ${DEFAULT_MAX_RATE}; use --rate or --max-rate)`, '');
      lines.push(...summary(h, rates, r));
      if (near) {
        for (const g of near.graphs) {
          const nm = (p: [number, number][], a: string) => p.map(([i, j]) => `${h.names[i]} ${a} ${h.names[j]}`);
          const changes = [...nm(g.added.directed, '→').map((x) => `+ ${x}`), ...nm(g.added.bidirected, '↔').map((x) => `+ ${x}`), ...nm(g.removed.directed, '→').map((x) => `− ${x}`), ...nm(g.removed.bidirected, '↔').map((x) => `− ${x}`)];
          lines.push(`  u = ${g.rates.join(', ')}, ${g.distance} edge${g.distance === 1 ? '' : 's'} changed: ${changes.join(', ')} (e.g. from causal graph ${pairs(causalEdges(h, g.example), '→')})`);
        }
        if (!near.complete) lines.push('  (the search for nearer graphs stopped at its budget: a nearer one may exist)');
      } else {
        const shown = r.solutions.slice(0, 20);
        lines.push('');
        for (const s of shown) lines.push(`  u = ${s.rate}: ${pairs(causalEdges(h, s.directed), '→')}`);
        if (r.count > shown.length) lines.push(`  … and ${r.count - shown.length} more (--json lists up to --limit)`);
      }
      lines.push('', `cost: ${r.byRate.map((b) => `u = ${b.rate} ${b.method} ${b.nodes} nodes ${b.ms} ms`).join('; ')}`);
      io.out(lines.join('\n'));
      return 0;
    },
  },
];
