import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { comparisonCsv } from '../../src/present/comparisonCsv';

const model = { variables: [{ id: 'stress', kind: 'state' as const, label: '=HYPERLINK("http://x","click")' }, { id: 'mood', kind: 'state' as const, label: 'Mood, evening' }] };
const rows = [{ from: 'stress', to: 'mood', sketch: -0.2, estimate: -0.018, low: -0.0563, high: 0.0203, verdict: 'not detectable with these data', words: '-0.018 [-0.0563, 0.0203]' }];

describe('comparison as CSV', () => {
  const csv = comparisonCsv(model, rows, 'VAR');
  // Read back by an independent RFC 4180 reader (papaparse).
  const parsed = Papa.parse<string[]>(csv.trimEnd(), { delimiter: ',' }).data;

  it('a label a spreadsheet would run as a formula arrives as text (leading apostrophe, OWASP CSV injection: common practice)', () => {
    expect(parsed[1][1]).toBe('\'=HYPERLINK("http://x","click")');
    expect(parsed[1][8]).toBe("'-0.018 [-0.0563, 0.0203]");
  });

  it('numbers stay numbers and commas stay inside their field; records end with CRLF (RFC 4180)', () => {
    expect(parsed[0]).toEqual(['method', 'from', 'to', 'sketch', 'estimate', 'low 95 %', 'high 95 %', 'verdict', 'in words']);
    expect(parsed[1].slice(2, 8)).toEqual(['Mood, evening', '-0.2', '-0.018', '-0.0563', '0.0203', 'not detectable with these data']);
    expect(csv.endsWith('\r\n')).toBe(true);
    expect(csv.split('\r\n')).toHaveLength(3);
  });
});
