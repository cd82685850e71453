/**
 * Graph files of the integer-step mode ("loopfold-graph", version 1), and the
 * causal-step graph read off a Loopfold model.
 *
 *   {
 *     "format": "loopfold-graph", "version": 1,
 *     "name": "Daily diary, weekly census",            (optional)
 *     "variables": ["sleep", "stress", "mood"],        (names, or a count: 3 → "1", "2", "3")
 *     "directed": [["sleep", "stress"], ["mood", "mood"]],   (names or 1-based numbers; [x, x] a self-loop)
 *     "bidirected": [["stress", "mood"]],               (measured graphs only; optional)
 *     "selfLoops": true,                                (optional: every variable carries over)
 *     "rate": 2                                         (optional: the rate a measured graph was seen at)
 *   }
 *
 * The file is data only: nothing in it is run.
 */
import { z } from 'zod';
import { formatPath, parseModelText } from '../model/schema';
import type { Model, VariableId } from '../model/types';
import { bit, has, MAX_GRAPH_VARIABLES, type MeasuredGraph } from './graph';

export interface GraphIssue {
  /** JSON path such as `directed[2][0]`. */
  path: string;
  message: string;
}

export interface GraphFile {
  name?: string;
  graph: MeasuredGraph;
  rate?: number;
  /** Where the graph came from: a graph file, or a model's integrating links. */
  source: 'graph' | 'model';
  /** Remarks on how a model was read (folded derived variables, left-out links). */
  notes: string[];
}

export type GraphParse = { ok: true; file: GraphFile } | { ok: false; issues: GraphIssue[] };

const NAME = /^[^\s].{0,63}$/u;
const endpoint = z.union([z.string({ error: 'must be a variable name or a number' }), z.number({ error: 'must be a variable name or a number' })], { error: 'must be a variable name or a 1-based number' });
const edge = z.tuple([endpoint, endpoint], { error: 'must be a pair [from, to]' });

const graphSchema = z.strictObject(
  {
    format: z.literal('loopfold-graph', { error: 'must be "loopfold-graph"' }),
    version: z.literal(1, { error: 'must be 1 (the only version so far)' }),
    name: z.string({ error: 'must be text' }).max(200, { error: 'must be at most 200 characters long' }).optional(),
    description: z.string({ error: 'must be text' }).max(4000, { error: 'must be at most 4000 characters long' }).optional(),
    variables: z.union(
      [
        z.number({ error: 'must be a whole number of variables or a list of names' }).int({ error: 'must be a whole number' }).min(1, { error: 'needs at least 1 variable' }).max(MAX_GRAPH_VARIABLES, { error: `must be at most ${MAX_GRAPH_VARIABLES}` }),
        z.array(z.string({ error: 'must be text' }).regex(NAME, { error: 'must be a name of 1 to 64 characters that does not start with a space' }), { error: 'must be a list of names' })
          .min(1, { error: 'needs at least 1 variable' }).max(MAX_GRAPH_VARIABLES, { error: `has more than ${MAX_GRAPH_VARIABLES} variables` }),
      ],
      { error: 'must be a number of variables or a list of names' },
    ),
    directed: z.array(edge, { error: 'must be a list of [from, to] pairs' }).max(MAX_GRAPH_VARIABLES * MAX_GRAPH_VARIABLES, { error: 'has too many edges' }).default([]),
    bidirected: z.array(edge, { error: 'must be a list of [a, b] pairs' }).max(MAX_GRAPH_VARIABLES * MAX_GRAPH_VARIABLES, { error: 'has too many edges' }).default([]),
    selfLoops: z.boolean({ error: 'must be true or false' }).optional(),
    rate: z.number({ error: 'must be a whole number ≥ 1' }).int({ error: 'must be a whole number ≥ 1' }).min(1, { error: 'must be a whole number ≥ 1' }).max(1000, { error: 'must be at most 1000' }).optional(),
  },
  { error: 'must be an object describing a graph' },
);

/** Read a graph file (or a Loopfold model: its integrating links) from text. Never throws. */
export function parseGraphText(text: string): GraphParse {
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (e) {
    return { ok: false, issues: [{ path: '(file)', message: `is not valid JSON: ${(e as Error).message}` }] };
  }
  if (data && typeof data === 'object' && (data as { format?: unknown }).format === 'loopfold-model') {
    const r = parseModelText(text);
    if (!r.ok) return { ok: false, issues: r.issues };
    return graphFromModelFile(r.model);
  }
  return parseGraphData(data);
}

function graphFromModelFile(model: Model): GraphParse {
  const r = stepGraphOfModel(model);
  if (r.graph.names.length === 0) return { ok: false, issues: [{ path: 'variables', message: 'the model has no state: a causal-step graph is read from its states and integrating links' }] };
  if (r.graph.names.length > MAX_GRAPH_VARIABLES) return { ok: false, issues: [{ path: 'variables', message: `the model has ${r.graph.names.length} states and inputs that act on them; the integer-step mode takes at most ${MAX_GRAPH_VARIABLES}` }] };
  return { ok: true, file: { name: model.name, graph: r.graph, source: 'model', notes: r.notes } };
}

/** Validate parsed JSON as a graph file. */
export function parseGraphData(data: unknown): GraphParse {
  const r = graphSchema.safeParse(data);
  if (!r.success)
    return {
      ok: false,
      issues: r.error.issues.map((i) => {
        let message = i.message;
        if (i.code === 'unrecognized_keys') message = `has unknown field${i.keys.length > 1 ? 's' : ''} ${i.keys.map((k) => `"${k}"`).join(', ')}`;
        if ((i.code === 'invalid_type' || i.code === 'invalid_union') && i.input === undefined) message = 'is missing';
        return { path: formatPath(i.path), message };
      }),
    };
  const f = r.data;
  const names = typeof f.variables === 'number' ? Array.from({ length: f.variables }, (_, i) => String(i + 1)) : f.variables;
  const issues: GraphIssue[] = [];
  const seen = new Map<string, number>();
  names.forEach((nm, i) => {
    if (seen.has(nm)) issues.push({ path: `variables[${i}]`, message: `"${nm}" is listed twice (also at variables[${seen.get(nm)}])` });
    seen.set(nm, i);
  });
  const shown = names.length <= 8 ? names.join(', ') : `${names.slice(0, 8).join(', ')}, …`;
  const indexOf = (x: string | number, path: string): number => {
    if (typeof x === 'number') {
      if (Number.isInteger(x) && x >= 1 && x <= names.length) return x - 1;
      issues.push({ path, message: `${x} is not a variable number: numbers run from 1 to ${names.length}` });
      return -1;
    }
    const k = seen.get(x);
    if (k === undefined) {
      // A number written as text ("3") when the variables are only counted.
      if (typeof f.variables === 'number' && /^\d+$/.test(x)) return indexOf(Number(x), path);
      issues.push({ path, message: `no variable "${x}" (the variables are ${shown})` });
      return -1;
    }
    return k;
  };
  const n = names.length;
  const directed = new Array<number>(n).fill(0);
  const bidirected = new Array<number>(n).fill(0);
  f.directed.forEach(([a, b], k) => {
    const i = indexOf(a, `directed[${k}][0]`), j = indexOf(b, `directed[${k}][1]`);
    if (i >= 0 && j >= 0) directed[i] = (directed[i] | bit(j)) >>> 0;
  });
  f.bidirected.forEach(([a, b], k) => {
    const i = indexOf(a, `bidirected[${k}][0]`), j = indexOf(b, `bidirected[${k}][1]`);
    if (i < 0 || j < 0) return;
    if (i === j) { issues.push({ path: `bidirected[${k}]`, message: `"${names[i]}" ↔ "${names[i]}": a bidirected edge joins two different variables` }); return; }
    bidirected[i] = (bidirected[i] | bit(j)) >>> 0;
    bidirected[j] = (bidirected[j] | bit(i)) >>> 0;
  });
  if (f.selfLoops) for (let i = 0; i < n; i++) directed[i] = (directed[i] | bit(i)) >>> 0;
  if (issues.length > 0) return { ok: false, issues };
  return { ok: true, file: { name: f.name, graph: { names, directed, bidirected }, rate: f.rate, source: 'graph', notes: [] } };
}

/** A measured or causal-step graph as a graph file (names as given, edges by name). */
export function graphFileText(g: MeasuredGraph, extra: { name?: string; rate?: number } = {}): string {
  const n = g.names.length;
  const directed: [string, string][] = [];
  const bidirected: [string, string][] = [];
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      if (has(g.directed[i], j)) directed.push([g.names[i], g.names[j]]);
      if (j > i && has(g.bidirected[i], j)) bidirected.push([g.names[i], g.names[j]]);
    }
  const out: Record<string, unknown> = { format: 'loopfold-graph', version: 1 };
  if (extra.name) out.name = extra.name;
  out.variables = [...g.names];
  out.directed = directed;
  if (bidirected.length) out.bidirected = bidirected;
  if (extra.rate !== undefined) out.rate = extra.rate;
  return JSON.stringify(out, null, 2) + '\n';
}

/**
 * The causal-step graph of a model: its states (each with a self-loop: a state
 * carries over from step to step) and the inputs that act on them; an edge
 * x → s for each integrating link into state s, where a derived source is
 * replaced by the states and inputs it follows through instantaneous links
 * (within one step it passes their values on at once).
 */
export function stepGraphOfModel(model: Model): { graph: MeasuredGraph; ids: VariableId[]; notes: string[] } {
  const byId = new Map(model.variables.map((v) => [v.id, v]));
  const notes: string[] = [];
  const memo = new Map<VariableId, Set<VariableId>>();
  const sourcesOf = (id: VariableId, visiting: Set<VariableId>): Set<VariableId> => {
    const v = byId.get(id);
    if (!v) return new Set();
    if (v.kind !== 'derived') return new Set([id]);
    const hit = memo.get(id);
    if (hit) return hit;
    if (visiting.has(id)) return new Set();
    visiting.add(id);
    const out = new Set<VariableId>();
    for (const l of model.links) if (l.to === id && l.kind === 'instantaneous') for (const s of sourcesOf(l.from, visiting)) out.add(s);
    visiting.delete(id);
    memo.set(id, out);
    return out;
  };
  const edges: [VariableId, VariableId][] = [];
  const folded = new Set<string>();
  for (const l of model.links) {
    if (l.kind !== 'integrating' || byId.get(l.to)?.kind !== 'state') continue;
    if (byId.get(l.from)?.kind === 'derived') folded.add(l.from);
    for (const s of sourcesOf(l.from, new Set())) edges.push([s, l.to]);
  }
  const used = new Set(edges.map(([a]) => a));
  const ids = model.variables.filter((v) => v.kind === 'state' || (v.kind === 'input' && used.has(v.id))).map((v) => v.id);
  const index = new Map(ids.map((id, i) => [id, i]));
  const names = ids.map((id) => byId.get(id)?.label?.trim() || id);
  const directed = new Array<number>(ids.length).fill(0);
  ids.forEach((id, i) => { if (byId.get(id)?.kind === 'state') directed[i] = bit(i); });
  for (const [a, b] of edges) {
    const i = index.get(a), j = index.get(b);
    if (i !== undefined && j !== undefined && i < MAX_GRAPH_VARIABLES && j < MAX_GRAPH_VARIABLES) directed[i] = (directed[i] | bit(j)) >>> 0;
  }
  notes.push('each state carries over from one step to the next (a self-loop); each integrating link into a state is a one-step effect');
  if (folded.size) notes.push(`derived ${folded.size === 1 ? 'variable' : 'variables'} ${[...folded].map((id) => byId.get(id)?.label?.trim() || id).join(', ')} pass on within the step the states and inputs ${folded.size === 1 ? 'it follows' : 'they follow'}`);
  const inputs = ids.filter((id) => byId.get(id)?.kind === 'input');
  if (inputs.length) notes.push(`${inputs.length === 1 ? 'input' : 'inputs'} ${inputs.map((id) => byId.get(id)?.label?.trim() || id).join(', ')} ${inputs.length === 1 ? 'acts' : 'act'} on states without a self-loop of ${inputs.length === 1 ? 'its' : 'their'} own (set from outside at each step)`);
  return { graph: { names, directed: directed.map((x) => x >>> 0), bidirected: new Array<number>(ids.length).fill(0) }, ids, notes };
}
