/** Number and name formatting shared by the Numbers pane and its figures. */
import type { Model, VariableId } from '../core/model/types';

/** Six significant digits, no floating-point noise; exponent form for very large or small values. */
export function numText(x: number): string {
  if (!Number.isFinite(x)) return Number.isNaN(x) ? 'not a number' : x > 0 ? 'infinite' : '−infinite';
  if (x === 0) return '0';
  const a = Math.abs(x);
  if (a >= 1e-3 && a < 1e6) return String(Number(x.toPrecision(6))).replace('-', '−');
  return x.toExponential(3).replace('-', '−');
}

/** Edge weights: two decimals (three significant digits below 0.1). */
export function weightText(x: number): string {
  const a = Math.abs(x);
  const s = a >= 0.1 || a === 0 ? x.toFixed(2) : a >= 1e-3 ? x.toPrecision(2) : x.toExponential(1);
  return s.replace('-', '−');
}

export function nameOf(model: Model, id: VariableId): string {
  return model.variables.find((v) => v.id === id)?.label ?? id;
}

export function unitOf(model: Model, id: VariableId): string | undefined {
  return model.variables.find((v) => v.id === id)?.unit;
}
