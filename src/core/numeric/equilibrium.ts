/**
 * Equilibrium of a model: every state settled (its rate equation becomes the
 * balance 0 = g), solved block by block in the causal order of the
 * equilibrium model (`orderingAt(model, { settleAll: true })`).
 */
import type { Model, VariableId } from '../model/types';
import { orderingAt } from '../ordering/index';
import type { Diagnostic } from '../ordering/types';
import { blockRank, prepareBlock, solveBlock, type BlockOutcome } from './blocks';
import { buildNumericSystem, systemError, type NumericSystem } from './system';
import { precisionText } from '../../present/numbers';

export interface EquilibriumResult {
  ok: boolean;
  values: Record<VariableId, number>;
  /** The full value array (slot order of the system), for linearization. */
  point: Float64Array;
  blocks: { variables: VariableId[]; equations: string[]; outcome: BlockOutcome }[];
  diagnostics: Diagnostic[];
  system: NumericSystem;
}

function list(xs: readonly string[]): string {
  return xs.length <= 1 ? xs.join('') : `${xs.slice(0, -1).join(', ')} and ${xs[xs.length - 1]}`;
}

/**
 * Solve for the equilibrium. Inputs stay at their values; states that cannot
 * settle keep their initial values. Example: `solveEquilibrium(model).values.mood`.
 */
export function solveEquilibrium(model: Model, options: { hold?: Record<VariableId, number> } = {}): EquilibriumResult {
  const system = buildNumericSystem(model);
  const diagnostics: Diagnostic[] = [...system.diagnostics];
  const point = system.start.slice();
  for (const [id, x] of Object.entries(options.hold ?? {})) { const s = system.slot.get(id); if (s !== undefined) point[s] = x; }
  const blocks: EquilibriumResult['blocks'] = [];
  const done = (ok: boolean): EquilibriumResult => ({
    ok,
    values: Object.fromEntries(system.ids.map((id, i) => [id, point[i]])),
    point,
    blocks,
    diagnostics,
    system,
  });
  if (systemError(system)) return done(false);
  const ordering = orderingAt(model, { settleAll: true, hold: options.hold });
  const held = new Set(Object.keys(options.hold ?? {}));
  let ok = true;
  for (const d of ordering.diagnostics)
    if (d.level === 'error') {
      diagnostics.push(d);
      ok = false;
    }
  for (const block of ordering.blocks) {
    if (block.equations.length === 0) continue;
    const eqs = block.equations.filter((e) => !e.startsWith('hold('));
    const vars = block.variables.filter((x) => !held.has(x));
    if (eqs.length === 0) continue;
    const where = `${list(vars)} (equation${eqs.length > 1 ? 's' : ''} ${list(eqs)})`;
    if (block.determination !== 'well') {
      ok = false;
      diagnostics.push({
        level: 'error',
        code: 'equilibrium-block-not-determined',
        message: `the equilibrium of ${where} cannot be computed: the block is ${block.determination}-determined (${eqs.length} equation${eqs.length > 1 ? 's' : ''} for ${block.variables.length} variable${block.variables.length > 1 ? 's' : ''}); their values are left at their starting values`,
        variables: block.variables,
        equations: eqs,
      });
      continue;
    }
    if (vars.length === 0) continue;
    const prepared = prepareBlock(system, { variables: vars, equations: eqs });
    const saved = Float64Array.from(prepared.slots, (s) => point[s]);
    // Start from the starting values, then from 1, −1 and 10 (common practice for a globalised Newton).
    let outcome: BlockOutcome | null = null;
    let bestX = saved;
    for (const guess of [null, 1, -1, 10]) {
      prepared.slots.forEach((sl, j) => (point[sl] = guess === null ? saved[j] : guess));
      const o = solveBlock(system, prepared, point);
      if (!outcome || o.status === 'solved' || o.residual < outcome.residual) {
        outcome = o;
        bestX = Float64Array.from(prepared.slots, (sl) => point[sl]);
      }
      if (o.status === 'solved' || prepared.explicit) break;
    }
    prepared.slots.forEach((sl, j) => (point[sl] = bestX[j]));
    if (!outcome) continue;
    for (let j = 0; j < prepared.slots.length; j++) if (!Number.isFinite(point[prepared.slots[j]])) point[prepared.slots[j]] = saved[j];
    if (outcome.status === 'solved' && !prepared.explicit) {
      const r = blockRank(system, prepared, point);
      outcome = { ...outcome, rank: r.rank, dependent: r.dependent };
      if (r.dependent.length > 0)
        diagnostics.push({
          level: 'warning',
          code: 'dependent-equations',
          message: `the equations ${list(r.dependent)} are dependent at the equilibrium (rank ${r.rank} for ${r.full} variables ${list(block.variables)}): they do not fix these values, only one of a family of equilibria was found — often a conservation law; replace one of these equations by the total (e.g. the sum of the states equals its starting value)`,
          variables: block.variables,
          equations: r.dependent,
        });
    }
    if (outcome.status !== 'solved') {
      ok = false;
      const why: Record<BlockOutcome['status'], string> = {
        solved: '',
        'no-convergence': 'Newton iterations did not converge from any starting point; there may be no equilibrium',
        singular: 'the block is singular (its equations do not fix these variables) and no exact solution was found',
        'not-finite': 'the equations give values that are not finite numbers (division by zero, log of a negative number…)',
        'missing-equation': 'an equation of the block could not be read',
      };
      diagnostics.push({
        level: 'error',
        code: `equilibrium-${outcome.status}`,
        message: `no equilibrium found for ${where}: ${why[outcome.status]} (remaining residual ${precisionText(outcome.residual, 3)}); values shown are the closest found`,
        variables: block.variables,
        equations: eqs,
      });
    }
    blocks.push({ variables: block.variables, equations: eqs, outcome });
  }
  return done(ok);
}
