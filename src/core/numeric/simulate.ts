/**
 * Simulation of a model's mechanism: the states move by their rates; the
 * derived variables are solved at every evaluation, block by block in the
 * causal order of the mechanism (`orderingAt(model)`), so the stiff
 * integrator sees an ordinary differential equation in the states alone.
 */
import type { Model, VariableId } from '../model/types';
import { orderingAt } from '../ordering/index';
import type { Diagnostic } from '../ordering/types';
import { prepareBlock, solveBlock, type PreparedBlock } from './blocks';
import { linearize } from './linearize';
import { integrateRadau, type IntegrateResult } from './radau';
import { buildNumericSystem, systemError, type NumericSystem } from './system';

export interface SimulateOptions {
  /** End time, in the model's time unit. */
  until: number;
  /** Output spacing (default: until / 200). */
  every?: number;
  rtol?: number;
  atol?: number;
  hold?: Record<VariableId, number>;
  onProgress?(t: number): void;
  shouldStop?(): boolean;
}

export interface SimulationResult {
  ok: boolean;
  times: number[];
  series: Record<VariableId, number[]>;
  diagnostics: Diagnostic[];
  stats?: IntegrateResult['stats'];
}

/** The output grid 0, every, 2·every, …, until (until always included). */
export function outputGrid(until: number, every: number): number[] {
  const out: number[] = [];
  const count = Math.floor(until / every + 1e-9);
  for (let k = 0; k <= count; k++) out.push(k * every);
  if (until - out[out.length - 1] > 1e-9 * until) out.push(until);
  else out[out.length - 1] = until;
  return out;
}

/** Evaluate the algebraic part in causal order for the states in `v`; returns an error message or null. */
export type AlgebraicSolver = (v: Float64Array) => string | null;

export function algebraicSolver(system: NumericSystem, model: Model, hold?: Record<VariableId, number>): AlgebraicSolver {
  const ordering = orderingAt(model, { hold });
  const held = new Set(Object.keys(hold ?? {}));
  const blocks: PreparedBlock[] = [];
  for (const b of ordering.blocks) {
    const eqs = b.equations.filter((e) => !e.startsWith('hold(') && system.byId.get(e)?.kind !== 'rate');
    const vars = b.variables.filter((x) => !held.has(x));
    if (eqs.length === 0 || vars.length === 0) continue;
    blocks.push(prepareBlock(system, { variables: vars, equations: eqs }));
  }
  return (v) => {
    for (const b of blocks) {
      const o = solveBlock(system, b, v, { tol: 1e-13 });
      if (o.status !== 'solved') return `${b.spec.variables.join(', ')} could not be solved from ${b.spec.equations.join(', ')} (${o.status})`;
    }
    return null;
  };
}

/**
 * Simulate from the states' initial values. Example:
 * `simulate(model, { until: 72, every: 1 }).series.stress`.
 */
export function simulate(model: Model, options: SimulateOptions): SimulationResult {
  const system = buildNumericSystem(model);
  const diagnostics: Diagnostic[] = [...system.diagnostics];
  const fail = (message: string, variables: VariableId[] = []): SimulationResult => {
    diagnostics.push({ level: 'error', code: 'simulation-failed', message, variables, equations: [] });
    return { ok: false, times: [], series: {}, diagnostics };
  };
  const err = systemError(system);
  if (err) return fail(err);
  if (!(options.until > 0)) return fail('the simulation needs a positive end time');
  const every = options.every ?? options.until / 200;
  if (!(every > 0)) return fail('the output spacing must be positive');
  if (options.until / every > 1e6) return fail(`the output grid would have more than a million points (${options.until} / ${every})`);
  const ordering = orderingAt(model, { hold: options.hold });
  const bad = ordering.diagnostics.find((d) => d.level === 'error');
  if (bad) return fail(bad.message, bad.variables);
  const held = new Map(Object.entries(options.hold ?? {}));
  const v = system.start.slice();
  for (const [id, x] of held) v[system.slot.get(id)!] = x;
  const states = system.states.filter((s) => !held.has(s));
  const stateSlots = Int32Array.from(states, (s) => system.slot.get(s)!);
  const rates = states.map((s) => system.byId.get(`rate(${s})`)!);
  const solveAlg = algebraicSolver(system, model, options.hold);
  let algError: string | null = null;
  const load = (y: Float64Array) => {
    for (let i = 0; i < stateSlots.length; i++) v[stateSlots[i]] = y[i];
    const e = solveAlg(v);
    if (e && !algError) algError = e;
    return e === null;
  };
  const n = states.length;
  const y0 = Float64Array.from(stateSlots, (s) => v[s]);
  const grid = outputGrid(options.until, every);
  const series: Record<VariableId, number[]> = Object.fromEntries(system.ids.map((id) => [id, [] as number[]]));
  const record = (y: Float64Array) => {
    load(y);
    system.ids.forEach((id, i) => series[id].push(v[i]));
  };
  if (n === 0) {
    for (let k = 0; k < grid.length; k++) record(y0);
    return { ok: algError === null, times: grid, series, diagnostics };
  }
  const stateIndex = new Map(states.map((s, i) => [s, i]));
  const r = integrateRadau(
    {
      n,
      rhs(_t, y, dy) {
        if (!load(y)) { dy.fill(NaN); return; }
        for (let i = 0; i < n; i++) dy[i] = rates[i].value(v);
      },
      jacobian(_t, y, J) {
        load(y);
        const lin = linearize(system, v);
        J.data.fill(0);
        if (!lin.ok) return;
        // The drift is over all states; pick the free ones (held states are constants).
        const all = lin.states;
        for (let i = 0; i < all.length; i++) {
          const a = stateIndex.get(all[i]);
          if (a === undefined) continue;
          for (let j = 0; j < all.length; j++) {
            const b = stateIndex.get(all[j]);
            if (b !== undefined) J.data[a * n + b] = lin.drift.data[i * all.length + j];
          }
        }
      },
    },
    0,
    y0,
    grid,
    { rtol: options.rtol ?? 1e-8, atol: options.atol ?? 1e-10, onProgress: options.onProgress, shouldStop: options.shouldStop },
  );
  for (const y of r.values) record(y);
  if (r.status !== 'done') {
    diagnostics.push({
      level: r.status === 'cancelled' ? 'warning' : 'error',
      code: `simulation-${r.status}`,
      message: `${r.status === 'cancelled' ? 'the simulation was stopped' : 'the simulation failed'}: ${r.message ?? ''}${algError ? `; ${algError}` : ''}`,
      variables: [],
      equations: [],
    });
  }
  return { ok: r.status === 'done', times: r.times, series, diagnostics, stats: r.stats };
}
