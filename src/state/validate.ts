/**
 * Live checks of the document as it is edited: the file schema (parseModel)
 * and every formula, rate and relation through the restricted parser.
 * Pure functions; the stores memoise them per model.
 */
import { parseExpression, parseRelation, type ExpressionError } from '../core/expr/parse';
import { parseModel, type ModelIssue } from '../core/model/schema';
import type { Model } from '../core/model/types';

export interface FieldProblem {
  /** The variable or relation the problem belongs to. */
  target: string;
  field: 'formula' | 'rate' | 'equation' | 'timescale' | 'id' | 'other';
  message: string;
  position?: number;
  unknown?: string[];
}

export interface Validation {
  /** The model when it passes the file schema, else null. */
  model: Model | null;
  issues: ModelIssue[];
  problems: FieldProblem[];
}

export function knownNames(model: Model): Set<string> {
  return new Set(model.variables.map((v) => v.id));
}

export function checkFormula(text: string, model: Model): ExpressionError | null {
  const r = parseExpression(text, knownNames(model));
  return r.ok ? null : r.error;
}

export function checkRelation(text: string, model: Model): ExpressionError | null {
  const r = parseRelation(text, knownNames(model));
  return r.ok ? null : r.error;
}

/** Symbols a formula or relation uses (empty when it does not parse). */
export function symbolsOf(text: string, relation = false): string[] {
  const r = relation ? parseRelation(text) : parseExpression(text);
  return r.ok ? r.symbols : [];
}

const FIELD_OF_PATH = /^(variables|relations)\[(\d+)\]\.?(\w+)?/;

export function validateModel(model: Model): Validation {
  const parsed = parseModel(model);
  const issues = parsed.ok ? parsed.warnings : parsed.issues;
  const problems: FieldProblem[] = [];
  for (const iss of issues) {
    const m = FIELD_OF_PATH.exec(iss.path);
    if (!m) continue;
    const idx = Number(m[2]);
    const target = m[1] === 'variables' ? model.variables[idx]?.id : model.relations?.[idx]?.id;
    if (!target) continue;
    const f = m[3];
    problems.push({ target, field: f === 'timescale' || f === 'id' ? f : 'other', message: `${iss.path}: ${iss.message}` });
  }
  const known = knownNames(model);
  for (const v of model.variables) {
    const text = v.kind === 'derived' ? v.formula : v.kind === 'state' ? v.rate : undefined;
    if (text === undefined || text.trim() === '') continue;
    const r = parseExpression(text, known);
    if (!r.ok) problems.push({ target: v.id, field: v.kind === 'derived' ? 'formula' : 'rate', message: r.error.message, position: r.error.position, unknown: r.error.unknown });
  }
  for (const rel of model.relations ?? []) {
    if (rel.equation.trim() === '') {
      problems.push({ target: rel.id, field: 'equation', message: 'no equation yet: write what this relation states, such as a*b = c*d' });
      continue;
    }
    const r = parseRelation(rel.equation, known);
    if (!r.ok) problems.push({ target: rel.id, field: 'equation', message: r.error.message, position: r.error.position, unknown: r.error.unknown });
  }
  return { model: parsed.ok ? parsed.model : null, issues, problems };
}
