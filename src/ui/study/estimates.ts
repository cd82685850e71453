/**
 * What the "What this schedule estimates" table shows: every entry of Φ that
 * matters (autoregressions and cross-lagged effects), for each main gap
 * between prompts and in the VAR limits, grouped by the variable affected,
 * with the modeller's labels. Pure (no React): tested in Node.
 */
import type { Model, VariableId } from '../../core/model/types';
import { labelOf } from '../../present/index';
import type { StudyDesignReport } from '../../worker/numericApi';

/** Gaps with a smaller share than this are summed in one row of the gap table and get no column of their own. */
export const SMALL_SHARE = 0.005;
/** A cross-lagged effect is shown when it reaches this size for some gap or limit. */
export const SMALL_EFFECT = 0.01;

export interface EffectRow {
  /** Index in `states` of the variable affected (row of Φ) and of the one that affects it (column). */
  to: number;
  from: number;
  /** "itself" for an autoregression, else the label of the variable that affects it. */
  label: string;
  /** Φ's entry for each main gap, in the order of `EffectTable.gaps`. */
  perGap: number[];
  nominal: number;
  pooled: number;
  sameDay: number | null;
}

export interface EffectGroup {
  to: number;
  /** The label of the variable affected. */
  label: string;
  rows: EffectRow[];
}

export interface EffectTable {
  gaps: StudyDesignReport['gaps'];
  groups: EffectGroup[];
  /** Cross-lagged effects left out because they stay under `SMALL_EFFECT` everywhere. */
  hidden: number;
}

/**
 * The entries of Φ to show: for each variable affected (or only `on`), its
 * autoregression, then each cross-lagged effect on it that reaches
 * `SMALL_EFFECT` for some main gap, at the nominal interval or in a limit
 * (all of them with `all`).
 */
export function effectTable(model: Pick<Model, 'variables'>, r: StudyDesignReport, opts: { on?: VariableId; all?: boolean } = {}): EffectTable {
  const gaps = r.gaps.filter((g) => g.share >= SMALL_SHARE);
  const n = r.states.length;
  const groups: EffectGroup[] = [];
  let hidden = 0;
  for (let i = 0; i < n; i++) {
    if (opts.on !== undefined && r.states[i] !== opts.on) continue;
    const rows: EffectRow[] = [];
    const order = [i, ...Array.from({ length: n }, (_, j) => j).filter((j) => j !== i)];
    for (const j of order) {
      const row: EffectRow = {
        to: i,
        from: j,
        label: i === j ? 'itself' : `from ${labelOf(model, r.states[j])}`,
        perGap: gaps.map((g) => g.phi[i][j]),
        nominal: r.nominal[i][j],
        pooled: r.pooled[i][j],
        sameDay: r.sameDay ? r.sameDay[i][j] : null,
      };
      const big = [...row.perGap, row.nominal, row.pooled, row.sameDay ?? 0].some((x) => Math.abs(x) >= SMALL_EFFECT);
      if (i === j || big || opts.all) rows.push(row);
      else hidden++;
    }
    groups.push({ to: i, label: labelOf(model, r.states[i]), rows });
  }
  return { gaps, groups, hidden };
}
