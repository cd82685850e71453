import { describe, expect, it } from 'vitest';
import { importText, parseIsoTime, readHeader, type ColumnMapping } from '../../../src/core/data/import';
import { suggestMapping } from '../../../src/core/data/importMapping';
import { decimals, expectClose } from '../../helpers/tolerance';
import { runPython } from '../../helpers/python';

const LONG: ColumnMapping = {
  format: 'long', person: 'pid', time: 'when', timeUnit: 'h', day: undefined, missing: ['-99'],
  variables: [{ column: 'stress', variable: 'stress' }, { column: 'sleep', variable: 'sleep' }],
};

describe('parseIsoTime', () => {
  it('agrees with Python datetime.fromisoformat on valid and impossible date-times', () => {
    // Reference: Python's standard library datetime.fromisoformat.
    const cases = ['2026-03-02T09:15:00+01:00', '2026-03-02T09:15:00Z', '2026-03-02 23:59:59-05:30', '2024-02-29T00:00:00+00:00',
      '2026-02-29T10:00:00Z', '2026-13-01T10:00:00Z', '2026-04-31T10:00:00Z', '2026-03-02T24:00:00Z', '2026-03-02T09:60:00Z',
      '2026-03-02T09:15:00.250+02:00', '2026-03-02T09:15', '2026-03-02', '1999-12-31T23:00:00-11:00', '2026-00-10T10:00:00Z'];
    const ref = runPython<([number, number] | null)[]>('tests/reference/iso_times.py', cases);
    cases.forEach((c, i) => {
      const r = parseIsoTime(c);
      if (ref[i] === null) expect(r.ok, c).toBe(false);
      else {
        expect(r.ok, c).toBe(true);
        if (r.ok) { expectClose(r.seconds, ref[i]![0], decimals(6), c); expect(r.localDay, c).toBe(ref[i]![1]); }
      }
    });
  });
});

describe('importText', () => {
  it('imports long data, sorts per person, reads missing codes, and reports every refused row and cell by row and column', () => {
    const csv = '\uFEFFpid,when,stress,sleep\n'
      + 'a,2026-03-02T13:00:00+01:00,3,7\n'       // row 2
      + 'a,2026-03-02T09:00:00+01:00,2,NA\n'      // row 3 (earlier: sorted first)
      + 'a,2026-03-02T09:00:00+01:00,5,5\n'       // row 4 duplicate time
      + 'b,2026-03-03T08:30:00+01:00,-99,6\n'     // row 5 missing code
      + 'b,2026-03-03T12:30:00+01:00,high,6\n'    // row 6 non-numeric
      + 'b,2026-02-30T12:30:00+01:00,1,6\n'       // row 7 impossible date
      + 'b,2026-03-04T09:00:00+01:00,1\n'         // row 8 ragged
      + ',2026-03-04T09:00:00+01:00,1,2\n';       // row 9 no person
    const r = importText(csv, LONG);
    expect(r.panel).not.toBeNull();
    const p = r.panel!;
    expect(p.variables).toEqual(['stress', 'sleep']);
    expect(p.persons.map((x) => x.id)).toEqual(['a', 'b']);
    const a = p.persons[0];
    expect(Array.from(a.time)).toEqual([0, 4]);
    expect(Number.isNaN(a.values[1])).toBe(true);
    expect(a.values[2]).toBe(3);
    const b = p.persons[1];
    expect(Array.from(b.time)).toEqual([23.5, 27.5]);
    expect(Array.from(b.day!)).toEqual([0, 0]);
    expect(Number.isNaN(b.values[0]) && Number.isNaN(b.values[2])).toBe(true);
    expect(r.summary.rows).toBe(8);
    expect(r.summary.kept).toBe(4);
    expect(r.summary.refused).toBe(4);
    expect(r.summary.unsortedPersons).toBe(1);
    const at = (row: number) => r.issues.filter((i) => i.row === row);
    expect(at(4)[0]).toMatchObject({ column: 'when', action: 'row refused' });
    expect(at(4)[0].message).toMatch(/row 3/);
    expect(at(6)[0]).toMatchObject({ column: 'stress', action: 'cell set missing' });
    expect(at(7)[0]).toMatchObject({ column: 'when', action: 'row refused' });
    expect(at(7)[0].message).toMatch(/impossible day 30/);
    expect(at(8)[0].message).toMatch(/3 cells where the header has 4/);
    expect(at(9)[0]).toMatchObject({ column: 'pid', action: 'row refused' });
    expect(r.summary.missing).toEqual([{ variable: 'stress', missing: 2, total: 4 }, { variable: 'sleep', missing: 1, total: 4 }]);
    expect(p.origin).toBe('2026-03-02T08:00:00.000Z');
  });

  it('reads numeric times in a unit, day and prompt columns, tab-separated', () => {
    const tsv = 'id\tminutes\tday\tbeep\tmood\n1\t600\t1\t1\t4\n1\t780\t1\t2\t5\n1\t2040\t2\t1\t3\n';
    const r = importText(tsv, { format: 'long', person: 'id', time: 'minutes', timeInputUnit: 'min', timeUnit: 'h', day: 'day', prompt: 'beep', variables: [{ column: 'mood', variable: 'mood' }] });
    const s = r.panel!.persons[0];
    expect(Array.from(s.time)).toEqual([10, 13, 34]);
    expect(Array.from(s.day!)).toEqual([0, 0, 1]);
    expect(Array.from(s.prompt!)).toEqual([0, 1, 0]);
    expect(r.summary.notes.join(' ')).toMatch(/numbers in min/);
  });

  it('imports wide panel data with wave times per person', () => {
    const csv = 'person,time_1,time_2,time_3,stress_1,stress_2,stress_3\np1,0,1.5,4,2,3,NA\np2,0,2,3.5,1,,2\n';
    const map = suggestMapping(readHeader(csv).fields, [{ id: 'stress' }], 'year');
    expect(map.format).toBe('wide');
    const r = importText(csv, map);
    expect(r.panel!.persons[1].time).toEqual(Float64Array.from([0, 2, 3.5]));
    expect(r.summary.missing[0]).toEqual({ variable: 'stress', missing: 2, total: 6 });
  });

  it('refuses a file whose header does not have the mapped columns, naming them and hinting at the delimiter', () => {
    const r = importText('pid;when;stress;sleep\na;1;2;3\n', LONG, { delimiter: ',' });
    expect(r.panel).toBeNull();
    expect(r.issues[0].action).toBe('file refused');
    expect(r.issues[0].message).toMatch(/person column "pid" is not in the file.*delimiter/);
  });

  it('suggests a long mapping by column names, ids and labels', () => {
    const m = suggestMapping(['Participant', 'Timestamp', 'Beep', 'Stress level', 'hours_slept'], [{ id: 'stress', label: 'Stress level' }, { id: 'sleep', label: 'hours slept' }], 'h');
    expect(m).toMatchObject({ format: 'long', person: 'Participant', time: 'Timestamp', prompt: 'Beep' });
    expect(m.variables).toEqual([{ column: 'Stress level', variable: 'stress' }, { column: 'hours_slept', variable: 'sleep' }]);
  });
});
