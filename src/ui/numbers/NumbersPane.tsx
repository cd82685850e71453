/**
 * The Numbers pane: equilibrium, simulation, timescales, the sampled model at
 * the current interval, the strength of one link against the interval, and
 * an interval advisor. Loaded on demand (React.lazy) with its own worker.
 */
import { useState } from 'react';
import type { Model, VariableId } from '../../core/model/types';
import { formatDuration } from '../../core/model/units';
import { useAnalysis, useAnalysisState } from '../../state/analysis';
import { useValidatedModel } from '../../state/document';
import { useSessionStudy } from '../../state/session';
import type { CurveAnswer, SampledAnswer, TimescalesAnswer } from '../../worker/numericApi';
import { EquilibriumTable } from './EquilibriumTable';
import { IntervalAdvisor } from './IntervalAdvisor';
import { LinkCurveChart } from './LinkCurveChart';
import { UseInterval } from '../study/UseInterval';
import { SampledNetworks } from './SampledNetworks';
import { SimulationPanel } from './SimulationPanel';
import { TimescalesTable } from './TimescalesTable';
import { studyCaption, type StudyAt } from '../../export/caption';
import { labelOf } from '../../present/index';
import { fileStem } from '../figureFiles';
import { linkCurveChart } from '../../export/charts';
import { svgDocument } from '../../export/svg';
import { ExportButtons } from './ExportButtons';
import { studyArgs } from '../export/printFile';
import { isFailed, useNumeric } from './useNumeric';
import { GrowthNotice, useGrowingStates } from '../diagnostics/GrowthNotice';
import './numbers.css';

function Section({ title, children, id }: { title: string; children: React.ReactNode; id: string }) {
  return (
    <section className="lf-num-section" aria-labelledby={`lf-num-${id}`} data-section={id}>
      <h3 id={`lf-num-${id}`}>{title}</h3>
      {children}
    </section>
  );
}

export default function NumbersPane() {
  const model = useValidatedModel();
  if (!model) return <p className="lf-numbers lf-num-note">The numbers appear once the model has no problems left (see the Edit tab).</p>;
  return <NumbersOf model={model} />;
}

function NumbersOf({ model }: { model: Model }) {
  const design = useAnalysisState((s) => s.design);
  const breakpoints = useAnalysis()?.breakpoints ?? [];
  // The interval as the user set it (the analysis design follows it band by band).
  const session = useSessionStudy();
  const exact = session ? session.design : design;
  const interval = exact.interval;
  const hold = design.hold;
  const study: StudyAt = { interval, window: exact.window, samples: exact.samples };
  const u = model.timeUnit;
  const ts = useNumeric<TimescalesAnswer>((c) => c.ask('timescales', model, interval), [model, interval]);
  const sampled = useNumeric<SampledAnswer>(interval !== undefined ? (c) => c.ask('sampled', model, interval) : null, [model, interval]);
  const tsOk = ts.status === 'done' && !isFailed(ts.answer) ? ts.answer : null;
  const states = tsOk?.report.states ?? model.variables.filter((v) => v.kind === 'state').map((v) => v.id);
  const growing = useGrowingStates();
  const [pair, setPair] = useState<{ from: VariableId | null; to: VariableId | null }>({ from: null, to: null });
  const slowest = tsOk ? Math.max(...tsOk.report.modes.map((m) => m.time).filter(Number.isFinite)) : undefined;
  return (
    <div className="lf-numbers">
      <p className="lf-num-intro">
        Numbers computed from the model as written: they are model-based expectations, not measurements.
        {interval !== undefined ? ` Sampling interval Δ: every ${formatDuration(interval, u)}.` : ' No sampling interval is set: the mechanism itself.'}
      </p>
      <Section id="equilibrium" title="Balance point (equilibrium)">
        {growing ? (
          <GrowthNotice what="this balance as a rest point (the values below only make every rate zero; the states leave them)" />
        ) : (
          <p className="lf-num-note">Where every state comes to rest when the inputs stay as they are.</p>
        )}
        <EquilibriumTable model={model} hold={hold} />
      </Section>
      <Section id="simulation" title="Simulation from the initial values">
        <SimulationPanel model={model} hold={hold} study={study} slowest={slowest !== undefined && Number.isFinite(slowest) && slowest > 0 ? slowest : undefined} />
      </Section>
      <Section id="timescales" title="How fast each state responds">
        <GrowthNotice what="a settling time for the states it carries" />
        {ts.status !== 'done' ? <p className="lf-num-wait">Working out the timescales…</p> : isFailed(ts.answer) ? <p className="lf-num-error">{ts.answer.reason}</p> : <TimescalesTable model={model} answer={ts.answer} />}
      </Section>
      <Section id="sampled" title="What a study sampling every Δ would see">
        {interval === undefined ? (
          <p className="lf-num-note">Set a sampling interval to see the networks a study at that interval would estimate.</p>
        ) : sampled.status !== 'done' ? (
          <p className="lf-num-wait">Working out the sampled model…</p>
        ) : isFailed(sampled.answer) ? (
          <p className="lf-num-error">{sampled.answer.reason}</p>
        ) : (
          <SampledNetworks
            model={model}
            answer={sampled.answer}
            caption={studyCaption(model, study)}
            study={study}
            onPick={(from, to) => {
              setPair({ from, to });
              document.getElementById('lf-num-curve')?.scrollIntoView({ block: 'start' });
            }}
          />
        )}
      </Section>
      <Section id="curve" title="One link against the interval">
        <LinkPicker model={model} states={states} breakpoints={breakpoints.map((b) => b.interval)} study={study} pair={pair} setPair={setPair} />
      </Section>
      <Section id="advisor" title="Which interval to choose">
        <IntervalAdvisor model={model} states={states} reach={tsOk?.reach} />
      </Section>
    </div>
  );
}

type Pair = { from: VariableId | null; to: VariableId | null };

function LinkPicker({ model, states, breakpoints, study, pair, setPair }: { model: Model; states: VariableId[]; breakpoints: number[]; study: StudyAt; pair: Pair; setPair: (p: Pair) => void }) {
  const current = study.interval;
  const { from, to } = pair;
  const f = from && states.includes(from) ? from : states[0];
  const t = to && states.includes(to) && to !== f ? to : states.find((s) => s !== f);
  const curve = useNumeric<CurveAnswer>(f && t ? (c) => c.ask('curve', model, f, t) : null, [model, f, t]);
  if (states.length < 2) return <p className="lf-num-note">Lagged links run between states; this model has fewer than two.</p>;
  return (
    <>
      <div className="lf-num-row">
        <label>
          From{' '}
          <select aria-label="Link from" value={f} onChange={(e) => setPair({ from: e.target.value, to })}>
            {states.map((s) => <option key={s} value={s}>{labelOf(model, s)}</option>)}
          </select>
        </label>
        <label>
          to{' '}
          <select aria-label="Link to" value={t} onChange={(e) => setPair({ from: f ?? null, to: e.target.value })}>
            {states.filter((s) => s !== f).map((s) => <option key={s} value={s}>{labelOf(model, s)}</option>)}
          </select>
        </label>
      </div>
      {curve.status !== 'done' ? (
        <p className="lf-num-wait">Working out the curve…</p>
      ) : isFailed(curve.answer) ? (
        <p className="lf-num-error">{curve.answer.reason}</p>
      ) : (
        <>
          <LinkCurveChart model={model} curve={curve.answer.curve} breakpoints={breakpoints} current={current} />
          {curve.answer.curve.peaks.length > 0 && (
            <p className="lf-num-row" aria-label="Intervals where the link peaks">
              {curve.answer.curve.peaks.length === 1 ? 'Its peak:' : 'Its peaks:'}{' '}
              {curve.answer.curve.peaks.map((p) => <UseInterval key={p.interval} value={p.interval} unit={model.timeUnit} what={`where ${labelOf(model, f!)} → ${labelOf(model, t!)} peaks`} />)}
            </p>
          )}
          <ExportButtons
            what="the link chart"
            name={`${fileStem(model.name)}-${f}-to-${t}`}
            svg={() => svgDocument(linkCurveChart({ model, curve: (curve.answer as CurveAnswer).curve, breakpoints, current }, { heading: true, caption: studyCaption(model, study) }))}
            print={{ modelFile: `${fileStem(model.name)}.json`, source: () => ({ kind: 'chart', build: (o) => linkCurveChart({ model, curve: (curve.answer as CurveAnswer).curve, breakpoints, current }, o), caption: studyCaption(model, study), cli: ['curves', '--from', f!, '--to', t!, ...studyArgs(study)] }) }}
          />
          <p className="lf-num-note">
            How strongly {labelOf(model, f!)} now moves {labelOf(model, t!)} one sampling interval later, for every interval. Too short an interval leaves no time for the effect; too long lets it fade.
          </p>
        </>
      )}
    </>
  );
}
