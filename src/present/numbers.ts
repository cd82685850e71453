/**
 * Numbers as people read them, in one place: significant digits without
 * floating-point noise, exponent form for the very large and very small,
 * and one minus sign, U+2212 "−", in the number and in its exponent alike.
 * Text that programs read (the command line's tables) asks for `ascii`:
 * the hyphen-minus and JavaScript's own words for non-finite values.
 */
import type { TimeUnit } from '../core/model/types';

/** The minus sign of typeset text (U+2212). */
export const MINUS = '\u2212';

export interface NumberStyle {
  /** Significant digits (default 6). */
  digits?: number;
  /**
   * Digits after the point in exponent form, used below `small` and from
   * `large` on. Left out: the rounded value in JavaScript's shortest form
   * (which itself turns to exponent form only below 1e-6 and from 1e21).
   */
  exponentDigits?: number;
  /** Below this magnitude, exponent form (default 1e-3). */
  small?: number;
  /** From this magnitude on, exponent form (default 1e6). */
  large?: number;
  /** Keep the "+" of a positive exponent (default true): "1.5e+7"; false: "1.5e7". */
  exponentPlus?: boolean;
  /** Hyphen-minus and "NaN" / "Infinity" for text that programs read (default false). */
  ascii?: boolean;
}

/**
 * A number in words and digits a reader takes in at a glance.
 * Example: `formatNumber(-1.5e-7, { exponentDigits: 3 })` → "−1.500e−7";
 * `formatNumber(2 / 3, { digits: 3 })` → "0.667".
 */
export function formatNumber(x: number, style: NumberStyle = {}): string {
  const { digits = 6, exponentDigits, small = 1e-3, large = 1e6, exponentPlus = true, ascii = false } = style;
  if (!Number.isFinite(x)) return notFinite(x, ascii);
  if (x === 0) return '0';
  const a = Math.abs(x);
  let s = exponentDigits !== undefined && (a < small || a >= large) ? x.toExponential(exponentDigits) : String(significant(x, digits));
  if (!exponentPlus) s = s.replace('e+', 'e');
  return ascii ? s : s.replace(/-/g, MINUS);
}

/**
 * A number rounded to `digits` significant digits, still a number: no floating-point noise in
 * what is shown or compared. Example: `significant(0.1 + 0.2, 3)` → 0.3
 */
export function significant(x: number, digits: number): number {
  return Number(x.toPrecision(digits));
}

/** A number rounded to `decimals` places after the point, still a number. Example: `rounded(25.4049, 2)` → 25.4 */
export function rounded(x: number, decimals: number): number {
  return Number(x.toFixed(decimals));
}

/** Words for a value that is not finite, or JavaScript's own words for programs. */
function notFinite(x: number, ascii: boolean): string {
  if (ascii) return String(x);
  return Number.isNaN(x) ? 'not a number' : x > 0 ? 'infinite' : `${MINUS}infinite`;
}

/**
 * Exactly `decimals` places after the point, trailing zeros kept (sizes, durations, scales).
 * `ascii` keeps the hyphen-minus for text that programs read (attributes, tables).
 * Example: `fixedText(-0.5, 2)` → "−0.50"; `fixedText(7, 1)` → "7.0".
 */
export function fixedText(x: number, decimals: number, style: Pick<NumberStyle, 'ascii'> = {}): string {
  const ascii = style.ascii ?? false;
  if (!Number.isFinite(x)) return notFinite(x, ascii);
  const s = x.toFixed(decimals);
  return ascii ? s : s.replace(/-/g, MINUS);
}

/**
 * Exactly `digits` significant digits, trailing zeros kept, exponent form where JavaScript
 * chooses it (a residual, a growth rate). Example: `precisionText(0, 3)` → "0.00";
 * `precisionText(-1.234e-8, 3)` → "−1.23e−8".
 */
export function precisionText(x: number, digits: number, style: Pick<NumberStyle, 'ascii'> = {}): string {
  const ascii = style.ascii ?? false;
  if (!Number.isFinite(x)) return notFinite(x, ascii);
  const s = x.toPrecision(digits);
  return ascii ? s : s.replace(/-/g, MINUS);
}

/** Six significant digits; exponent form with four digits below 0.001 and from a million on. Example: `numText(-1.5e-7)` → "−1.500e−7". */
export function numText(x: number): string {
  return formatNumber(x, { exponentDigits: 3 });
}

/** Numbers in the command line's tables, which programs read too: six significant digits, exponent form with five below 0.001 and from a million on, hyphen-minus. Example: `tableText(-1.5e-7)` → "-1.5000e-7". */
export function tableText(x: number): string {
  return formatNumber(x, { exponentDigits: 4, ascii: true });
}

/** Path coefficients and edge weights: two decimals, two significant digits below 0.1 (common practice), exponent form below 0.001. Example: `weightText(-0.456)` → "−0.46". */
export function weightText(x: number): string {
  const a = Math.abs(x);
  const s = a >= 0.1 || a === 0 ? x.toFixed(2) : a >= 1e-3 ? x.toPrecision(2) : x.toExponential(1);
  return s.replace(/-/g, MINUS);
}

const UNIT_WORDS: Record<TimeUnit, [string, string]> = {
  s: ['s', 's'], min: ['min', 'min'], h: ['h', 'h'], day: ['day', 'days'], week: ['week', 'weeks'], month: ['month', 'months'], year: ['year', 'years'],
};

/** A time unit's word for an amount: "1 day", "2 days", "3 h". */
export function timeUnitWord(unit: TimeUnit, amount: number): string {
  const [one, many] = UNIT_WORDS[unit];
  return amount === 1 ? one : many;
}

/**
 * A number with its unit: a time unit takes its plural, any other unit is
 * written as given, none leaves the number alone.
 * Example: `quantityText(20.04, 'day', { digits: 3 })` → "20 days"; `quantityText(3, '°C')` → "3 °C".
 */
export function quantityText(x: number, unit: TimeUnit | string | undefined, style: NumberStyle = {}): string {
  const n = formatNumber(x, style);
  if (!unit) return n;
  const word = unit in UNIT_WORDS ? timeUnitWord(unit as TimeUnit, Number(n.replace(MINUS, '-'))) : unit;
  return `${n} ${word}`;
}
