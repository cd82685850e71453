/**
 * "What this schedule estimates": the gaps between consecutive prompts of a
 * daily-window schedule and their shares, Φ for each gap, and what a
 * first-order VAR over consecutive prompts estimates in the limit (all pairs,
 * same-day pairs only) beside Φ at the nominal interval. Computed by the core
 * (`studyDesign`) on the numeric worker's lane.
 */
import type { Model, VariableId } from '../../core/model/types';
import { formatDuration } from '../../core/model/units';
import { labelOf, weightText } from '../../present/index';
import type { SessionStudy } from '../../state/session';
import type { StudyDesignReport } from '../../worker/numericApi';
import { isFailed, useNumeric } from '../numbers/useNumeric';

/** Gaps with a smaller share than this are summed in one row. */
const SMALL_SHARE = 0.005;

const pct = (x: number) => (x >= 0.995 ? `${Math.round(x * 100)} %` : x >= 0.01 ? `${(x * 100).toFixed(1)} %` : `${(x * 100).toFixed(2)} %`);

export function DesignEstimates({ model, s }: { model: Model; s: SessionStudy }) {
  const daily = s.study.schedule.kind === 'daily-window';
  const asked = useNumeric<{ ok: true; report: StudyDesignReport }>(daily ? (c) => c.ask('design', model, s.study) : null, [model, s.study, daily]);
  return (
    <section className="lf-study-section lf-study-estimates" aria-labelledby="lf-study-estimates" data-status={asked.status}>
      <h3 id="lf-study-estimates">What this schedule estimates</h3>
      {!daily ? (
        <p className="lf-hint">Prompts at one spacing, day and night: consecutive prompts are one interval apart{s.study.missedPrompts ? ' (longer after a missed prompt)' : ''}, and a VAR over them estimates Φ at that interval. Choose prompts in a daily window to see what a night gap does.</p>
      ) : asked.status !== 'done' ? (
        <p className="lf-hint" role="status">Working out the gaps of this schedule…</p>
      ) : isFailed(asked.answer) ? (
        <p className="lf-field-error">{asked.answer.reason}</p>
      ) : (
        <Report model={model} r={asked.answer.report} />
      )}
    </section>
  );
}

function Report({ model, r }: { model: Model; r: StudyDesignReport }) {
  const u = r.timeUnit;
  const label = (id: VariableId) => labelOf(model, id);
  const main = r.gaps.filter((g) => g.share >= SMALL_SHARE);
  const rest = r.gaps.filter((g) => g.share < SMALL_SHARE);
  const restShare = rest.reduce((a, g) => a + g.share, 0);
  const where = (g: StudyDesignReport['gaps'][number]) => (g.sameDayShare >= g.share * 0.999 ? 'within the day' : g.sameDayShare <= g.share * 0.001 ? 'overnight' : 'both');
  const n = r.states.length;
  // the entries of Φ shown in the limits: every autoregression, then each cross-lagged effect that reaches 0.01 anywhere
  const entries: { to: number; from: number }[] = [];
  for (let i = 0; i < n; i++) entries.push({ to: i, from: i });
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      if (i === j) continue;
      const big = [r.nominal, r.pooled, r.sameDay].some((m) => m && Math.abs(m[i][j]) >= 0.01);
      if (big) entries.push({ to: i, from: j });
    }
  return (
    <div className="lf-study-report">
      {r.shrinkage.length > 0 ? (
        <div className="lf-study-effect" role="note" aria-label="The night-gap effect">
          {r.shrinkage.map((t) => <p key={t}>{t}</p>)}
        </div>
      ) : (
        <p className="lf-hint">Every gap is one interval or shorter: the VAR over consecutive prompts estimates about Φ at the interval.</p>
      )}
      <h4>Gaps between consecutive answered prompts, and Φ for each</h4>
      <p className="lf-hint">Autoregressions (the diagonal of Φ over the gap). A missed prompt makes a gap of two parts or more.</p>
      <div className="lf-study-scroll">
        <table className="lf-num-table lf-study-gaps">
          <thead>
            <tr>
              <th scope="col">Gap</th>
              <th scope="col">Share</th>
              <th scope="col">Where</th>
              {r.states.map((id) => <th scope="col" key={id}>{label(id)}</th>)}
            </tr>
          </thead>
          <tbody>
            {main.map((g) => (
              <tr key={`${g.gap}|${g.spread}`} data-gap={g.gap}>
                <th scope="row">{formatDuration(g.gap, u)}{g.spread > 0 && <span className="lf-study-spread"> ± {formatDuration(g.spread, u)}</span>}</th>
                <td>{pct(g.share)}</td>
                <td>{where(g)}</td>
                {r.states.map((id, i) => <td key={id}>{weightText(g.phi[i][i])}</td>)}
              </tr>
            ))}
            {rest.length > 0 && (
              <tr>
                <th scope="row">{rest.length} longer gaps (up to {formatDuration(rest[rest.length - 1].gap, u)})</th>
                <td>{pct(restShare)}</td>
                <td colSpan={1 + n}>after several missed prompts in a row</td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
      <h4>What a VAR(1) over consecutive prompts estimates, beside Φ at {formatDuration(r.interval, u)}</h4>
      <p className="lf-hint">In the limit of many prompts: over all consecutive pairs Σ w·Φ(gap), weighted by the shares above; over same-day pairs only, the night left out.</p>
      <div className="lf-study-scroll">
        <table className="lf-num-table lf-study-limits">
          <thead>
            <tr>
              <th scope="col">Effect</th>
              <th scope="col">Φ at {formatDuration(r.interval, u)}</th>
              <th scope="col">All pairs</th>
              <th scope="col">Same-day pairs</th>
            </tr>
          </thead>
          <tbody>
            {entries.map(({ to, from }) => (
              <tr key={`${from}>${to}`} data-entry={`${r.states[from]}>${r.states[to]}`}>
                <th scope="row">{to === from ? `${label(r.states[to])} (itself)` : `${label(r.states[from])} → ${label(r.states[to])}`}</th>
                <td>{weightText(r.nominal[to][from])}</td>
                <td>{weightText(r.pooled[to][from])}</td>
                <td>{r.sameDay ? weightText(r.sameDay[to][from]) : '—'}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {r.warnings.length > 0 && <ul className="lf-study-warnings">{r.warnings.map((w) => <li key={w}>{w}</li>)}</ul>}
    </div>
  );
}
