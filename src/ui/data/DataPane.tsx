/**
 * The Data pane: open a CSV/TSV file (or the demo diary), map its columns
 * to persons, times and the model's variables, import it, and read what was
 * kept and refused; then the overview and the fits held against the sketch.
 * The data stay in this browser (IndexedDB beside the model); the file is
 * read, parsed and fitted in the data worker (src/worker/dataClient.ts): this
 * thread hands it the File as it is and never reads it.
 */
import { useEffect, useState } from 'react';
import type { Model } from '../../core/model/types';
import type { ColumnMapping } from '../../core/data/import';
import { useValidatedModel } from '../../state/document';
import { forgetDataset, keepDataset, restoreDataset, useDataset } from '../../state/dataset';
import { appDataClient } from '../../worker/dataClient';
import type { HeaderAnswer } from '../../worker/dataApi';
import { ColumnMapper, mappingProblem } from './ColumnMapper';
import { ImportSummaryView } from './ImportSummary';
import { DataOverview } from './DataOverview';
import { DataFits } from './DataFits';
import { DataCoint } from './DataCoint';
import './data.css';

export const DEMO_FILE = 'sleep-stress-diary.csv';
/** Further demo files (invented): weekly stock and orders of three warehouses; a wide survey of 40 lakes in four waves unequal years apart. */
export const DEMO_FILES: { file: string; button: string; what: string }[] = [
  { file: DEMO_FILE, button: 'Demo diary', what: 'The demo diary' },
  { file: 'warehouse-weeks.csv', button: 'Demo warehouse weeks', what: 'The demo warehouse weeks' },
  { file: 'lake-survey-waves.csv', button: 'Demo lake survey', what: 'The demo lake survey' },
];

export default function DataPane() {
  const model = useValidatedModel();
  if (!model) return <p className="lf-data lf-data-note">The Data pane opens once the model has no problems left (see the Edit tab).</p>;
  return <DataOf model={model} />;
}

interface Source {
  fileName: string;
  /** The file itself (read by the data worker, never on this thread), or the text of a data set kept before. */
  content: string | Blob;
  delimiter?: string;
}

function delimiterFor(name: string): string | undefined {
  return /\.tsv$/i.test(name) ? '\t' : undefined;
}

function DataOf({ model }: { model: Model }) {
  const dataset = useDataset((s) => s.dataset);
  const restored = useDataset((s) => s.restored);
  const storageError = useDataset((s) => s.storageError);
  const [source, setSource] = useState<Source | null>(null);
  const [header, setHeader] = useState<HeaderAnswer | null>(null);
  const [mapping, setMapping] = useState<ColumnMapping | null>(null);
  const [error, setError] = useState<string | null>(null);
  /** What keeps the mapping from being imported, shown beside the Import button until the mapping changes. */
  const [mapError, setMapError] = useState<string | null>(null);
  const [busy, setBusy] = useState<string | null>(null);

  useEffect(() => { void restoreDataset(); }, []);

  const read = async (src: Source, keepMapping?: ColumnMapping) => {
    setError(null);
    setMapError(null);
    setBusy('Reading the header…');
    const c = await appDataClient();
    const h = await c.header(src.content, model.variables, model.timeUnit, src.delimiter);
    setBusy(null);
    if (!h) return;
    if (!h.ok) { setError(`${src.fileName}: ${h.reason}`); return; }
    setSource(src);
    setHeader(h);
    setMapping(keepMapping ?? h.suggestion);
  };

  // A kept data set reopens with its mapping, ready to be changed and imported again.
  useEffect(() => {
    if (dataset && !source) void read({ fileName: dataset.fileName, content: dataset.text, delimiter: dataset.delimiter }, dataset.mapping);
  }, [dataset]); // eslint-disable-line react-hooks/exhaustive-deps

  const openFile = async (file: File) => {
    try {
      // The File goes to the data worker as it is (by reference): the worker reads and parses it.
      await read({ fileName: file.name, content: file, delimiter: delimiterFor(file.name) });
    } catch (e) {
      setError(`${file.name} could not be read: ${(e as Error).message ?? String(e)}`);
    }
  };
  const openDemo = async (demo: (typeof DEMO_FILES)[number]) => {
    setError(null);
    try {
      const r = await fetch(`${import.meta.env.BASE_URL}demo/${demo.file}`);
      if (!r.ok) throw new Error(`the server answered ${r.status}`);
      await read({ fileName: demo.file, content: await r.blob() });
    } catch (e) {
      setError(`${demo.what} could not be loaded: ${(e as Error).message ?? String(e)}`);
    }
  };
  const runImport = async () => {
    if (!source || !mapping) return;
    const problem = mappingProblem(mapping);
    if (problem) { setMapError(problem); return; }
    setMapError(null);
    setError(null);
    setBusy('Importing…');
    const c = await appDataClient();
    const r = typeof source.content === 'string' ? await c.importData(source.content, mapping, source.delimiter) : await c.importBlob(source.content, mapping, source.delimiter);
    setBusy(null);
    if (!r) return;
    if (!r.ok) { setError(`${source.fileName}: ${r.reason}`); return; }
    const { ok: _ok, ...result } = r;
    void _ok;
    await keepDataset({ fileName: source.fileName, text: source.content, delimiter: source.delimiter, mapping, result, modelName: model.name, importedAt: Date.now() });
  };
  const forget = async () => {
    await forgetDataset();
    setSource(null); setHeader(null); setMapping(null);
  };

  const panel = dataset?.result.panel ?? null;
  return (
    <div className="lf-data" aria-label="Data">
      <p className="lf-data-privacy" data-testid="data-privacy">
        The data stay on this machine: they are kept in this browser beside the model, never put into share links or model files, and never sent anywhere.
      </p>
      {model.caution && <p className="lf-data-note">{model.caution}</p>}
      <div className="lf-data-row">
        <label className="lf-data-file">Open a CSV or TSV file <input type="file" accept=".csv,.tsv,.txt,text/csv,text/tab-separated-values" onChange={(e) => { const f = e.target.files?.[0]; if (f) void openFile(f); e.target.value = ''; }} /></label>
        {DEMO_FILES.map((d) => <button key={d.file} type="button" onClick={() => void openDemo(d)}>{d.button}</button>)}
        {dataset && <button type="button" onClick={() => void forget()}>Remove the data from this browser</button>}
      </div>
      {!restored && <p className="lf-data-note">Looking for data kept in this browser…</p>}
      {busy && <p className="lf-data-note" role="status">{busy}</p>}
      {error && <p className="lf-data-error" role="alert">{error}</p>}
      {storageError && <p className="lf-data-error" role="alert">{storageError}</p>}
      {dataset && dataset.modelName !== model.name && (
        <p className="lf-data-warn">These data were mapped to the model “{dataset.modelName}”; check the mapping against this model and import again.</p>
      )}
      {source && header && mapping && (
        <ColumnMapper model={model} fileName={source.fileName} header={header} mapping={mapping} onChange={(m) => { setMapping(m); setMapError(null); }} problem={mapError} onImport={() => void runImport()} busy={busy !== null} />
      )}
      {dataset && <ImportSummaryView dataset={dataset} />}
      {panel && <DataOverview model={model} panel={panel} computed={dataset?.result.overview} />}
      {panel && <DataFits model={model} panel={panel} />}
      {dataset && header && source?.fileName === dataset.fileName && dataset.mapping.format === 'long' && <DataCoint key={`${dataset.fileName}:${dataset.importedAt}`} model={model} dataset={dataset} fields={header.fields} />}
    </div>
  );
}
