import { describe, expect, it } from 'vitest';
import { importText, type ColumnMapping, type ImportResult } from '../../../src/core/data/import';

/** mulberry32: a small seeded generator (common practice). */
function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const MAP: ColumnMapping = {
  format: 'long', person: 'pid', time: 'when', timeUnit: 'h', missing: ['-99'],
  variables: [{ column: 'stress', variable: 'stress' }, { column: 'sleep', variable: 'sleep' }, { column: 'worry', variable: 'worry' }],
};

const iso = (h: number) => new Date(Date.UTC(2026, 2, 2) + h * 3600e3).toISOString().replace('.000Z', '+00:00');

/** One malformed file: a clean diary with several kinds of damage applied. */
function malformed(seed: number): { text: string; delimiter?: string } {
  const r = rng(seed);
  const pick = <T,>(xs: T[]) => xs[Math.floor(r() * xs.length)];
  const rows = 1 + Math.floor(r() * 60);
  let delim = ',';
  const lines: string[][] = [['pid', 'when', 'stress', 'sleep', 'worry']];
  for (let k = 0; k < rows; k++) {
    const p = `p${Math.floor(r() * 4)}`;
    const h = Math.floor(r() * 200) + r();
    const time = r() < 0.7 ? iso(h) : String(h.toFixed(2));
    lines.push([p, time, String(Math.round(r() * 10)), pick(['5', '', 'NA', '-99', '7.5']), pick(['1', '2', 'x', '3e2', '', '"4"'])]);
  }
  const damages = 1 + Math.floor(r() * 4);
  for (let d = 0; d < damages; d++) {
    const k = 1 + Math.floor(r() * rows);
    if (!lines[k]) continue;
    switch (Math.floor(r() * 12)) {
      case 0: lines[k] = lines[k].slice(0, Math.floor(r() * 5)); break; // ragged, short
      case 1: lines[k] = [...lines[k], 'extra']; break; // ragged, long
      case 2: delim = pick([';', '\t', '|']); break; // another delimiter
      case 3: lines.splice(k, 0, [...lines[k]]); break; // duplicated row (duplicate time)
      case 4: lines[k][1] = pick(['2026-02-30T10:00:00Z', '2026-03-02T25:00:00Z', 'yesterday', '', '12:30', '2026-3-2', '1e400', 'NaN']); break;
      case 5: lines.reverse(); lines.unshift(lines.pop()!); break; // unsorted
      case 6: lines[k][2] = `"${lines[k][2]}`; break; // unclosed quote
      case 7: lines[k][0] = ''; break;
      case 8: lines[k] = [String.fromCharCode(...Array.from({ length: 8 }, () => Math.floor(r() * 0xffff)))]; break; // garbage
      case 9: lines[0] = lines[0].map((c) => (r() < 0.3 ? c.toUpperCase() : c)); break; // header changed
      case 10: lines.splice(1); break; // header only
      case 11: lines.splice(k, 0, []); break; // blank line
    }
  }
  let text = lines.map((l) => l.join(delim)).join(pick(['\n', '\r\n']));
  if (r() < 0.3) text = `\uFEFF${text}`;
  if (r() < 0.05) text = '';
  return { text, ...(r() < 0.5 ? { delimiter: pick([',', undefined]) } : {}) } as { text: string; delimiter?: string };
}

function checkResult(res: ImportResult, label: string) {
  if (res.panel === null) {
    expect(res.issues.length, label).toBeGreaterThan(0);
    expect(res.issues.some((i) => i.action === 'file refused' && i.message.length > 10), label).toBe(true);
    return;
  }
  const rowsRefused = res.summary.refused;
  expect(res.summary.kept + rowsRefused, label).toBe(res.summary.rows);
  const maxRow = res.summary.rows + 1 + 1000;
  for (const i of res.issues) if (i.action !== 'note') { expect(i.row, label).toBeGreaterThanOrEqual(2); expect(i.row, label).toBeLessThanOrEqual(maxRow); }
  const refusedListed = res.summary.reasons.filter((x) => x.action === 'row refused').reduce((a, x) => a + x.count, 0);
  expect(refusedListed, label).toBe(rowsRefused);
  for (const p of res.panel.persons) {
    for (let k = 0; k < p.time.length; k++) {
      expect(Number.isFinite(p.time[k]), label).toBe(true);
      if (k > 0) expect(p.time[k] > p.time[k - 1], label).toBe(true);
    }
    expect(p.values.length, label).toBe(p.time.length * res.panel.variables.length);
  }
}

describe('import fuzzing', () => {
  it('1,000 malformed files are each refused with a reason or imported with row and column messages', () => {
    let refusedFiles = 0, imported = 0;
    for (let s = 1; s <= 1000; s++) {
      const f = malformed(s);
      const res = importText(f.text, MAP, f.delimiter ? { delimiter: f.delimiter } : {});
      checkResult(res, `seed ${s}`);
      if (res.panel) imported++; else refusedFiles++;
    }
    // Both outcomes occur (the generator is not trivially all-good or all-bad).
    expect(refusedFiles).toBeGreaterThan(20);
    expect(imported).toBeGreaterThan(200);
  });

  it('a file of 10^6 rows with unsorted and duplicated times imports with its problems counted', () => {
    const r = rng(7);
    const parts: string[] = ['pid,when,stress,sleep,worry'];
    let repeats = 0;
    for (let k = 0; k < 1_000_000; k++) {
      const p = k % 500;
      // Some rows repeat the person's previous time (a duplicate when that row was not moved itself); others fall between earlier ones (out of order).
      const shift = (i: number) => (i % 997 === 0 && i >= 500 ? 3 : i % 991 === 0 && i >= 1000 ? 4.5 : 0);
      if (shift(k) === 3 && shift(k - 500) === 0) repeats++;
      const t = Math.floor(k / 500) * 3 - shift(k);
      parts.push(`p${p},${t},${(r() * 10).toFixed(2)},${k % 13 === 0 ? 'NA' : '5'},${k % 100_003 === 0 ? 'x' : '1'}`);
    }
    const res = importText(parts.join('\n'), { ...MAP, timeFormat: 'number' });
    checkResult(res, '10^6 rows');
    expect(res.summary.rows).toBe(1_000_000);
    expect(res.panel!.persons.length).toBe(500);
    expect(res.summary.reasons.find((x) => x.reason === 'not a number')!.count).toBe(10);
    expect(res.summary.reasons.find((x) => x.reason === 'duplicate time')!.count).toBe(repeats);
    expect(res.summary.unsortedPersons).toBeGreaterThan(0);
  }, 600_000);
});
