/**
 * Partial derivatives of formulas: symbolic by mathjs's `derivative` with
 * `{ simplify: false }` (fast, and exact), compiled like the formula itself.
 * Where mathjs has no rule (min, max, atan2, sign, log2) or the symbolic
 * derivative is not finite at a point (|x| at 0, cbrt at 0), a central finite
 * difference is used instead.
 */
import { create, derivativeDependencies, type MathNode } from 'mathjs';
import { compileExpression, CompileError, type CompiledExpression, type SlotMap } from './compile';

// Only what `derivative` needs; no parser, no evaluate, no import.
const math = create({ derivativeDependencies });

export interface Partial {
  symbol: string;
  slot: number;
  /** ∂f/∂symbol at the point. */
  at: CompiledExpression;
  /** Whether the value comes from a symbolic derivative (false: finite differences only). */
  symbolic: boolean;
}

/** Central difference with the step of common practice h = cbrt(eps)·max(1, |x|). */
export function finiteDifference(f: CompiledExpression, slot: number): CompiledExpression {
  return (v) => {
    const x = v[slot];
    const h = 6.055454452393343e-6 * Math.max(1, Math.abs(x));
    v[slot] = x + h;
    const fp = f(v);
    v[slot] = x - h;
    const fm = f(v);
    v[slot] = x;
    return (fp - fm) / (2 * h);
  };
}

/**
 * ∂f/∂s for every symbol s of the formula that is a variable (in `slots`).
 * Example: `partials(parseExpression("a*b").node, ["a","b"], slots)`.
 */
export function partials(node: MathNode, symbols: readonly string[], slots: SlotMap, f?: CompiledExpression): Partial[] {
  const value = f ?? compileExpression(node, slots);
  const out: Partial[] = [];
  for (const symbol of symbols) {
    const slot = slots.get(symbol);
    if (slot === undefined) continue;
    const fd = finiteDifference(value, slot);
    let symbolicFn: CompiledExpression | null;
    try {
      const d = math.derivative(node, symbol, { simplify: false }) as MathNode;
      symbolicFn = compileExpression(d, slots);
    } catch (e) {
      if (!(e instanceof CompileError) && !/derivative|not supported/i.test((e as Error).message)) throw e;
      symbolicFn = null;
    }
    if (symbolicFn) {
      const s = symbolicFn;
      out.push({ symbol, slot, symbolic: true, at: (v) => { const d = s(v); return Number.isFinite(d) ? d : fd(v); } });
    } else {
      out.push({ symbol, slot, symbolic: false, at: fd });
    }
  }
  return out;
}
