import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { fileURLToPath } from 'node:url';
import { csvField, defuseFormula, recordsToCsv, toCsv } from '../../src/present/csv';
import { runPython } from '../helpers/python';

const SCRIPT = fileURLToPath(new URL('./csv_reference.py', import.meta.url));
type Answer = { written: string; parsed: string[][] };
const reference = (cases: { rows: string[][]; text: string }[]) => runPython<Answer[]>(SCRIPT, cases);

describe('RFC 4180 fields', () => {
  // RFC 4180 §2, rules 5–7 (quote fields with comma, quote, CR/LF; double the quotes).
  it('quotes only where the RFC requires it', () => {
    expect(csvField('plain')).toBe('plain');
    expect(csvField('a,b')).toBe('"a,b"');
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    expect(csvField('line\nbreak')).toBe('"line\nbreak"');
    expect(csvField('cr\rhere')).toBe('"cr\rhere"');
    expect(csvField(null)).toBe('');
    expect(csvField(2.5)).toBe('2.5');
  });
  // RFC 4180 §2 rule 1: each record ends with CRLF.
  it('ends every record with CRLF', () => {
    expect(toCsv([['a', 'b'], ['1', '2']])).toBe('a,b\r\n1,2\r\n');
    expect(recordsToCsv(['x', 'y'], [{ x: 1, y: 'p,q' }])).toBe('x,y\r\n1,"p,q"\r\n');
  });
});

describe('agreement with Python csv (excel dialect)', () => {
  const tricky = fc.constantFrom(',', '"', '\r', '\n', '\r\n', ' ', 'a', 'ß', '≈', '0', '""', ';');
  const field = fc.array(fc.oneof(tricky, fc.string({ maxLength: 4 })), { maxLength: 5 }).map((p) => p.join(''));
  // Rows of at least two fields: Python quotes a lone empty field ("") to keep the row visible, a choice the RFC leaves open.
  const rows = fc.array(fc.array(field, { minLength: 2, maxLength: 5 }), { minLength: 1, maxLength: 6 });

  it('writes byte for byte what Python writes, and Python reads back the same fields (seeded)', () => {
    const cases = fc.sample(rows, { seed: 4180, numRuns: 300 });
    // Python writes the cells as they are; ours first defuses cells a spreadsheet would run (tested below).
    const defused = cases.map((r) => r.map((row) => row.map(defuseFormula)));
    const answers = reference(cases.map((r, i) => ({ rows: defused[i], text: toCsv(r) })));
    cases.forEach((r, i) => {
      expect(toCsv(r), `seed 4180, rows ${JSON.stringify(r)}`).toBe(answers[i].written);
      expect(answers[i].parsed).toEqual(defused[i]);
    });
  });

  it('has numbers read back exactly', () => {
    const nums = [0.1, -3, 1e-300, 123456789.125, 2 / 3];
    const text = toCsv([nums.map(String), nums]);
    const [ref] = reference([{ rows: [], text }]);
    expect(ref.parsed[1].map(Number)).toEqual(nums);
  });
});

// OWASP, "CSV Injection" (owasp.org, from memory): a cell that starts with =, +, -, @, tab or
// carriage return is run as a formula by spreadsheets; prefix it with an apostrophe so it is shown as text.
describe('cells a spreadsheet would run as formulas', () => {
  it('get a leading apostrophe', () => {
    expect(csvField('=SUM(A1:A3)')).toBe("'=SUM(A1:A3)");
    expect(csvField('+cmd|x')).toBe("'+cmd|x");
    expect(csvField('-2+3')).toBe("'-2+3");
    expect(csvField('@import')).toBe("'@import");
    expect(csvField('\tx')).toBe("'\tx");
    expect(csvField('=HYPERLINK("a,b")')).toBe(`"'=HYPERLINK(""a,b"")"`);
  });
  it('leaves numbers alone, and text that is a plain number', () => {
    expect(csvField(-1.5)).toBe('-1.5');
    expect(csvField(-1.5e-7)).toBe('-1.5e-7');
    expect(csvField('-1.5')).toBe('-1.5');
    expect(csvField('+2e-3')).toBe('+2e-3');
    expect(csvField('a=b')).toBe('a=b');
    expect(toCsv([['x', -3], ['=1+1', '-0.25']])).toBe("x,-3\r\n'=1+1,-0.25\r\n");
  });
  it('reads back with Python as text starting with the apostrophe, numbers as numbers', () => {
    const [ref] = reference([{ rows: [], text: toCsv([['=1+1', -1.5, '@x']]) }]);
    expect(ref.parsed[0]).toEqual(["'=1+1", '-1.5', "'@x"]);
    expect(Number(ref.parsed[0][1])).toBe(-1.5);
  });
});
