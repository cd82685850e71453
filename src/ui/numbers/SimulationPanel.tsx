import { useEffect, useMemo, useRef, useState } from 'react';
import type { Model, VariableId } from '../../core/model/types';
import { formatDuration, parseDuration } from '../../core/model/units';
import { appNumericClient, type SimulationRun } from '../../worker/numericClient';
import type { Failed, SimulationAnswer } from '../../worker/numericApi';
import { studyCaption, type StudyAt } from '../../export/caption';
import { simulationChart, simulationChartInput } from '../../export/charts';
import { labelOf } from '../../present/index';
import { svgDocument } from '../../export/svg';
import { simulationCsv } from '../../present/csv';
import { ExportButtons } from './ExportButtons';
import { TimeChart } from './TimeChart';
import { isFailed } from './useNumeric';
import { downloadBlob } from '../download';
import { fileStem } from '../figureFiles';

interface Props {
  model: Model;
  hold: Record<VariableId, number> | undefined;
  /** The sampling interval and the study length (window or samples), for the samples drawn and the caption. */
  study: StudyAt;
  /** The slowest finite timescale, for the default duration. */
  slowest: number | undefined;
}

/** Run the mechanism forward from its initial values and show the study's samples over it. */
export function SimulationPanel({ model, hold, study, slowest }: Props) {
  const interval = study.interval;
  const unit = model.timeUnit;
  const fallback = slowest !== undefined && Number.isFinite(slowest) ? formatDuration(3 * slowest, unit) : formatDuration(100, unit);
  const [untilText, setUntilText] = useState<string | null>(null);
  const text = untilText ?? fallback;
  const states = model.variables.filter((v) => v.kind === 'state').map((v) => v.id);
  const [chosen, setChosen] = useState<VariableId[] | null>(null);
  const shown = (chosen ?? states.slice(0, 3)).filter((id) => model.variables.some((v) => v.id === id));
  const [progress, setProgress] = useState<number | null>(null);
  const [answer, setAnswer] = useState<SimulationAnswer | Failed | null>(null);
  const run = useRef<SimulationRun | null>(null);
  useEffect(() => () => run.current?.cancel(), []);

  const parsed = parseDuration(text, unit);
  const [everyText, setEveryText] = useState('');
  const every = everyText.trim() === '' ? null : parseDuration(everyText, unit);
  const spacing = every === null ? (parsed.ok ? parsed.value / 400 : 1) : every.ok ? every.value : NaN;
  const start = async () => {
    if (!parsed.ok || !(spacing > 0)) return;
    const c = await appNumericClient();
    setAnswer(null);
    setProgress(0);
    const r = c.simulate(model, { until: parsed.value, every: spacing, hold }, (f) => setProgress(f));
    run.current = r;
    const a = await r.result;
    if (run.current !== r) return;
    run.current = null;
    setProgress(null);
    if (a) setAnswer(a);
  };

  const done = answer && !isFailed(answer) && answer.times.length > 0 ? answer : null;
  const chart = useMemo(() => (done ? simulationChartInput(model, done, shown, study) : null), [model, done, shown, study]);
  const samples = chart?.samples ?? [];

  return (
    <div className="lf-num-sim">
      <div className="lf-num-row">
        <label>
          Run for{' '}
          <input aria-label="Simulation duration" value={text} onChange={(e) => setUntilText(e.target.value)} size={10} aria-invalid={!parsed.ok} />
        </label>
        <label>
          output every{' '}
          <input aria-label="Output spacing" value={everyText} placeholder={parsed.ok ? formatDuration(parsed.value / 400, unit) : ''} onChange={(e) => setEveryText(e.target.value)} size={8} aria-invalid={every !== null && !every.ok} />
        </label>
        {progress === null ? (
          <button type="button" onClick={() => void start()} disabled={!parsed.ok || !(spacing > 0)}>Simulate</button>
        ) : (
          <>
            <progress max={1} value={progress} aria-label="Simulation progress" />
            <span className="lf-num-note" aria-live="polite">running… {Math.round(progress * 100)}% of the time span</span>
            <button type="button" onClick={() => run.current?.cancel()}>Cancel</button>
          </>
        )}
      </div>
      {!parsed.ok && <p className="lf-num-error">{parsed.message}</p>}
      {every !== null && !every.ok && <p className="lf-num-error">Output spacing: {every.message}</p>}
      <fieldset className="lf-num-choose">
        <legend>Plot</legend>
        {model.variables.filter((v) => v.kind !== 'input').map((v) => (
          <label key={v.id}>
            <input
              type="checkbox"
              checked={shown.includes(v.id)}
              onChange={(e) => setChosen(e.target.checked ? [...shown, v.id] : shown.filter((x) => x !== v.id))}
            />{' '}
            {labelOf(model, v.id)}
          </label>
        ))}
      </fieldset>
      {answer && isFailed(answer) && <p className="lf-num-error" role="alert">The simulation failed: {answer.reason}</p>}
      {answer && !isFailed(answer) && answer.cancelled && <p className="lf-num-note" role="status">The simulation was stopped{answer.times.length > 0 ? '; the part computed so far is shown' : ''}.</p>}
      {answer && !isFailed(answer) &&
        answer.diagnostics.filter((d) => d.level === 'error').map((d, i) => <p key={i} className="lf-num-error">{d.message}</p>)}
      {done && chart && shown.length > 0 && (
        <>
          <TimeChart {...chart} />
          <ExportButtons
            what="the simulation chart"
            name={`${fileStem(model.name)}-simulation`}
            svg={() => svgDocument(simulationChart(model, done, shown, study, { heading: true, caption: studyCaption(model, study) }))}
            print={{ modelFile: `${fileStem(model.name)}.json`, source: () => ({ kind: 'chart', build: (o) => simulationChart(model, done, shown, study, o), caption: studyCaption(model, study) }) }}
          />
          <p className="lf-num-note">
            {interval === undefined
              ? 'Set a sampling interval to see the samples a study would take.'
              : samples === null
                ? `A study sampling every ${formatDuration(interval, unit)} would take too many samples in this run to draw.`
                : samples.length === 1
                  ? `Open circle: the one sample a study taking one every ${formatDuration(interval, unit)} would see in this run.`
                  : `Open circles: the ${samples.length} samples a study taking one every ${formatDuration(interval, unit)} would see in this run.`}
          </p>
          <button
            type="button"
            onClick={() => downloadBlob(new Blob([simulationCsv(done.times, done.series, model.variables.map((v) => ({ id: v.id, name: labelOf(model, v.id) })), unit)], { type: 'text/csv' }), `${model.name.replace(/[^\w-]+/g, '-')}-simulation.csv`)}
          >
            Save the run as CSV
          </button>
        </>
      )}
    </div>
  );
}
