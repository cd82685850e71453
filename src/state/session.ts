/**
 * The one owner of the study in the app. The study lives in the document
 * (`model.study`): undo covers it, autosave, files and share links carry it,
 * a reload restores it exactly. Everything else derives from it here: the
 * interval, the study length, the holds and the design the core reads. A
 * document with no study shows the default one (`studyOfModel`) until the
 * modeller changes something; then the whole study is written.
 *
 * View state that is not part of the design (folded blocks, view mode) stays
 * in `src/state/study.ts`.
 */
import { useStore } from 'zustand';
import type { Model, Study, VariableId } from '../core/model/types';
import type { StudyDesign } from '../core/ordering/types';
import { designAxis, designOfStudy, exactDuration, lengthAxis, modelAxis, studyInterval, type StudyAxis } from '../core/study/convert';
import { studyOfModel } from '../core/study/design';
import { analysisStore, setStudyDesign } from './analysis';
import { documentStore, editDocument, selectModel, validationOf } from './document';

/** How the interval control reads the study length. */
export type StudyLength = { by: 'samples'; samples: number } | { by: 'window'; window: number };

/** The study of the session, resolved in the model's time unit. */
export interface SessionStudy {
  study: Study;
  /** Whether the document carries it (false: the default study of a model that has none). */
  own: boolean;
  /** The sampling interval in the model's time unit. */
  interval: number;
  length: StudyLength;
  holds: Record<VariableId, number>;
  /** What the core reads: interval, window or samples, holds. */
  design: StudyDesign;
}

const NO_HOLDS: Record<VariableId, number> = {};
const defaults = new WeakMap<Model, Study>();
const resolved = new WeakMap<Study, Map<string, SessionStudy>>();

function resolve(study: Study, own: boolean, model: Model): SessionStudy {
  let byUnit = resolved.get(study);
  if (!byUnit) resolved.set(study, (byUnit = new Map()));
  const key = `${model.timeUnit}|${own}`;
  const hit = byUnit.get(key);
  if (hit) return hit;
  const unit = model.timeUnit;
  const interval = studyInterval(study, unit) ?? NaN;
  const a = lengthAxis(study.length, unit);
  const axis = a.ok ? (a.window !== undefined ? { window: a.window } : { samples: a.samples }) : designAxis(model, {});
  const s: SessionStudy = {
    study,
    own,
    interval,
    length: lengthOfAxis(axis),
    holds: study.holds ?? NO_HOLDS,
    design: designOfStudy(study, unit),
  };
  byUnit.set(key, s);
  return s;
}

function lengthOfAxis(axis: StudyAxis): StudyLength {
  return axis.window !== undefined ? { by: 'window', window: axis.window } : { by: 'samples', samples: axis.samples };
}

/**
 * The study length of a checked model when no session study is at hand: the
 * core's reading of the model (its study, a version-1 `settings.samples`, the default).
 */
export function modelLength(model: Model): StudyLength {
  return lengthOfAxis(modelAxis(model));
}

/** The session's study for a document model (null while the model does not pass its checks). */
export function sessionStudyOf(doc: Model): SessionStudy | null {
  const checked = validationOf(doc).model;
  if (!checked) return null;
  if (doc.study) return resolve(doc.study, true, checked);
  let d = defaults.get(checked);
  if (!d) defaults.set(checked, (d = studyOfModel(checked)));
  return resolve(d, false, checked);
}

/** The session's study now. */
export function currentStudy(): SessionStudy | null {
  return sessionStudyOf(selectModel(documentStore.getState()));
}

/** The session's study; re-renders when it changes. */
export function useSessionStudy(): SessionStudy | null {
  return useStore(documentStore, (s) => sessionStudyOf(selectModel(s)));
}

/**
 * Change the study (one undo step, or one per gesture with `squash`): the
 * current study, written whole into the document, with `patch` applied.
 * Example: `editStudy({ interval: "3 h" })`.
 */
export function editStudy(patch: Partial<Study>, opts?: { squash?: string }): void {
  const s = currentStudy();
  if (!s) return;
  const next: Study = { ...s.study, ...patch };
  for (const k of Object.keys(patch) as (keyof Study)[]) if (patch[k] === undefined) delete next[k];
  editDocument({ type: 'setStudy', study: next }, opts);
}

/** Set the interval: a number in the model's unit (the control), or text as typed ("3h"), kept exactly. */
export function setStudyInterval(value: number | string, opts?: { squash?: string }): void {
  const s = currentStudy();
  if (!s) return;
  if (typeof value === 'number' && !(value > 0 && Number.isFinite(value))) return;
  if (value === s.study.interval) return;
  editStudy({ interval: value }, opts);
}

/** Set the study length from the control: a count of samples, or a window written exactly with its unit. */
export function setStudyLength(length: StudyLength, unit: Model['timeUnit']): void {
  editStudy({ length: length.by === 'samples' ? length.samples : exactDuration(length.window, unit) });
}

export function setHold(variable: VariableId, value: number): void {
  const s = currentStudy();
  if (!s) return;
  editStudy({ holds: { ...s.holds, [variable]: value } });
}

export function releaseHold(variable: VariableId): void {
  const s = currentStudy();
  if (!s || !(variable in s.holds)) return;
  const { [variable]: _gone, ...rest } = s.holds;
  void _gone;
  editStudy({ holds: Object.keys(rest).length > 0 ? rest : undefined });
}

export function releaseAllHolds(): void {
  const s = currentStudy();
  if (!s || Object.keys(s.holds).length === 0) return;
  editStudy({ holds: undefined });
}

function sameRecord(a: Record<string, number> | undefined, b: Record<string, number> | undefined): boolean {
  const ka = Object.keys(a ?? {});
  const kb = Object.keys(b ?? {});
  return ka.length === kb.length && kb.every((k) => a![k] === b![k]);
}

function sameDesign(a: StudyDesign, b: StudyDesign): boolean {
  return a.interval === b.interval && a.window === b.window && a.samples === b.samples && Boolean(a.settleAll) === Boolean(b.settleAll) && sameRecord(a.hold, b.hold);
}

/** A gesture during which the analysis keeps its interval and length (a drag of the interval control). */
export interface SessionPause {
  active(): boolean;
  subscribe(listener: () => void): () => void;
}

/**
 * Keep the analysis design equal to the session's study: interval, length and
 * holds. During `pause` (a drag) only the holds follow; the rest once it ends.
 * Returns a function that stops it.
 */
export function startSession(pause?: SessionPause): () => void {
  const apply = () => {
    const s = currentStudy();
    if (!s) return;
    const cur = analysisStore.getState().design;
    let next: StudyDesign = s.design;
    if (pause?.active()) {
      next = { ...cur };
      if (Object.keys(s.holds).length > 0) next.hold = { ...s.holds };
      else delete next.hold;
    }
    if (!sameDesign(cur, next)) setStudyDesign(next);
  };
  const a = documentStore.subscribe((st, prev) => {
    if (st.history.present !== prev.history.present) apply();
  });
  const b = pause?.subscribe(apply);
  apply();
  return () => {
    a();
    b?.();
  };
}
