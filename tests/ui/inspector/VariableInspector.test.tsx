// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from 'vitest';
import { act } from 'react';
import { mount, unmountAll } from '../../helpers/mount';
import { VariableInspector } from '../../../src/ui/inspector/VariableInspector';
import { documentStore, useModel } from '../../../src/state/document';
import { parseModelText } from '../../../src/core/model/schema';
import { DEFAULT_NOISE, DEFAULT_RELIABILITY } from '../../../src/core/study/convert';
import type { Model } from '../../../src/core/model/types';

afterEach(unmountAll);

function typeInto(input: HTMLInputElement, text: string) {
  const set = Object.getOwnPropertyDescriptor(HTMLInputElement.prototype, 'value')!.set!;
  act(() => { set.call(input, text); input.dispatchEvent(new Event('input', { bubbles: true })); });
}
const key = (input: HTMLElement, k: string) => act(() => { input.dispatchEvent(new KeyboardEvent('keydown', { key: k, bubbles: true })); });

// A two-state scenario of our own: a greenhouse's air warms its soil.
const GREENHOUSE = JSON.stringify({
  format: 'loopfold-model', version: 2, name: 'Greenhouse', timeUnit: 'h',
  variables: [{ id: 'air', kind: 'state', timescale: '20 min' }, { id: 'soil', kind: 'state', timescale: '6 h' }],
  links: [{ from: 'air', to: 'soil', kind: 'integrating', weight: 0.5 }],
});

/** The inspector of the first variable, re-rendered from the document after each edit. */
function Live() {
  const m = useModel();
  return <VariableInspector v={m.variables[0]} model={m} />;
}

function field(host: HTMLElement, name: string): { input: HTMLInputElement; message: () => string } {
  const label = [...host.querySelectorAll('label')].find((l) => l.textContent === name);
  if (!label) throw new Error(`no field "${name}"`);
  const input = host.querySelector<HTMLInputElement>(`#${CSS.escape(label.htmlFor)}`)!;
  return { input, message: () => host.querySelector(`#${CSS.escape(label.htmlFor)}-msg`)?.textContent ?? '' };
}

function setUp(): HTMLElement {
  const r = parseModelText(GREENHOUSE);
  if (!r.ok) throw new Error('the test model does not load');
  documentStore.getState().load(r.model as Model);
  return mount(<Live />);
}

const air = () => documentStore.getState().history.present.variables[0];

// Issue 14: process noise and reliability are edited in the inspector, each with a one-line explanation and its default;
// the same-interval network depends on the noise, the lagged effects do not (a property of the model: Φ = e^{AΔ} has no noise in it).
describe('variable inspector: process noise and reliability of the measurement', () => {
  it('explain what each changes and state the defaults', () => {
    const host = setUp();
    const noise = field(host, 'Process noise');
    expect(noise.input.placeholder).toBe(`default ${DEFAULT_NOISE}`);
    expect(noise.message()).toMatch(/same-interval network/);
    expect(noise.message()).toMatch(/lagged effects do not depend on it/);
    expect(noise.message()).toContain(`default ${DEFAULT_NOISE}`);
    const rel = field(host, 'Reliability of its measurement');
    expect(rel.input.placeholder).toContain(`default ${DEFAULT_RELIABILITY}`);
    expect(rel.message()).toMatch(/shrink towards zero/);
  });

  it('store on Enter (one undo step each); bad values stay with a message and change nothing', () => {
    const host = setUp();
    const noise = field(host, 'Process noise');
    typeInto(noise.input, '-2');
    key(noise.input, 'Enter');
    expect(noise.message()).toMatch(/must not be negative/);
    expect(air().noise).toBeUndefined();
    typeInto(noise.input, '0.25');
    key(noise.input, 'Enter');
    expect(air().noise).toBe(0.25);

    const rel = field(host, 'Reliability of its measurement');
    typeInto(rel.input, '1.5');
    key(rel.input, 'Enter');
    expect(rel.message()).toMatch(/must be above 0 and at most 1/);
    expect(air().reliability).toBeUndefined();
    typeInto(rel.input, '0.8');
    key(rel.input, 'Enter');
    expect(air().reliability).toBe(0.8);

    act(() => documentStore.getState().undo());
    expect([air().noise, air().reliability]).toEqual([0.25, undefined]);
    act(() => documentStore.getState().undo());
    expect(air().noise).toBeUndefined();
    // empty removes it again: the default holds
    act(() => documentStore.getState().redo());
    typeInto(field(host, 'Process noise').input, '');
    key(field(host, 'Process noise').input, 'Enter');
    expect(air().noise).toBeUndefined();
  });
});
