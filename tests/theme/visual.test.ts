import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { INK, PAPER, ROLE_STYLE } from '../../src/theme/visual';
import { decimals, expectClose } from '../helpers/tolerance';

/** Relative luminance and contrast ratio as defined in WCAG 2.1 (W3C Recommendation, "relative luminance" and "contrast ratio"). */
function luminance(hex: string): number {
  const c = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255).map((v) => (v <= 0.04045 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4));
  return 0.2126 * c[0] + 0.7152 * c[1] + 0.0722 * c[2];
}
function contrast(a: string, b: string): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

const css = readFileSync(new URL('../../src/ui/styles.css', import.meta.url), 'utf8');
const cssVar = (name: string) => {
  const m = new RegExp(`--${name}:\\s*(#[0-9a-fA-F]{6})`).exec(css);
  if (!m) throw new Error(`--${name} is not in styles.css`);
  return m[1];
};

describe('text contrast (WCAG 2.1 AA: at least 4.5:1 for normal text)', () => {
  it('the formula gives the published anchor values', () => {
    // black on white is 21:1 by definition; #767676 on white is about 4.54:1 (WebAIM contrast checker, from memory)
    expectClose(contrast('#000000', '#ffffff'), 21, decimals(5));
    expectClose(contrast('#767676', '#ffffff'), 4.54, decimals(2));
  });

  const chrome = '#fffdf8';
  const pairs: [string, string, string][] = [
    ['ink on paper', INK, PAPER],
    ['muted text on the panels', cssVar('muted'), chrome],
    ['muted captions inside an input', cssVar('muted'), ROLE_STYLE.input.fill],
    ['muted captions inside a state', cssVar('muted'), ROLE_STYLE.state.fill],
    ['muted captions inside a derived variable', cssVar('muted'), ROLE_STYLE.derived.fill],
    ['primary button', cssVar('accent-ink'), cssVar('accent')],
    ['error text', cssVar('error'), chrome],
    ['error badge', '#ffffff', cssVar('error')],
    ['warning badge', '#3b2a00', '#f4d27a'],
    ['caution banner', '#4a3206', '#fff1cc'],
    ['link-like buttons', '#17586a', chrome],
    ['field labels', '#33414a', chrome],
    ['minus sign and toasts', '#ffffff', INK],
    ['state-role text in the equations grid', '#34428f', ROLE_STYLE.state.fill],
  ];
  it.each(pairs)('%s', (_name, fg, bg) => {
    expect(contrast(fg, bg)).toBeGreaterThanOrEqual(4.5);
  });
});
