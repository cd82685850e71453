/**
 * What the report says and in which words, for every example: the tool's version and the date under the
 * title, held variables stated before anything else, then the specification (variables with kind, timescale
 * and formula; links with sign), and prose in the modeller's labels — never an equation id such as
 * `formula(fatigue)` or `rate(mood)`. "Held" (by an intervention) and "frozen" (by slowness) are two words:
 * a held variable is never called frozen. Read back by Python's html.parser (html_reference.py).
 * Captions add to the title of an ordering figure rather than repeat it.
 */
import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { buildReport } from '../../src/report/html';
import { bands, orderingAt } from '../../src/core/ordering/index';
import { orderingView } from '../../src/core/view/derive';
import { parseModel } from '../../src/core/model/schema';
import type { Model } from '../../src/core/model/types';
import { EXAMPLES } from '../../src/examples/index';
import { viewCaption } from '../../src/export/caption';
import { bandInterval } from '../../src/report/html';
import { runPython } from '../helpers/python';

const SCRIPT = fileURLToPath(new URL('./html_reference.py', import.meta.url));
type Read = { errors: string[]; text: string; titles: string[] };
const read = (html: string) => runPython<Read>(SCRIPT, { html });

function example(id: string): Model {
  const r = parseModel(EXAMPLES.find((e) => e.id === id)!.model);
  if (!r.ok) throw new Error(`example ${id} does not load`);
  return r.model;
}

/** An input of the example to hold (the first one), at 0. */
const heldOf = (m: Model) => m.variables.find((v) => v.kind === 'input' || v.kind === 'derived')!;

describe('the report: contents and words, every example', () => {
  for (const ex of EXAMPLES) {
    it(`${ex.id}: version and date, held variables first, the specification, labels not equation ids, held never called frozen`, async () => {
      const m = example(ex.id);
      const held = heldOf(m);
      const label = held.label ?? held.id;
      const html = await buildReport(m, { hold: { [held.id]: 0 }, generated: '2026-12-05', version: '9.8.7' });
      const r = read(html);
      expect(r.errors).toEqual([]);
      const t = r.text.replace(/\s+/g, ' ');
      expect(t).toMatch(/Loopfold 9\.8\.7 report: .*2026-12-05/);
      // held variables stated before the specification
      const heldAt = t.indexOf('Held (fixed by an intervention) throughout this report:');
      expect(heldAt).toBeGreaterThan(-1);
      expect(t.indexOf(`${label} = 0`, heldAt)).toBeLessThan(t.indexOf('Model specification'));
      expect(r.titles.slice(0, 2)).toEqual(['Model specification', 'The interval axis at a glance']);
      // the specification: every variable with its id and kind, every state's timescale, the links' signs (cells read back in order)
      const esc = (x: string) => x.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
      for (const v of m.variables) expect(t, v.id).toMatch(new RegExp(`${esc(v.label ?? v.id)}\\s*${esc(v.id)}\\s*${v.kind}`));
      for (const v of m.variables.filter((x) => x.kind === 'state' && typeof x.timescale === 'string')) expect(t).toMatch(new RegExp(`${esc(v.id)}\\s*state\\s*${esc(String(v.timescale))}`));
      expect(t).toMatch(/Links \(\d+\)\s*from\s*to\s*acts\s*sign\s*strength/);
      // no equation ids anywhere in the prose
      expect(t).not.toMatch(/\b(formula|rate|relation)\([A-Za-z_]/);
      // the band by band prose names variables by their labels, not their ids (the relations' own equations aside)
      let bandsText = read(html.slice(html.indexOf('<details class="band-details"'))).text;
      for (const rel of m.relations ?? []) bandsText = bandsText.split(rel.equation).join(' ');
      // labels out first ("Customer demand" holds the word "demand")
      for (const v of [...m.variables].sort((a, b) => (b.label ?? '').length - (a.label ?? '').length)) if (v.label) bandsText = bandsText.split(v.label).join(' ');
      // words of the tool's own sentences are not ids even when a variable is called so (the warehouse's "orders")
      bandsText = bandsText.replace(/both orders give/g, ' ');
      for (const v of m.variables) {
        if (!v.label || v.label === v.id) continue;
        expect(bandsText, `${ex.id}: the id ${v.id} in the band prose`).not.toMatch(new RegExp(`(^|[^A-Za-z0-9_])${esc(v.id)}($|[^A-Za-z0-9_])`));
      }
      // "frozen" never names the held variable (outside the sentence that defines the two words)
      const prose = t.replace('“Frozen” below means constant by slowness; “held” means fixed by the intervention.', '');
      for (const s of prose.split(/(?<=[.;:])\s/)) if (/frozen/i.test(s)) expect(s.includes(`${label} frozen`) || s.includes(`${label} is frozen`), s).toBe(false);
    }, 180_000);
  }

  it('the caption of an ordering figure adds to its title: it never repeats the title', () => {
    for (const ex of EXAMPLES) {
      const m = example(ex.id);
      for (const b of bands(m)) {
        const interval = bandInterval(b);
        const vm = orderingView(m, orderingAt(m, { interval, samples: 50 }), { mode: 'ordering', interval, samples: 50 });
        const cap = viewCaption(vm);
        expect(cap.length, `${ex.id} at ${interval}`).toBeGreaterThan(0);
        expect(cap.includes(vm.title), `${ex.id} at ${interval}: ${cap}`).toBe(false);
        expect(vm.title.includes(cap), `${ex.id} at ${interval}`).toBe(false);
      }
    }
  });
});
