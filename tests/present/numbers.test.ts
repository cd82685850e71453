import { describe, expect, it } from 'vitest';
import { fixedText, formatNumber, MINUS, numText, precisionText, quantityText, rounded, significant, tableText, weightText } from '../../src/present/numbers';
import { labelOf, labeller, unitOf } from '../../src/present/labels';
import { emptyModel } from '../../src/state/changes';

// Unicode 15, U+2212 MINUS SIGN: the minus of typeset mathematics; the hyphen-minus U+002D is for
// text that programs read. Significant-digit rounding and exponent form: common practice.
describe('numbers as people read them', () => {
  it('one minus sign, in the number and in its exponent', () => {
    expect(numText(-1.5e-7)).toBe(`${MINUS}1.500e${MINUS}7`);
    expect(numText(-0.25)).toBe(`${MINUS}0.25`);
    expect(numText(2e7)).toBe('2.000e+7');
    expect(weightText(-0.0004)).toBe(`${MINUS}4.0e${MINUS}4`);
    expect(numText(-Infinity)).toBe(`${MINUS}infinite`);
    expect(numText(NaN)).toBe('not a number');
    expect([...numText(-1.5e-7)].filter((c) => c === '-')).toEqual([]);
  });
  it('significant digits without floating-point noise', () => {
    expect(numText(0.1 + 0.2)).toBe('0.3');
    expect(formatNumber(2 / 3, { digits: 3 })).toBe('0.667');
    expect(formatNumber(123456.7, { digits: 4 })).toBe('123500');
    expect(formatNumber(0.00012346, { digits: 4, exponentDigits: 3 })).toBe('1.235e−4'.replace('−', MINUS));
  });
  it('ASCII for programs: hyphen-minus and JavaScript\'s words', () => {
    expect(formatNumber(-1.5e-7, { exponentDigits: 4, ascii: true })).toBe('-1.5000e-7');
    expect(formatNumber(-Infinity, { ascii: true })).toBe('-Infinity');
    expect(tableText(-1.5e-7)).toBe('-1.5000e-7');
    expect(tableText(2e7)).toBe('2.0000e+7');
    expect(tableText(-0.25)).toBe('-0.25');
    expect(Number(formatNumber(-0.001234567, { exponentDigits: 4, ascii: true }))).toBe(-0.00123457);
  });
  it('tick labels drop the plus of the exponent', () => {
    expect(formatNumber(2e5, { digits: 4, exponentDigits: 0, large: 1e5, exponentPlus: false })).toBe('2e5');
  });
  // ECMA-262, Number.prototype.toFixed / toPrecision: fixed places and significant digits, trailing
  // zeros kept, exponent form when the exponent is below -6 or not below the digits asked for.
  it('fixed places and significant digits as the language defines them, with one minus sign', () => {
    expect(fixedText(7, 1)).toBe('7.0');
    expect(fixedText(-0.5, 2)).toBe(`${MINUS}0.50`);
    expect(fixedText(-0.5, 2, { ascii: true })).toBe('-0.50');
    expect(fixedText(1234.5678, 3)).toBe('1234.568');
    expect(precisionText(0, 3)).toBe('0.00');
    expect(precisionText(-1.234e-8, 3)).toBe(`${MINUS}1.23e${MINUS}8`);
    expect(precisionText(123456, 2, { ascii: true })).toBe('1.2e+5');
    expect(fixedText(NaN, 1)).toBe('not a number');
    expect(precisionText(Infinity, 3, { ascii: true })).toBe('Infinity');
  });
  it('rounding that stays a number drops floating-point noise', () => {
    expect(significant(0.1 + 0.2, 3)).toBe(0.3);
    expect(significant(-123456, 2)).toBe(-120000);
    expect(significant(0.000123456, 3)).toBe(0.000123);
    expect(rounded(25.4049, 2)).toBe(25.4);
    expect(rounded(1.005 * 1000, 1)).toBe(1005);
  });
  it('numbers with units: time units take their plural', () => {
    expect(quantityText(20.04, 'day', { digits: 3 })).toBe('20 days');
    expect(quantityText(1, 'day')).toBe('1 day');
    expect(quantityText(6.123, 'min', { digits: 3 })).toBe('6.12 min');
    expect(quantityText(3, '°C')).toBe('3 °C');
    expect(quantityText(-2, 'week')).toBe(`${MINUS}2 weeks`);
  });
});

describe('names', () => {
  it('a variable is named by its label, else by its id', () => {
    const m = emptyModel();
    m.variables.push({ id: 'soil', kind: 'state', label: 'Soil water', unit: 'L' }, { id: 'air', kind: 'state' } as (typeof m.variables)[number]);
    expect(labelOf(m, 'soil')).toBe('Soil water');
    expect(labelOf(m, 'air')).toBe('air');
    expect(labelOf(m, 'nowhere')).toBe('nowhere');
    expect(unitOf(m, 'soil')).toBe('L');
    const name = labeller(m);
    expect(['soil', 'air', 'nowhere'].map(name)).toEqual(['Soil water', 'air', 'nowhere']);
  });
});
