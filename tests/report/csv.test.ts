import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { fileURLToPath } from 'node:url';
import { csvField, recordsToCsv, toCsv } from '../../src/report/csv';
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
    const answers = reference(cases.map((r) => ({ rows: r, text: toCsv(r) })));
    cases.forEach((r, i) => {
      expect(toCsv(r), `seed 4180, rows ${JSON.stringify(r)}`).toBe(answers[i].written);
      expect(answers[i].parsed).toEqual(r);
    });
  });

  it('has numbers read back exactly', () => {
    const nums = [0.1, -3, 1e-300, 123456789.125, 2 / 3];
    const text = toCsv([nums.map(String), nums]);
    const [ref] = reference([{ rows: [], text }]);
    expect(ref.parsed[1].map(Number)).toEqual(nums);
  });
});
