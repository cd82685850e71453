/** The data at a glance: one person's series, the intervals between occasions by kind, missing cells per variable. */
import { useId, useMemo, useState } from 'react';
import type { Model } from '../../core/model/types';
import type { Panel } from '../../core/data/panel';
import { intervalHistogram, missingness, personSeries, type IntervalHistogram, type Missingness } from '../../core/data/overview';
import { intervalHistogramChart, missingnessChart, personSeriesChart } from '../../export/dataCharts';
import { svgDocument } from '../../export/svg';
import type { El } from '../../export/scene';
import { elToReact } from '../elReact';
import { fileStem } from '../figureFiles';
import { ExportButtons } from '../numbers/ExportButtons';

function Figure({ el, file, what, name }: { el: El; file: () => El; what: string; name: string }) {
  return (
    <>
      <div className="lf-data-figure">{elToReact(el)}</div>
      <ExportButtons what={what} name={name} svg={() => svgDocument(file())} />
    </>
  );
}

/** `computed`: the histogram and missing cells the data worker computed with the import (else computed here). */
export function DataOverview({ model, panel, computed }: { model: Model; panel: Panel; computed?: { histogram: IntervalHistogram; missing: Missingness[] } }) {
  const id = useId();
  const [person, setPerson] = useState(0);
  const p = Math.min(person, panel.persons.length - 1);
  const hist = useMemo(() => computed?.histogram ?? intervalHistogram(panel), [panel, computed]);
  const miss = useMemo(() => computed?.missing ?? missingness(panel), [panel, computed]);
  const series = useMemo(() => (p >= 0 ? personSeries(panel, p) : null), [panel, p]);
  const stem = fileStem(model.name);
  const caption = 'Imported data, as kept on this machine.';
  return (
    <section className="lf-data-section" aria-labelledby={`${id}-h`} data-testid="data-overview">
      <h3 id={`${id}-h`}>Overview</h3>
      <h4>Intervals between occasions</h4>
      <p className="lf-data-note">How the kinds are told apart: {hist.rule}.</p>
      <Figure el={intervalHistogramChart(hist, panel.timeUnit)} file={() => intervalHistogramChart(hist, panel.timeUnit, { heading: true, caption })} what="the interval histogram" name={`${stem}-data-intervals`} />
      <h4>Missing cells</h4>
      <Figure el={missingnessChart(model, miss)} file={() => missingnessChart(model, miss, { heading: true, caption })} what="the missing cells" name={`${stem}-data-missing`} />
      {series && (
        <>
          <h4>One person's series</h4>
          <label>
            Person{' '}
            <select value={p} onChange={(e) => setPerson(Number(e.target.value))}>
              {panel.persons.map((q, i) => <option key={q.id} value={i}>{q.id} ({q.time.length} occasions)</option>)}
            </select>
          </label>
          <Figure el={personSeriesChart(model, series, panel.timeUnit)} file={() => personSeriesChart(model, series, panel.timeUnit, { heading: true, caption })} what={`the series of person ${series.id}`} name={`${stem}-data-person-${series.id}`} />
        </>
      )}
    </section>
  );
}
