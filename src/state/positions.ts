/**
 * Edits that only move things. Where a variable or relation is drawn changes
 * neither its equations nor the file's checks, so the analysis and the checks
 * of the model before a move hold after it; these helpers let the stores
 * reuse them instead of recomputing (a drag on a 500-variable model would
 * otherwise re-check and re-analyse the whole model when it ends).
 */
import type { Model, Position, Relation, Variable } from '../core/model/types';
import type { Validation } from './validate';

const field = (o: object, k: string): unknown => (o as Record<string, unknown>)[k];

/** Same fields by identity, `except` those named. */
function sameFields(a: object, b: object, except: readonly string[]): boolean {
  for (const k of new Set([...Object.keys(a), ...Object.keys(b)])) if (!except.includes(k) && field(a, k) !== field(b, k)) return false;
  return true;
}

const sameButPosition = (a: Variable | Relation, b: Variable | Relation) => a === b || sameFields(a, b, ['position']);

function sameListsButPositions<T extends Variable | Relation>(a: readonly T[] | undefined, b: readonly T[] | undefined): boolean {
  if (a === b) return true;
  if (!a || !b || a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (!sameButPosition(a[i], b[i])) return false;
  return true;
}

/**
 * Whether two models differ at most in the positions of their variables and
 * relations. Edits copy only what they change, so everything else is compared
 * by identity: a model rebuilt from a file counts as different.
 */
export function onlyPositionsDiffer(a: Model, b: Model): boolean {
  if (a === b) return true;
  return sameFields(a, b, ['variables', 'relations']) && sameListsButPositions(a.variables, b.variables) && sameListsButPositions(a.relations, b.relations);
}

function withPosition<T extends { position?: Position }>(item: T, position: Position | undefined): T {
  const out = { ...item };
  if (position === undefined) delete out.position;
  else out.position = { x: position.x, y: position.y };
  return out;
}

/**
 * The checks of `next`, from those of `prev` when the two differ only in
 * positions (`onlyPositionsDiffer`): the same problems, and the validated model
 * with the new positions. Null when a check of `prev` concerns a position
 * (then only a full check can tell).
 */
export function movedValidation(prev: Model, checked: Validation, next: Model): Validation | null {
  if (checked.issues.some((i) => i.path.includes('position'))) return null;
  const valid = checked.model;
  if (!valid) return { ...checked, model: null };
  if (valid.variables.length !== next.variables.length || (valid.relations?.length ?? 0) !== (next.relations?.length ?? 0)) return null;
  const model: Model = { ...valid, variables: valid.variables.map((v, i) => (next.variables[i] === prev.variables[i] ? v : withPosition(v, next.variables[i].position))) };
  if (valid.relations) model.relations = valid.relations.map((r, i) => (next.relations![i] === prev.relations![i] ? r : withPosition(r, next.relations![i].position)));
  return { ...checked, model };
}
