/** All problems of the document in one list: schema issues, formula errors and the core's diagnostics. */
import type { Model } from '../../core/model/types';
import type { Diagnostic } from '../../core/ordering/types';
import type { Validation } from '../../state/validate';
import type { Badges } from '../canvas/flow';
import { labeller } from '../../present/index';

export interface Problem {
  key: string;
  level: 'error' | 'warning';
  message: string;
  /** Node ids (variables, relations) the problem names. */
  targets: string[];
  source: 'file' | 'formula' | 'core';
}

/** The node an equation id belongs to: formula(v), rate(x), hold(x) → the variable; a relation → itself. */
export function nodeOfEquation(eq: string): string {
  const m = /^(?:formula|rate|hold)\((.+)\)$/.exec(eq);
  return m ? m[1] : eq;
}

export function collectProblems(model: Model, validation: Validation, diagnostics: readonly Diagnostic[] | undefined): Problem[] {
  const out: Problem[] = [];
  const label = labeller(model);
  validation.problems.forEach((p, i) =>
    out.push({
      key: `f${i}`,
      level: 'error',
      message: p.field === 'formula' || p.field === 'rate' || p.field === 'equation' ? `${label(p.target)} — ${p.field}: ${p.message}` : p.message,
      targets: [p.target],
      source: p.field === 'other' || p.field === 'timescale' || p.field === 'id' ? 'file' : 'formula',
    }),
  );
  const covered = new Set(validation.problems.map((p) => p.message));
  validation.issues.forEach((iss, i) => {
    const text = `${iss.path}: ${iss.message}`;
    if (covered.has(text)) return;
    out.push({ key: `i${i}`, level: validation.model ? 'warning' : 'error', message: text, targets: [], source: 'file' });
  });
  // A formula that does not parse is reported once, at its field's problem: the core's copy of it is left out.
  const unreadable = new Set(validation.problems.filter((p) => p.field === 'formula' || p.field === 'rate' || p.field === 'equation').map((p) => p.target));
  (diagnostics ?? []).forEach((d, i) =>
    d.code === 'formula-error' && [...d.variables, ...d.equations.map(nodeOfEquation)].some((t) => unreadable.has(t)) ? undefined :
    out.push({ key: `c${i}`, level: d.level, message: d.message, targets: [...new Set([...d.variables, ...d.equations.map(nodeOfEquation)])], source: 'core' }),
  );
  return out;
}

export function badgesOf(problems: readonly Problem[]): Badges {
  const errors = new Map<string, number>();
  const warnings = new Map<string, number>();
  for (const p of problems) {
    const m = p.level === 'error' ? errors : warnings;
    for (const t of p.targets) m.set(t, (m.get(t) ?? 0) + 1);
  }
  return { errors, warnings };
}
