/**
 * The Study tab: the study the modeller plans, edited field by field. Each
 * field stores on Enter or when it is left, through the session owner (so
 * undo, autosave, files and share links carry it); text that does not check
 * out stays in the field with a message naming the field.
 */
import type { Model, Schedule } from '../../core/model/types';
import { formatDuration } from '../../core/model/units';
import { studyIssues } from '../../core/model/schema';
import { studyInterval } from '../../core/study/convert';
import { useValidatedModel } from '../../state/document';
import { editStudy, useSessionStudy, type SessionStudy } from '../../state/session';
import { CheckedField } from '../inspector/fields';
import { clockText, fieldName, lengthAs, lengthBy, missedShare, missedText, patchProblem, scheduleOfKind, schedulePatch, wholeNumber, type LengthBy, type Patch } from './edit';
import { useState } from 'react';
import { DesignEstimates } from './DesignEstimates';
import { CompareDesigns } from './CompareDesigns';
import './study.css';

const KINDS: { kind: Schedule['kind']; text: string }[] = [
  { kind: 'daily-window', text: 'in a daily window' },
  { kind: 'fixed', text: 'at a fixed interval' },
  { kind: 'daily', text: 'once a day' },
  { kind: 'weekly', text: 'once a week' },
];

export default function StudyPane() {
  const model = useValidatedModel();
  const s = useSessionStudy();
  if (!model || !s) return <p className="lf-study-pane lf-hint">The study can be planned once the model has no problems left (see the Edit tab).</p>;
  return <StudyPaneFor model={model} s={s} />;
}

function StudyPaneFor({ model, s }: { model: Model; s: SessionStudy }) {
  const [comparing, setComparing] = useState(false);
  const study = s.study;
  const unit = model.timeUnit;
  const sch = study.schedule;
  /** A text field: its text → a patch; the core checks the patched study; only a sound one is stored. */
  const field = (toPatch: (text: string) => Patch) => ({
    check: (text: string) => {
      const p = toPatch(text);
      return p.ok ? patchProblem(study, p.patch, model) : p.message;
    },
    commit: (text: string) => {
      const p = toPatch(text);
      if (p.ok) editStudy(p.patch);
    },
  });
  const setSchedule = (next: Schedule) => {
    const patch = schedulePatch(next, unit);
    if (!patchProblem(study, patch, model)) editStudy(patch);
  };
  const by = lengthBy(study);
  const interval = studyInterval(study, unit);
  const warnings = studyIssues(study, model).warnings;
  return (
    <div className="lf-study-pane" aria-label="The study">
      <p className="lf-hint">The study you plan: when prompts come, for how long, for how many persons. Every view reads it; it is saved with the model and in share links, and undo covers it.</p>
      <section className="lf-study-section" aria-labelledby="lf-study-schedule">
        <h3 id="lf-study-schedule">Schedule</h3>
        <div className="lf-field">
          <label htmlFor="lf-study-kind">Prompts come</label>
          <select id="lf-study-kind" value={sch.kind} onChange={(e) => setSchedule(scheduleOfKind(e.target.value as Schedule['kind'], sch))}>
            {KINDS.map((k) => <option key={k.kind} value={k.kind}>{k.text}</option>)}
          </select>
        </div>
        {sch.kind === 'daily-window' && (
          <div className="lf-study-window">
            <CheckedField
              label="Prompts per day"
              value={String(sch.promptsPerDay)}
              {...field((t) => {
                const n = wholeNumber(t, 'Prompts per day', 1);
                return n.ok ? { ok: true, patch: schedulePatch({ ...sch, promptsPerDay: n.value }, unit) } : n;
              })}
            />
            <CheckedField label="First prompt from" value={sch.from} placeholder="09:00" {...field((t) => ({ ok: true, patch: schedulePatch({ ...sch, from: clockText(t) }, unit) }))} />
            <CheckedField label="Last prompt by" value={sch.to} placeholder="21:00" {...field((t) => ({ ok: true, patch: schedulePatch({ ...sch, to: clockText(t) }, unit) }))} />
            <div className="lf-field">
              <label htmlFor="lf-study-timing">Timing</label>
              <select id="lf-study-timing" value={sch.timing} onChange={(e) => setSchedule({ ...sch, timing: e.target.value as 'fixed' | 'stratified-random' })}>
                <option value="stratified-random">stratified random</option>
                <option value="fixed">evenly spaced</option>
              </select>
              <p className="lf-hint">{sch.timing === 'stratified-random' ? 'One prompt at a random time in each equal part of the window.' : 'The same times every day, first and last at the ends of the window.'}</p>
            </div>
          </div>
        )}
        <CheckedField
          label="Interval"
          value={String(study.interval)}
          hint={
            interval === undefined
              ? null
              : sch.kind === 'fixed'
                ? `every ${formatDuration(interval, unit)}, day and night: the interval the ordering reads`
                : `every ${formatDuration(interval, unit)}: the nominal interval the ordering reads (set by the schedule; type another to override)`
          }
          {...field((t) => ({ ok: true, patch: { interval: t.trim() } }))}
        />
      </section>

      <section className="lf-study-section" aria-labelledby="lf-study-size">
        <h3 id="lf-study-size">Length and persons</h3>
        <div className="lf-field">
          <label htmlFor="lf-study-by">Study length given as</label>
          <select id="lf-study-by" value={by} onChange={(e) => {
            const length = lengthAs(study, unit, e.target.value as LengthBy);
            if (!patchProblem(study, { length }, model)) editStudy({ length });
          }}>
            <option value="duration">a duration</option>
            <option value="samples">a number of prompts</option>
          </select>
        </div>
        {by === 'duration' ? (
          <CheckedField label="Study duration" value={String(study.length)} placeholder="14 days" {...field((t) => ({ ok: true, patch: { length: t.trim() } }))} />
        ) : (
          <CheckedField
            label="Number of prompts"
            value={String(study.length)}
            {...field((t) => {
              const n = wholeNumber(t, 'Number of prompts', 2);
              return n.ok ? { ok: true, patch: { length: n.value } } : n;
            })}
          />
        )}
        <CheckedField
          label="Persons"
          value={String(study.persons ?? 1)}
          hint="Each person follows the same schedule (one if none is given)."
          {...field((t) => {
            const n = wholeNumber(t, 'Persons', 1);
            return n.ok ? { ok: true, patch: { persons: n.value } } : n;
          })}
        />
        <CheckedField
          label="Missed prompts (%)"
          value={missedText(study.missedPrompts)}
          placeholder="0"
          hint="The share of planned prompts that go unanswered, each independently; a missed prompt makes a longer gap."
          {...field((t) => {
            const m = missedShare(t);
            return m.ok ? { ok: true, patch: { missedPrompts: m.value } } : m;
          })}
        />
      </section>
      {warnings.length > 0 && (
        <ul className="lf-study-warnings" aria-label="Study warnings">
          {warnings.map((w) => <li key={w.path + w.message}>{fieldName(w.path)} {w.message}</li>)}
        </ul>
      )}
      <p>
        <button type="button" onClick={() => setComparing(true)}>Compare designs…</button>
      </p>
      <DesignEstimates model={model} s={s} />
      {comparing && <CompareDesigns model={model} s={s} onClose={() => setComparing(false)} />}
    </div>
  );
}
