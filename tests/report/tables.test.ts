import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { bandsCsv, breakpointsCsv } from '../../src/report/tables';
import { bands, breakpoints } from '../../src/core/ordering/index';
import { parseModel } from '../../src/core/model/schema';
import { EXAMPLES } from '../../src/examples/index';
import { runPython } from '../helpers/python';

const SCRIPT = fileURLToPath(new URL('../present/csv_reference.py', import.meta.url));
const parse = (texts: string[]) => runPython<{ parsed: string[][] }[]>(SCRIPT, texts.map((text) => ({ rows: [], text }))).map((a) => a.parsed);

describe('report tables as CSV, read back by Python csv', () => {
  it('one row per band and variable, and per breakpoint change, with the values of the ordering core', () => {
    const models = EXAMPLES.map((e) => {
      const r = parseModel(e.model);
      if (!r.ok) throw new Error(e.id);
      return r.model;
    });
    const texts = models.flatMap((m) => [bandsCsv(m, { samples: 50 }), breakpointsCsv(m, { samples: 50 })]);
    const parsed = parse(texts);
    models.forEach((m, i) => {
      const [b, bp] = [parsed[2 * i], parsed[2 * i + 1]];
      const bds = bands(m, { samples: 50 });
      expect(b[0]).toEqual(['band', 'from', 'to', 'from_included', 'to_included', 'variable', 'label', 'role']);
      expect(b.length - 1).toBe(bds.length * m.variables.length);
      for (const row of b.slice(1)) {
        const band = bds[Number(row[0]) - 1];
        expect(Number(row[1])).toBe(band.from);
        expect(Number(row[2])).toBe(band.to);
        expect(row[7]).toBe(band.roles[row[5]]);
      }
      const changes = breakpoints(m, { samples: 50 }).flatMap((p) => p.changes.map((c) => [String(p.interval), c.variable, c.reason]));
      expect(bp.slice(1).map((r) => [r[0], r[2], r[5]])).toEqual(changes.map(([a, v, why]) => [String(Number(a)), v, why]));
    });
  });
});
