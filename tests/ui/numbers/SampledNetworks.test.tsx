// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from 'vitest';
import { act } from 'react';
import { mount, unmountAll } from '../../helpers/mount';
import { renderToStaticMarkup } from 'react-dom/server';
import { parseModel } from '../../../src/core/model/schema';
import type { Model } from '../../../src/core/model/types';
import { documentStore, selectModel } from '../../../src/state/document';
import { sampledOf, timescalesOfModel, type SampledAnswer, type TimescalesAnswer } from '../../../src/core/numeric/answers';
import { SampledNetworks } from '../../../src/ui/numbers/SampledNetworks';
import { TimescalesTable } from '../../../src/ui/numbers/TimescalesTable';
import { TimeChart } from '../../../src/ui/numbers/TimeChart';
import { LinkCurveChart } from '../../../src/ui/numbers/LinkCurveChart';
import { laggedNetwork, linkCurveChart, timeSeriesChart } from '../../../src/export/charts';
import type { El } from '../../../src/export/scene';
import { svgDocument } from '../../../src/export/svg';
import { curveOf, type CurveAnswer } from '../../../src/core/numeric/answers';
import { vi } from 'vitest';


function load(json: unknown): Model {
  const r = parseModel(json);
  if (!r.ok) throw new Error('test model does not load');
  return r.model;
}

// A swinging pair, invented for this test: a shop's stock and its orders chase each other,
// d stock/dt = orders, d orders/dt = −stock − 0.1·orders (eigenvalues −0.05 ± 0.99875i).
const swing = load({
  format: 'loopfold-model', version: 1, name: 'swing', timeUnit: 'day',
  variables: [
    { id: 'stock', kind: 'state', initial: 1, rate: 'orders' },
    { id: 'orders', kind: 'state', initial: 0, timescale: '1 day', rate: '-stock - 0.1 * orders' },
  ],
  links: [],
});

/**
 * The element on screen is the exporter's element: same tag, every attribute of the file with the same
 * value, the same children in order; `extra` names what the screen adds (interaction, CSS hooks).
 */
function expectSamePicture(dom: Element, e: El, extra: (name: string, dom: Element) => boolean): void {
  expect(dom.tagName.toLowerCase()).toBe(e.tag.toLowerCase());
  for (const [k, v] of Object.entries(e.attrs)) {
    if (v === undefined) continue;
    if (k === 'class') expect(dom.getAttribute('class')?.split(' ')).toEqual(expect.arrayContaining(String(v).split(' ')));
    else if (!extra(k, dom)) expect(dom.getAttribute(k), `${e.tag} ${k}`).toBe(String(v)); // the screen may replace what `extra` allows
  }
  for (const a of [...dom.attributes]) if (!(a.name in e.attrs) && e.attrs[a.name] === undefined) expect(extra(a.name, dom), `${e.tag} has ${a.name} on screen only`).toBe(true);
  const kids = (e.children ?? []).filter((c): c is El => typeof c !== 'string');
  expect(dom.children.length).toBe(kids.length);
  kids.forEach((k, i) => expectSamePicture(dom.children[i], k, extra));
  if (kids.length === 0) expect(dom.textContent).toBe((e.children ?? []).join(''));
}

afterEach(() => {
  unmountAll();
});
describe('Numbers pane parts', () => {
  it('"use derived timescale" writes the derived value into the state as one undo step', () => {
    documentStore.getState().load(swing);
    const model = selectModel(documentStore.getState());
    const ts = timescalesOfModel(model) as TimescalesAnswer;
    expect(ts.ok).toBe(true);
    const el = mount(<TimescalesTable model={model} answer={ts} />);
    const buttons = [...el.querySelectorAll('button')].filter((b) => b.textContent === 'use derived timescale');
    // Only the stock has no timescale of its own.
    expect(buttons).toHaveLength(1);
    expect(buttons[0].closest('tr')?.getAttribute('data-state')).toBe('stock');
    const before = documentStore.getState().history.past.length;
    act(() => buttons[0].click());
    const after = selectModel(documentStore.getState());
    // Both states share the one swinging mode: 1/|Re λ| = 1/0.05 = 20 days (common practice: time constant of a damped mode).
    expect(after.variables.find((v) => v.id === 'stock')?.timescale).toBe('20 days');
    expect(documentStore.getState().history.past.length).toBe(before + 1);
  });

  it('sampling slower than half the period flags aliasing: π/|Im λ| = π/0.99875 ≈ 3.146 days (Nyquist; common practice)', () => {
    const slow = sampledOf(swing, 4) as SampledAnswer;
    const fast = sampledOf(swing, 3) as SampledAnswer;
    const html = (a: SampledAnswer) => renderToStaticMarkup(<SampledNetworks model={swing} answer={a} />);
    expect(html(slow)).toContain('alias and can change sign');
    expect(html(slow)).toContain('3.15 days');
    expect(html(fast)).not.toContain('alias');
  });

  it('the lagged network labels each edge with Φ(Δ) = expm(AΔ) entries (closed form for this pair, common practice)', () => {
    const a = sampledOf(swing, 1) as SampledAnswer;
    const el = mount(<SampledNetworks model={swing} answer={a} />);
    // Φ(Δ)[stock, orders] = e^{−0.05Δ} sin(ωΔ)/ω with ω = √(1 − 0.0025) (damped oscillator, closed form).
    const w = Math.sqrt(1 - 0.0025);
    const expected = (Math.exp(-0.05) * Math.sin(w)) / w;
    const edge = el.querySelector('[data-edge="orders>stock"] text');
    expect(edge?.textContent).toBe(expected.toFixed(2));
  });

  it('the time chart draws one panel per series with distinct dash patterns and one marker per sample and series', () => {
    const times = Array.from({ length: 11 }, (_, k) => k);
    const el = mount(
      <TimeChart times={times} timeUnit="day" samples={[0, 5, 10]} series={[{ id: 'a', name: 'A', values: times.map((t) => t * t) }, { id: 'b', name: 'B', values: times.map((t) => -t) }]} />,
    );
    const lines = el.querySelectorAll('polyline');
    expect(lines).toHaveLength(2);
    expect(lines[0].getAttribute('stroke-dasharray')).not.toBe(lines[1].getAttribute('stroke-dasharray'));
    expect(el.querySelectorAll('circle.lf-chart-sample')).toHaveLength(6);
    expect(el.textContent).toContain('time since the start (day)');
  });

  it('the pane shows the exporter\'s picture: the time chart, the curve and the lagged network are the file\'s elements', () => {
    const times = Array.from({ length: 11 }, (_, k) => k);
    const input = { times, timeUnit: 'day', samples: [0, 5, 10], series: [{ id: 'a', name: 'A <x>', values: times.map((t) => t * t) }] };
    const cssHook = (n: string) => n === 'class';
    expectSamePicture(mount(<TimeChart {...input} />).querySelector('svg')!, timeSeriesChart(input), cssHook);
    unmountAll();
    const curve = (curveOf(swing, 'stock', 'orders') as CurveAnswer).curve;
    const c = { model: swing, curve, breakpoints: [2], current: 1 };
    expectSamePicture(mount(<LinkCurveChart {...c} />).querySelector('svg')!, linkCurveChart(c), cssHook);
    unmountAll();
    const a = sampledOf(swing, 1) as SampledAnswer;
    const el = mount(<SampledNetworks model={swing} answer={a} onPick={() => {}} />);
    // the clickable links: a button role, focus and a name (the screen's additions); the figure a group of them
    expectSamePicture(el.querySelector('svg.lf-num-network')!, laggedNetwork(swing, a, false, { pickable: true })!, (n, d) => n === 'class' || (d.tagName.toLowerCase() === 'svg' && n === 'role') || (d.hasAttribute('data-edge') && ['role', 'tabindex', 'aria-label'].includes(n)));
    expect(el.querySelector('svg.lf-num-network')?.getAttribute('role')).toBe('group');
    // the name begins with the weight written on the link (WCAG 2.5.3, label in name)
    const pick = el.querySelector('[data-edge="orders>stock"]')!;
    const weight = pick.querySelector('.lf-net-weight')!.textContent!;
    expect(pick.getAttribute('aria-label')).toBe(`${weight} orders → stock: show against the interval`);
  });

  it('"Export … as SVG" saves the drawing with its heading and caption', async () => {
    const a = sampledOf(swing, 1) as SampledAnswer;
    const saved: Blob[] = [];
    const create = vi.spyOn(URL, 'createObjectURL').mockImplementation((b) => { saved.push(b as Blob); return 'blob:test'; });
    const revoke = vi.spyOn(URL, 'revokeObjectURL').mockImplementation(() => {});
    try {
      const el = mount(<SampledNetworks model={swing} answer={a} caption="every day & night" />);
      const button = el.querySelector<HTMLButtonElement>('button[aria-label="Export the lagged network as SVG"]');
      expect(button).not.toBeNull();
      act(() => button!.click());
      expect(saved).toHaveLength(1);
      expect(await saved[0].text()).toBe(svgDocument(laggedNetwork(swing, a, false, { heading: true, caption: 'every day & night' })!));
      expect(el.querySelector('button[aria-label="Export the same-interval network as PNG 2×"]')).not.toBeNull();
    } finally {
      create.mockRestore();
      revoke.mockRestore();
    }
  });
});
