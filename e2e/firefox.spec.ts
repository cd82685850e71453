/**
 * The main paths of the app in Firefox (Debian's Firefox ESR, driven over the
 * standard WebDriver BiDi protocol by `helpers/firefox.ts`): the example
 * opens without errors, a variable is added and named with the keyboard, a
 * node is dragged, undo and redo work, the timescale view steps through every
 * band, and a reload restores the autosaved model from IndexedDB.
 */
import { expect, test } from '@playwright/test';
import { readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { parseModel } from '../src/core/model/schema';
import { breakpoints } from '../src/core/ordering/index';
import { modelAxis } from '../src/core/study/convert';
import { FIREFOX, Firefox, hasFirefox } from './helpers/firefox';

const MODEL_PATH = fileURLToPath(new URL('../src/examples/sleep-stress.json', import.meta.url));
const example = (() => { const r = parseModel(JSON.parse(readFileSync(MODEL_PATH, 'utf8'))); if (!r.ok) throw new Error('bad example'); return r.model; })();

const NODES = `document.querySelectorAll('.react-flow__node-variable').length`;
const MODEL = `window.__loopfold.model()`;
/** A form control in the inspector by the text of its label. */
const FIELD = (label: string) => `[...document.querySelectorAll('.lf-inspector label')].find((l) => l.textContent.trim().startsWith(${JSON.stringify(label)}))`;

test.describe.configure({ timeout: 180_000 });

test('the editor and the timescale view work in Firefox', async ({ baseURL }, testInfo) => {
  expect(hasFirefox(), `Firefox is needed for this test: ${FIREFOX} is missing (bash scripts/setup.sh installs firefox-esr)`).toBe(true);
  const ff = await Firefox.launch();
  try {
    const version = await ff.eval<string>('navigator.userAgent');
    testInfo.annotations.push({ type: 'browser', description: version });
    expect(version).toContain('Firefox/');

    await ff.goto(`${baseURL}/?example=sleep-stress`);
    expect(await ff.waitFor<number>(`${NODES} === ${example.variables.length} && ${NODES}`, 'the example’s nodes')).toBe(example.variables.length);
    expect(await ff.eval<string>(`document.querySelector('[role=note][aria-label=Caution]')?.textContent ?? ''`)).toContain('no clinical advice');
    // the helper brings the tab to the front: fields are left (blur) as in a window a person uses
    expect(await ff.eval<boolean>('document.hasFocus()'), 'the Firefox tab has the focus').toBe(true);

    // the timescale view: Home, then Page Up from band to band until End; every band is drawn once
    await ff.eval(`document.getElementById('lf-tab-timescales').click()`);
    const slider = await ff.waitFor<{ x: number; y: number }>(`(() => { const s = document.querySelector('[role=slider][aria-labelledby=lf-interval-label]'); if (!s) return null; const r = s.getBoundingClientRect(); return { x: Math.round(r.x + r.width / 2), y: Math.round(r.y + r.height / 2) }; })()`, 'the sampling-interval control');
    await ff.eval(`document.querySelector('[role=slider][aria-labelledby=lf-interval-label]').focus()`);
    await ff.press(['\uE011']); // Home
    const model = await ff.eval<typeof example>(MODEL);
    const ticks = breakpoints(model, modelAxis(model)).length;
    expect(await ff.eval<number>(`document.querySelectorAll('.lf-tick').length`)).toBe(ticks);
    const seen = new Set<string>();
    for (let i = 0; i <= ticks + 1; i++) {
      const band = await ff.waitFor<string>(`(() => { const f = document.querySelector('[aria-label="The ordering at the interval"]'); const s = document.querySelector('.lf-timescale'); return f && s && f.getAttribute('data-shown') === s.getAttribute('data-band') && f.querySelector('[data-node]') ? s.getAttribute('data-band') : null; })()`, `band ${i} drawn`);
      seen.add(band);
      await ff.press(['\uE00E']); // Page Up
    }
    expect(seen.size).toBe(ticks + 1);
    expect(slider.x).toBeGreaterThan(0);
    writeFileSync(testInfo.outputPath('firefox-timescales.png'), await ff.screenshot());

    await ff.eval(`document.getElementById('lf-tab-edit').click()`);

    // a new variable from the keyboard: click the empty canvas, press N, type its label
    const pane = await ff.eval<{ x: number; y: number }>(`(() => { const r = document.querySelector('.react-flow__pane').getBoundingClientRect(); return { x: Math.round(r.right - 60), y: Math.round(r.bottom - 60) }; })()`);
    await ff.click(pane.x, pane.y);
    await ff.press(['n']);
    await ff.waitFor(`${NODES} === ${example.variables.length + 1}`, 'a new node after pressing N');
    const label = await ff.eval<{ x: number; y: number }>(`(() => { const l = ${FIELD('Label')}; const c = l.control ?? l.querySelector('input'); const r = c.getBoundingClientRect(); return { x: Math.round(r.x + 20), y: Math.round(r.y + r.height / 2) }; })()`);
    await ff.click(label.x, label.y);
    await ff.press(['a'], ['\uE009']); // Ctrl+A: replace the default label
    await ff.type('Daylight');
    await ff.press(['\uE007']); // Enter stores the label (fields store on Enter or on leaving them)
    await ff.waitFor(`${MODEL}.variables.some((v) => v.label === 'Daylight')`, 'the label typed in the inspector');

    // drag the first variable: its position in the document moves with the pointer
    const first = example.variables[0].id;
    const before = await ff.eval<{ x: number; y: number }>(`${MODEL}.variables.find((v) => v.id === ${JSON.stringify(first)}).position`);
    const at = await ff.centre(`.react-flow__node[data-id="${first}"]`);
    await ff.drag(at, { x: at.x + 90, y: at.y + 40 }, 12);
    const after = await ff.waitFor<{ x: number; y: number }>(`(() => { const p = ${MODEL}.variables.find((v) => v.id === ${JSON.stringify(first)}).position; return p.x !== ${before.x} && p; })()`, 'the dragged position');
    expect(after.x - before.x).toBeGreaterThan(30);
    expect(after.y - before.y).toBeGreaterThan(10);

    // a link is picked by a click on its line (the links are drawn in one svg under the variables)
    const onLink = await ff.eval<{ x: number; y: number } | null>(`(() => {
      for (const g of document.querySelectorAll('.lf-link')) {
        const p = g.querySelector('.lf-link-line');
        const q = p.getPointAtLength(p.getTotalLength() / 2);
        const m = p.getScreenCTM();
        const x = q.x * m.a + q.y * m.c + m.e, y = q.x * m.b + q.y * m.d + m.f;
        if (document.elementFromPoint(x, y)?.closest('.lf-link') === g) return { x: Math.round(x), y: Math.round(y) };
      }
      return null;
    })()`);
    expect(onLink, 'a link with its middle free to click').not.toBeNull();
    await ff.click(onLink!.x, onLink!.y);
    await ff.waitFor(`document.querySelector('.lf-inspector h2')?.textContent === 'Link' && document.querySelectorAll('.lf-link.is-selected').length === 1`, 'a link picked by a click');

    // undo the drag, the label and the new variable; redo them all
    await ff.click(pane.x, pane.y);
    await ff.press(['z'], ['\uE009']);
    await ff.waitFor(`${MODEL}.variables.find((v) => v.id === ${JSON.stringify(first)}).position.x === ${before.x}`, 'the drag undone');
    for (let i = 0; i < 6 && (await ff.eval<number>(NODES)) > example.variables.length; i++) await ff.press(['z'], ['\uE009']);
    expect(await ff.eval<number>(NODES)).toBe(example.variables.length);
    for (let i = 0; i < 8 && !(await ff.eval<boolean>(`${MODEL}.variables.find((v) => v.id === ${JSON.stringify(first)}).position.x !== ${before.x}`)); i++) await ff.press(['z'], ['\uE009', '\uE008']);
    await ff.waitFor(`${MODEL}.variables.some((v) => v.label === 'Daylight') && ${MODEL}.variables.find((v) => v.id === ${JSON.stringify(first)}).position.x !== ${before.x}`, 'everything redone');

    // a reload restores the last state from IndexedDB
    await new Promise((r) => setTimeout(r, 1500)); // autosave is debounced
    await ff.goto(`${baseURL}/`);
    await ff.waitFor(`${NODES} === ${example.variables.length + 1}`, 'the autosaved model after reload');
    expect(await ff.eval<boolean>(`${MODEL}.variables.some((v) => v.label === 'Daylight')`)).toBe(true);
    writeFileSync(testInfo.outputPath('firefox-editor.png'), await ff.screenshot());

    const errors = ff.log.filter((e) => e.level === 'error');
    expect(errors, JSON.stringify(errors)).toEqual([]);
  } finally {
    await ff.close();
  }
});
