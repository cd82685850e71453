/**
 * Editor commands shared by the toolbar, the keyboard and the canvas:
 * adding, deleting, copying and pasting, and the file actions.
 */
import type { Link, Position, Relation, Variable, VariableKind } from '../core/model/types';
import { EXAMPLES } from '../examples/index';
import { emptyModel, freshId, preparePaste, usedIds } from '../state/changes';
import { documentStore, editDocument, selectDirty, selectModel } from '../state/document';
import { MAX_FILE_BYTES, describeIssues, fileNameFor, readModelText, readShareFragment, serializeModel, shareFragment, type OpenResult } from '../state/files';
import { parseModel } from '../core/model/schema';
import { selectionStore } from '../state/selection';
import { showNotice, uiStore } from '../state/ui';
import { downloadBlob } from './download';
import { defaultPosition } from './canvas/flow';
import { freeSpot, type Box } from './canvas/geometry';
import { NODE_H, variableWidth } from './canvas/VariableNode';
import { fixedText, labelOf } from '../present/index';

const model = () => selectModel(documentStore.getState());

/** Where a new item goes when no pointer position is given; the canvas sets it to the view centre. */
let viewCentre: () => Position = () => ({ x: 200, y: 150 });
export function setViewCentreProvider(f: () => Position): void {
  viewCentre = f;
}

/** How wide a relation is on the canvas: its ring and the equation written beside it. */
const relationWidth = (equation: string) => Math.min(320, 40 + equation.length * 7.5);

/** The boxes the model's variables and relations take on the canvas (as drawn, before the page measures them). */
export function canvasBoxes(m: ReturnType<typeof model>): Box[] {
  const boxes: Box[] = m.variables.map((v, i) => {
    const p = v.position ?? defaultPosition(i);
    return { x: p.x, y: p.y, w: variableWidth(v.label ?? v.id), h: NODE_H };
  });
  (m.relations ?? []).forEach((r, i) => {
    const p = r.position ?? defaultPosition(m.variables.length + i);
    boxes.push({ x: p.x, y: p.y, w: relationWidth(r.equation), h: 30 });
  });
  return boxes;
}

export function addVariable(kind: VariableKind = 'derived', at?: Position): string {
  const m = model();
  const id = freshId('v', usedIds(m));
  const n = m.variables.length + 1;
  const label = `Variable ${n}`;
  const w = variableWidth(label);
  // centred on the pointer or the view centre, moved to the nearest place that covers nothing
  const p = at ?? viewCentre();
  const spot = freeSpot(canvasBoxes(m), { x: Math.round(p.x - w / 2), y: Math.round(p.y - NODE_H / 2) }, w, NODE_H);
  const v: Variable = { id, label, kind, position: spot };
  if (kind === 'state') v.timescale = '1 ' + m.timeUnit;
  documentStore.getState().stopGesture();
  editDocument({ type: 'addVariable', variable: v });
  selectionStore.getState().select({ nodes: [id] });
  return id;
}

/**
 * A new relation, with its equation left empty: adding a relation never adds
 * an equation the modeller did not write (a made-up one over-determined the
 * model). The inspector asks for the equation; the Checks list it until then.
 */
export function addRelation(at?: Position): string {
  const m = model();
  const id = freshId('rel', usedIds(m));
  const p = at ?? viewCentre();
  const spot = freeSpot(canvasBoxes(m), { x: Math.round(p.x), y: Math.round(p.y) }, relationWidth(''), 30);
  documentStore.getState().stopGesture();
  editDocument({ type: 'addRelation', relation: { id, equation: '', position: spot } });
  selectionStore.getState().select({ nodes: [id] });
  return id;
}

/** Draw a link; a state target makes it integrating, otherwise instantaneous. */
export function addLink(from: string, to: string): string | null {
  const m = model();
  if (from === to) return null;
  const target = m.variables.find((v) => v.id === to);
  if (!target || !m.variables.some((v) => v.id === from)) return null;
  const existing = m.links.find((l) => l.from === from && l.to === to);
  if (existing) {
    selectionStore.getState().select({ links: [existing.id!] });
    uiStore.getState().set({ toast: `There is already a link from ${labelOf(m, from)} to ${target.label ?? to}: it is selected` });
    return null;
  }
  const taken = new Set(m.links.map((l) => l.id).filter((x): x is string => !!x));
  const id = freshId(`${from}_${to}_`, taken);
  const link: Link = { id, from, to, kind: target.kind === 'state' ? 'integrating' : 'instantaneous', sign: '+' };
  documentStore.getState().stopGesture();
  editDocument({ type: 'addLink', link });
  selectionStore.getState().select({ links: [id] });
  return id;
}

export function deleteSelection(): void {
  const { nodes, links } = selectionStore.getState();
  if (nodes.length + links.length === 0) return;
  const m = model();
  const rel = new Set((m.relations ?? []).map((r) => r.id));
  documentStore.getState().stopGesture();
  editDocument({ type: 'remove', variables: nodes.filter((n) => !rel.has(n)), relations: nodes.filter((n) => rel.has(n)), links });
  selectionStore.getState().clear();
}

interface Clip {
  variables: Variable[];
  links: Link[];
  relations: Relation[];
}
let clipboard: Clip | null = null;
let pasteCount = 0;

export function copySelection(): boolean {
  const { nodes } = selectionStore.getState();
  if (nodes.length === 0) return false;
  const m = model();
  const sel = new Set(nodes);
  clipboard = {
    variables: m.variables.filter((v) => sel.has(v.id)),
    relations: (m.relations ?? []).filter((r) => sel.has(r.id)),
    links: m.links.filter((l) => sel.has(l.from) && sel.has(l.to)),
  };
  pasteCount = 0;
  return true;
}

export function pasteClipboard(): void {
  if (!clipboard) return;
  pasteCount++;
  const change = preparePaste(model(), clipboard, { x: 40 * pasteCount, y: 40 * pasteCount });
  documentStore.getState().stopGesture();
  editDocument(change);
  selectionStore.getState().select({ nodes: [...change.variables.map((v) => v.id), ...change.relations.map((r) => r.id)], links: change.links.map((l) => l.id!) });
}

export function selectAll(): void {
  const m = model();
  selectionStore.getState().select({ nodes: [...m.variables.map((v) => v.id), ...(m.relations ?? []).map((r) => r.id)], links: m.links.map((l) => l.id!) });
}

function confirmDiscard(): boolean {
  if (!selectDirty(documentStore.getState()) || documentStore.getState().fileName === undefined) return true;
  return window.confirm('The model has changes that are not saved to its file. Discard them?');
}

/** Open a validated model as the new document; a failure leaves the current one untouched. */
export function openResult(r: OpenResult, source: string, fileName?: string): boolean {
  if (!r.ok) {
    showNotice({ tone: 'error', title: `${source} could not be opened; your current model is unchanged`, lines: describeIssues(r.issues) });
    return false;
  }
  if (!confirmDiscard()) return false;
  documentStore.getState().load(r.model, { fileName });
  selectionStore.getState().clear();
  if (r.warnings.length > 0) showNotice({ tone: 'info', title: `${source} opened with warnings`, lines: describeIssues(r.warnings) });
  return true;
}

export function newModel(): void {
  if (!confirmDiscard()) return;
  documentStore.getState().load(emptyModel());
  selectionStore.getState().clear();
}

export function openExample(id: string): boolean {
  const ex = EXAMPLES.find((e) => e.id === id);
  if (!ex) {
    showNotice({ tone: 'error', title: `There is no example "${id}"`, lines: [`Known examples: ${EXAMPLES.map((e) => e.id).join(', ')}`] });
    return false;
  }
  const r = parseModel(ex.model);
  return openResult(r.ok ? { ok: true, model: r.model, warnings: r.warnings } : r, `The example "${ex.title}"`);
}

export async function openFile(file: File): Promise<boolean> {
  if (file.size > MAX_FILE_BYTES) {
    showNotice({ tone: 'error', title: `"${file.name}" could not be opened; your current model is unchanged`, lines: [`(file): is ${fixedText(file.size / 1024 / 1024, 1)} MB, larger than the ${MAX_FILE_BYTES / 1024 / 1024} MB a model file may have`] });
    return false;
  }
  let text: string;
  try {
    text = await file.text();
  } catch (e) {
    showNotice({ tone: 'error', title: `"${file.name}" could not be read; your current model is unchanged`, lines: [(e as Error).message] });
    return false;
  }
  return openResult(readModelText(text), `"${file.name}"`, file.name);
}

export function openShareFragment(hash: string): boolean | null {
  const r = readShareFragment(hash);
  if (r === null) return null;
  return openResult(r, 'The share link');
}

interface SaveHandle {
  createWritable(): Promise<{ write(data: string): Promise<void>; close(): Promise<void> }>;
  name: string;
}
let fileHandle: SaveHandle | null = null;

type SavePicker = (opts: unknown) => Promise<SaveHandle>;
interface OpenHandle extends SaveHandle {
  getFile(): Promise<File>;
}
type OpenPicker = (opts: unknown) => Promise<OpenHandle[]>;

/**
 * Open through the File System Access API where it can be used, so Save
 * writes back to the same file; returns false when it cannot be used (the
 * caller then shows the ordinary file input).
 */
export async function openWithPicker(): Promise<boolean> {
  const w = window as unknown as { showOpenFilePicker?: OpenPicker };
  if (typeof w.showOpenFilePicker !== 'function' || navigator.webdriver) return false;
  let handles: OpenHandle[];
  try {
    handles = await w.showOpenFilePicker({ types: [{ description: 'Loopfold model', accept: { 'application/json': ['.json'] } }] });
  } catch (e) {
    return (e as Error).name === 'AbortError';
  }
  const handle = handles[0];
  if (!handle) return true;
  if (await openFile(await handle.getFile())) fileHandle = handle;
  return true;
}
function savePicker(): SavePicker | null {
  const w = window as unknown as { showSaveFilePicker?: SavePicker };
  // Under automation the native picker cannot be answered: download instead.
  if (typeof w.showSaveFilePicker !== 'function' || navigator.webdriver) return null;
  return w.showSaveFilePicker.bind(window);
}

export async function saveAs(): Promise<void> {
  const m = model();
  const text = serializeModel(m);
  const suggested = documentStore.getState().fileName ?? fileNameFor(m.name);
  const picker = savePicker();
  if (picker) {
    try {
      const handle = await picker({ suggestedName: suggested, types: [{ description: 'Loopfold model', accept: { 'application/json': ['.json'] } }] });
      const w = await handle.createWritable();
      await w.write(text);
      await w.close();
      fileHandle = handle;
      documentStore.getState().markSaved(handle.name);
      uiStore.getState().set({ toast: `Saved to ${handle.name}` });
      return;
    } catch (e) {
      if ((e as Error).name === 'AbortError') return;
      // fall through to a download
    }
  }
  downloadBlob(new Blob([text], { type: 'application/json' }), suggested);
  documentStore.getState().markSaved(suggested);
  uiStore.getState().set({ toast: `Downloaded ${suggested}` });
}

export async function save(): Promise<void> {
  if (fileHandle) {
    try {
      const w = await fileHandle.createWritable();
      await w.write(serializeModel(model()));
      await w.close();
      documentStore.getState().markSaved(fileHandle.name);
      uiStore.getState().set({ toast: `Saved to ${fileHandle.name}` });
      return;
    } catch {
      fileHandle = null;
    }
  }
  await saveAs();
}

/** Forget the file a model was saved to (a new document was loaded). */
documentStore.subscribe((s, prev) => {
  if (s.history.past.length === 0 && s.history.present !== prev.history.present && s.fileName !== prev.fileName) fileHandle = null;
});

export function shareLink(): string {
  const url = `${location.origin}${location.pathname}${shareFragment(model())}`;
  return url;
}

export async function copyShareLink(): Promise<void> {
  const url = shareLink();
  try {
    await navigator.clipboard.writeText(url);
    uiStore.getState().set({ toast: 'Share link copied: it carries the whole model' });
  } catch {
    showNotice({ tone: 'info', title: 'Share link (copy it from here)', lines: [url] });
  }
}
