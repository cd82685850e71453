/**
 * The strength of a link: the coefficient it carries in a sketch's equations
 * (src/core/numeric/system.ts): a derived variable is v = Σ sign·strength·source
 * over its instantaneous links; a state is dx/dt = (Σ sign·strength·source − x)/τ
 * over its integrating links. A strength is a number without unit: the change
 * in the target's balance per unit of the source.
 *
 * A link without a strength shares DEFAULT_TOTAL_GAIN with the other links
 * that count for its target: each gets DEFAULT_TOTAL_GAIN / n. With every
 * strength left empty, the absolute gains into each variable then sum to
 * DEFAULT_TOTAL_GAIN < 1, so the gain around every loop is below one and the
 * sketch comes to rest whatever its timescales: the state-to-state gain
 * matrix K has ‖K‖∞ < 1, hence spectral radius below one, and D(K − I) with
 * D > 0 diagonal is stable by comparison with the Metzler matrix D(|K| − I)
 * (Horn & Johnson, Topics in Matrix Analysis, 1991, §2.5: M-matrices).
 */
import type { Link, Model, VariableId } from './types';

/** The total strength the empty strengths of one variable's incoming links share. */
export const DEFAULT_TOTAL_GAIN = 0.8;

/** Whether a link enters its target's sketched equation (instantaneous into derived, integrating into a state). */
export function linkCounts(model: Model, link: Link, kindOf?: ReadonlyMap<VariableId, string>): boolean {
  const kinds = kindOf ?? new Map(model.variables.map((v) => [v.id, v.kind]));
  const to = kinds.get(link.to);
  if (!kinds.has(link.from) || link.from === link.to) return false;
  return (to === 'derived' && link.kind === 'instantaneous') || (to === 'state' && link.kind === 'integrating');
}

export interface Strength {
  /** Magnitude used in the equations (the sign is the link's sign). */
  value: number;
  /** Whether the modeller typed it. */
  given: boolean;
  /** How many links into the target count (the default is DEFAULT_TOTAL_GAIN / this). */
  sharedBy: number;
}

/**
 * The strength of every link, in model.links order.
 * Example: two links without strength into one state get 0.4 each.
 */
export function linkStrengths(model: Model): Strength[] {
  const kinds = new Map(model.variables.map((v) => [v.id, v.kind]));
  const counted = new Map<VariableId, number>();
  for (const l of model.links) if (linkCounts(model, l, kinds)) counted.set(l.to, (counted.get(l.to) ?? 0) + 1);
  return model.links.map((l) => {
    const n = Math.max(1, counted.get(l.to) ?? 0);
    return l.weight !== undefined ? { value: l.weight, given: true, sharedBy: n } : { value: DEFAULT_TOTAL_GAIN / n, given: false, sharedBy: n };
  });
}

/** The signed coefficient of one link (sign × strength). */
export function signedStrength(link: Link, s: Strength): number {
  return (link.sign === '-' ? -1 : 1) * s.value;
}

/** A strength range as the inspector shows it: "0.2..0.9". */
export function strengthRangeText(r: { low: number; high: number } | undefined): string {
  return r === undefined ? '' : `${r.low}..${r.high}`;
}

/**
 * Read a strength range typed as "low..high" (sizes; the sign is the link's):
 * '' → no range. Every refusal says what is wrong with the text.
 * Example: `parseStrengthRangeText('0.2..0.9')` → { ok: true, value: { low: 0.2, high: 0.9 } }.
 */
export function parseStrengthRangeText(text: string): { ok: true; value: { low: number; high: number } | undefined } | { ok: false; message: string } {
  const t = text.trim();
  if (t === '') return { ok: true, value: undefined };
  const parts = t.split('..');
  if (parts.length !== 2) return { ok: false, message: `"${t}" is not a range: write low..high, such as 0.2..0.9` };
  const [lo, hi] = parts.map((p) => p.trim());
  const low = Number(lo), high = Number(hi);
  if (lo === '' || !Number.isFinite(low)) return { ok: false, message: `the low end "${lo}" is not a number` };
  if (hi === '' || !Number.isFinite(high)) return { ok: false, message: `the high end "${hi}" is not a number` };
  if (low < 0 || high < 0) return { ok: false, message: 'a strength range holds sizes: both ends must be 0 or more (the sign is the link’s sign)' };
  if (low > high) return { ok: false, message: `the low end ${low} is above the high end ${high}` };
  return { ok: true, value: { low, high } };
}
