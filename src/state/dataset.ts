/**
 * The imported data set of the Data pane: the file (so the mapping
 * can be changed and the file imported again), the column mapping, what the
 * importer kept and refused, and the panel. Kept in this browser's
 * IndexedDB beside the autosaved model (a store of its own), reopened with
 * it; never written into model files or share links, never sent anywhere.
 */
import { del, get, set, type UseStore } from 'idb-keyval';
import { lazyStore } from './persist';
import { createStore } from 'zustand/vanilla';
import { useStore } from 'zustand';
import type { ColumnMapping, ImportResult } from '../core/data/import';
import type { IntervalHistogram, Missingness } from '../core/data/overview';

export const DATASET_VERSION = 1;
const KEY = 'current';

export interface Dataset {
  version: typeof DATASET_VERSION;
  fileName: string;
  /** The file as opened: a File/Blob (IndexedDB keeps it as it is; only the data worker reads it) or its text. */
  text: string | Blob;
  delimiter?: string;
  mapping: ColumnMapping;
  /** What the importer kept and refused; `overview` as the data worker computed it beside the import. */
  result: ImportResult & { overview?: { histogram: IntervalHistogram; missing: Missingness[] } };
  /** The model the data were mapped to (its name), to say so when another model is open. */
  modelName: string;
  importedAt: number;
}

const store = lazyStore('loopfold-data', 'datasets');

export async function saveDataset(d: Omit<Dataset, 'version'>, s?: UseStore): Promise<void> {
  await set(KEY, { version: DATASET_VERSION, ...d }, store(s));
}

/** The kept data set, or null when there is none or it is of another version. */
export async function loadDataset(s?: UseStore): Promise<Dataset | null> {
  const raw = (await get(KEY, store(s))) as Partial<Dataset> | undefined;
  if (!raw || raw.version !== DATASET_VERSION || !(typeof raw.text === 'string' || (typeof Blob !== 'undefined' && raw.text instanceof Blob)) || !raw.result || !raw.mapping) return null;
  return raw as Dataset;
}

export async function clearDataset(s?: UseStore): Promise<void> {
  await del(KEY, store(s));
}

export interface DatasetState {
  dataset: Dataset | null;
  /** Loaded from this browser's storage (once per page). */
  restored: boolean;
  /** Why the data could not be kept in this browser, if they could not. */
  storageError: string | null;
  setDataset(d: Dataset | null): void;
}

export const datasetStore = createStore<DatasetState>()((setState) => ({
  dataset: null,
  restored: false,
  storageError: null,
  setDataset: (dataset) => setState({ dataset }),
}));

export function useDataset<T>(selector: (s: DatasetState) => T): T {
  return useStore(datasetStore, selector);
}

let restoring: Promise<void> | null = null;
/** Read the kept data set once (the pane calls it when it opens). */
export function restoreDataset(): Promise<void> {
  restoring ??= loadDataset()
    .then((d) => { if (!datasetStore.getState().dataset) datasetStore.setState({ dataset: d }); })
    .catch((e: unknown) => { datasetStore.setState({ storageError: `the data kept in this browser could not be read: ${(e as Error).message ?? String(e)}` }); })
    .finally(() => datasetStore.setState({ restored: true }));
  return restoring;
}

/** Hold a newly imported data set and keep it in this browser. */
export async function keepDataset(d: Omit<Dataset, 'version'>): Promise<void> {
  datasetStore.setState({ dataset: { version: DATASET_VERSION, ...d }, storageError: null });
  try {
    await saveDataset(d);
  } catch (e) {
    datasetStore.setState({ storageError: `the data are open but could not be kept in this browser (${(e as Error).message ?? String(e)}); they are gone after a reload` });
  }
}

/** Forget the data set here and in this browser's storage. */
export async function forgetDataset(): Promise<void> {
  datasetStore.setState({ dataset: null, storageError: null });
  await clearDataset().catch(() => undefined);
}
