/**
 * "What this schedule estimates": the gaps between consecutive prompts of a
 * daily-window schedule and their shares, Φ for each gap, and what a
 * first-order VAR over consecutive prompts estimates in the limit (all pairs,
 * same-day pairs only) beside Φ at the nominal interval. Computed by the core
 * (`studyDesign`) on the numeric worker's lane.
 */
import { useState } from 'react';
import type { Model, VariableId } from '../../core/model/types';
import { formatDuration } from '../../core/model/units';
import { fixedText, labelOf, weightText } from '../../present/index';
import type { SessionStudy } from '../../state/session';
import type { StudyDesignReport } from '../../worker/numericApi';
import { isFailed, useNumeric } from '../numbers/useNumeric';
import { effectTable, SMALL_EFFECT, SMALL_SHARE } from './estimates';


const pct = (x: number) => (x >= 0.995 ? `${Math.round(x * 100)} %` : x >= 0.01 ? `${fixedText(x * 100, 1, { ascii: true })} %` : `${fixedText(x * 100, 2, { ascii: true })} %`);

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
  const [on, setOn] = useState<VariableId | ''>('');
  const [all, setAll] = useState(false);
  const main = r.gaps.filter((g) => g.share >= SMALL_SHARE);
  const rest = r.gaps.filter((g) => g.share < SMALL_SHARE);
  const restShare = rest.reduce((a, g) => a + g.share, 0);
  const where = (g: StudyDesignReport['gaps'][number]) => (g.sameDayShare >= g.share * 0.999 ? 'within the day' : g.sameDayShare <= g.share * 0.001 ? 'overnight' : 'both');
  const table = effectTable(model, r, { on: on === '' ? undefined : on, all });
  const cols = table.gaps.length + 4;
  return (
    <div className="lf-study-report">
      {r.shrinkage.length > 0 ? (
        <div className="lf-study-effect" role="note" aria-label="The night-gap effect">
          {r.shrinkage.map((t) => <p key={t}>{t}</p>)}
        </div>
      ) : (
        <p className="lf-hint">Every gap is one interval or shorter: the VAR over consecutive prompts estimates about Φ at the interval.</p>
      )}
      <h4>Gaps between consecutive answered prompts</h4>
      <p className="lf-hint">A missed prompt makes a gap of two parts or more.{main.some((g) => g.spread > 0) ? ' With prompts at random times in their parts of the window a gap varies: its range is under it (gaps near the middle are the most common).' : ''}</p>
      <div className="lf-study-scroll" tabIndex={0} role="region" aria-label="Gaps between consecutive answered prompts (scrolls sideways)">
        <table className="lf-num-table lf-study-gaps">
          <thead>
            <tr>
              <th scope="col">Gap</th>
              <th scope="col">Share of pairs</th>
              <th scope="col">Where</th>
            </tr>
          </thead>
          <tbody>
            {main.map((g) => (
              <tr key={`${g.gap}|${g.spread}`} data-gap={g.gap}>
                <th scope="row">{formatDuration(g.gap, u)}{g.spread > 0 && <span className="lf-study-spread"> {g.gap - g.spread > 1e-9 * g.gap ? `${formatDuration(g.gap - g.spread, u)} to ` : 'up to '}{formatDuration(g.gap + g.spread, u)}</span>}</th>
                <td>{pct(g.share)}</td>
                <td>{where(g)}</td>
              </tr>
            ))}
            {rest.length > 0 && (
              <tr>
                <th scope="row" className="lf-study-rest">{rest.length} longer gaps (up to {formatDuration(rest[rest.length - 1].gap, u)})</th>
                <td>{pct(restShare)}</td>
                <td className="lf-study-where">after several missed prompts in a row</td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
      <h4>Φ for each gap, and what a VAR(1) over consecutive prompts estimates, beside Φ at {formatDuration(r.interval, u)}</h4>
      <p className="lf-hint">Each row is one lagged effect on a variable (row of Φ), from itself or another (column of Φ). The VAR limits hold for many prompts: all consecutive pairs give Σ w·Φ(gap), weighted by the shares above; same-day pairs only leave the night out.</p>
      <div className="lf-study-effects-controls">
        {r.states.length > 2 && (
          <label>
            Effects on{' '}
            <select aria-label="Show the effects on" value={on} onChange={(e) => setOn(e.target.value)}>
              <option value="">every variable</option>
              {r.states.map((id) => <option key={id} value={id}>{labelOf(model, id)}</option>)}
            </select>
          </label>
        )}
        <label>
          <input type="checkbox" checked={all} onChange={(e) => setAll(e.target.checked)} /> also effects under {SMALL_EFFECT} everywhere
        </label>
      </div>
      <div className="lf-study-scroll" tabIndex={0} role="region" aria-label="Lagged effects per gap and in the VAR limits (scrolls sideways)">
        <table className="lf-num-table lf-study-limits" aria-label="Lagged effects per gap and in the VAR limits">
          <thead>
            <tr>
              <th scope="col" className="lf-study-sticky">Effect</th>
              {table.gaps.map((g) => (
                <th scope="col" key={`${g.gap}|${g.spread}`} className="lf-study-gapcol" title={`${pct(g.share)} of consecutive pairs, ${where(g)}`}>
                  over {formatDuration(g.gap, u)}<span className="lf-study-spread">{pct(g.share)}, {where(g) === 'overnight' ? 'night' : where(g) === 'within the day' ? 'day' : 'both'}</span>
                </th>
              ))}
              <th scope="col" className="lf-study-limitcol">Φ at {formatDuration(r.interval, u)}</th>
              <th scope="col">All pairs</th>
              <th scope="col">Same-day pairs</th>
            </tr>
          </thead>
          {table.groups.map((g) => (
            <tbody key={g.to} data-on={r.states[g.to]}>
              <tr className="lf-study-group">
                <th scope="colgroup" colSpan={cols} className="lf-study-sticky">On {g.label}</th>
              </tr>
              {g.rows.map((row) => (
                <tr key={row.from} data-entry={`${r.states[row.from]}>${r.states[row.to]}`}>
                  <th scope="row" className="lf-study-sticky" aria-label={row.to === row.from ? `${g.label} (itself)` : `${labelOf(model, r.states[row.from])} → ${g.label}`}>{row.label}</th>
                  {row.perGap.map((x, k) => <td key={k}>{weightText(x)}</td>)}
                  <td className="lf-study-limitcol">{weightText(row.nominal)}</td>
                  <td>{weightText(row.pooled)}</td>
                  <td>{row.sameDay === null ? '—' : weightText(row.sameDay)}</td>
                </tr>
              ))}
            </tbody>
          ))}
        </table>
      </div>
      {table.hidden > 0 && <p className="lf-hint">{table.hidden} cross-lagged {table.hidden === 1 ? 'effect stays' : 'effects stay'} under {SMALL_EFFECT} for every gap and limit and {table.hidden === 1 ? 'is' : 'are'} left out.</p>}
      {r.warnings.length > 0 && <ul className="lf-study-warnings">{r.warnings.map((w) => <li key={w}>{w}</li>)}</ul>}
    </div>
  );
}
