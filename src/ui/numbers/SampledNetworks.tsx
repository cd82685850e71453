import { useState } from 'react';
import type { Model } from '../../core/model/types';
import { formatDuration } from '../../core/model/units';
import { DEFAULT_NOISE } from '../../core/study/convert';
import { laggedNetwork, sameIntervalNetwork } from '../../export/charts';
import { svgDocument } from '../../export/svg';
import type { SampledAnswer } from '../../worker/numericApi';
import { fileStem } from '../figureFiles';
import { ExportButtons } from './ExportButtons';
import { studyArgs, type FigureSource } from '../export/printFile';
import type { StudyAt } from '../../export/caption';
import { NetworkDiagram } from './NetworkDiagram';

/** The lagged and same-interval networks a study sampling every Δ would estimate (in expectation). */
export function SampledNetworks({ model, answer, onPick, caption, study }: { model: Model; answer: SampledAnswer; onPick?: (from: string, to: string) => void; caption?: string; study?: StudyAt }) {
  const [standardized, setStandardized] = useState(false);
  const u = model.timeUnit;
  const std = standardized && answer.phiStandardized !== null;
  const lagged = laggedNetwork(model, answer, std, { pickable: onPick !== undefined });
  const same = sameIntervalNetwork(model, answer);
  const file = { heading: true, caption };
  const stem = fileStem(model.name);
  // the export dialog: the same chart through `loopfold sampled … --out` (the study as the caption states it)
  const cli = ['sampled', ...studyArgs(study ?? { interval: answer.interval })];
  const print = (build: FigureSource & { kind: 'chart' }) => ({ modelFile: `${stem}.json`, source: () => build });
  return (
    <>
      <div className="lf-num-row" role="radiogroup" aria-label="Scale of the lagged effects">
        <label><input type="radio" checked={!standardized} onChange={() => setStandardized(false)} /> raw</label>
        <label><input type="radio" checked={standardized} disabled={!answer.phiStandardized} onChange={() => setStandardized(true)} /> standardized (per standard deviation)</label>
      </div>
      <h4>Lagged effects: from one sample to the next ({formatDuration(answer.interval, u)} later)</h4>
      {lagged && (
        <>
          <NetworkDiagram model={model} figure={lagged} onPick={onPick} />
          <ExportButtons what="the lagged network" name={`${stem}-lagged-network${std ? '-standardized' : ''}`} svg={() => svgDocument(laggedNetwork(model, answer, std, file)!)} print={print({ kind: 'chart', build: (o) => laggedNetwork(model, answer, std, o), caption, cli: std ? [...cli, '--standardized'] : cli })} />
        </>
      )}
      <h4>Same-interval links: partial correlations of what changes within one interval</h4>
      <p className="lf-num-note" data-noise-note="true">These depend on each state's process noise (set in the inspector; default {DEFAULT_NOISE}); the lagged effects above do not.</p>
      {same ? (
        <>
          <NetworkDiagram model={model} figure={same} />
          <ExportButtons what="the same-interval network" name={`${stem}-same-interval-network`} svg={() => svgDocument(sameIntervalNetwork(model, answer, file)!)} print={print({ kind: 'chart', build: (o) => sameIntervalNetwork(model, answer, o), caption, cli: [...cli, '--network', 'same'] })} />
        </>
      ) : (
        <p className="lf-num-note">Not defined here: some states receive no noise.</p>
      )}
      <p className="lf-num-note">Solid lines: positive, dashed: negative; thicker lines are stronger. Each figure states the size below which links are left out.{onPick ? ' Click a lagged link to see it against the interval below.' : ''}</p>
      {answer.aliasing.length > 0 && (
        <p className="lf-num-warn" role="alert" data-aliasing="true">
          Sampled effects of this oscillating mode alias and can change sign: it swings with period {formatDuration((2 * Math.PI) / answer.aliasing[0].im, u)}, and sampling slower than every {formatDuration(answer.aliasing[0].limit, u)} cannot follow it.
        </p>
      )}
      {answer.warnings.filter((w) => !w.includes('aliasing')).map((w, i) => <p key={i} className="lf-num-note">{w}</p>)}
    </>
  );
}
