// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from 'vitest';
import { act } from 'react';
import { mount, unmountAll } from '../../helpers/mount';
import { LinkInspector, personSdCheck } from '../../../src/ui/inspector/LinkInspector';
import { documentStore, useModel } from '../../../src/state/document';
import { parseModelText } from '../../../src/core/model/schema';
import type { Model } from '../../../src/core/model/types';

afterEach(unmountAll);

function typeInto(input: HTMLInputElement, text: string) {
  const set = Object.getOwnPropertyDescriptor(HTMLInputElement.prototype, 'value')!.set!;
  act(() => { set.call(input, text); input.dispatchEvent(new Event('input', { bubbles: true })); });
}
const key = (input: HTMLElement, k: string) => act(() => { input.dispatchEvent(new KeyboardEvent('keydown', { key: k, bubbles: true })); });
const leave = (input: HTMLElement) => act(() => { input.dispatchEvent(new FocusEvent('focusout', { bubbles: true })); });

// A two-state scenario of our own: a pond's algae feed its snails.
const POND = JSON.stringify({
  format: 'loopfold-model', version: 1, name: 'Pond', timeUnit: 'day',
  variables: [{ id: 'algae', kind: 'state', timescale: '3 day' }, { id: 'snails', kind: 'state', timescale: '20 day' }],
  links: [{ from: 'algae', to: 'snails', kind: 'integrating', weight: 0.4 }],
});

/** The inspector as the app shows it: re-rendered from the document after each edit. */
function Live() {
  const m = useModel();
  return <LinkInspector link={m.links[0]} model={m} />;
}

function setUp(): { input: HTMLInputElement; host: HTMLElement; sd: () => number | undefined } {
  const r = parseModelText(POND);
  if (!r.ok) throw new Error('the test model does not load');
  documentStore.getState().load(r.model as Model);
  const model = documentStore.getState().history.present;
  const host = mount(<Live />);
  const label = [...host.querySelectorAll('label')].find((l) => l.textContent === 'Person SD of strength (optional)');
  if (!label) throw new Error('no person SD field');
  const input = host.querySelector<HTMLInputElement>(`#${CSS.escape(label.htmlFor)}`)!;
  expect(model.links[0].personSD).toBeUndefined();
  return { input, host, sd: () => documentStore.getState().history.present.links[0].personSD };
}

// Inspector fields store on Enter or when left, once, and bad text stays with its message (the project's rule for fields, common practice for form editors).
describe('link inspector: person SD of the strength', () => {
  it('stores on Enter through the document, one undo step that undo removes', () => {
    const { input, sd } = setUp();
    typeInto(input, '0.15');
    expect(sd()).toBeUndefined(); // nothing per keystroke
    key(input, 'Enter');
    expect(sd()).toBe(0.15);
    act(() => documentStore.getState().undo());
    expect(sd()).toBeUndefined();
    act(() => documentStore.getState().redo());
    expect(sd()).toBe(0.15);
  });

  it('stores when the field is left; empty removes it', () => {
    const { input, sd } = setUp();
    typeInto(input, '0.3');
    leave(input);
    expect(sd()).toBe(0.3);
    typeInto(input, '');
    key(input, 'Enter');
    expect(sd()).toBeUndefined();
  });

  it('keeps bad text in the field with a message naming the field, and stores nothing', () => {
    const { input, host, sd } = setUp();
    typeInto(input, 'wide');
    key(input, 'Enter');
    leave(input);
    expect(input.value).toBe('wide');
    expect(input.getAttribute('aria-invalid')).toBe('true');
    expect(host.querySelector('[role=alert]')?.textContent).toContain('Person SD of strength: "wide" is not a number');
    expect(sd()).toBeUndefined();
    typeInto(input, '-0.2');
    key(input, 'Enter');
    expect(host.querySelector('[role=alert]')?.textContent).toContain('Person SD of strength: -0.2 is negative');
    expect(sd()).toBeUndefined();
    key(input, 'Escape');
    expect(input.value).toBe('');
  });

  it('accepts what the model file accepts: empty or a finite number ≥ 0', () => {
    expect(personSdCheck('')).toBeNull();
    expect(personSdCheck('0')).toBeNull();
    expect(personSdCheck('1e-3')).toBeNull();
    expect(personSdCheck('Infinity')).toMatch(/not a number/);
    expect(personSdCheck('-1')).toMatch(/negative/);
  });
});

// The strength and its range share the person SD's way of storing (one helper in the inspector).
describe('link inspector: strength and strength range', () => {
  const field = (host: HTMLElement, text: string) => {
    const label = [...host.querySelectorAll('label')].find((l) => l.textContent === text);
    if (!label) throw new Error(`no field ${text}`);
    return host.querySelector<HTMLInputElement>(`#${CSS.escape(label.htmlFor)}`)!;
  };
  const link = () => documentStore.getState().history.present.links[0];

  it('the strength shows what the file holds and stores a new number on Enter, empty removes it', () => {
    const { host } = setUp();
    const input = field(host, 'Strength (optional)');
    expect(input.value).toBe('0.4');
    typeInto(input, '0.7');
    key(input, 'Enter');
    expect(link().weight).toBe(0.7);
    typeInto(input, '');
    leave(input);
    expect(link().weight).toBeUndefined();
  });

  it('a range low..high is stored when the field is left; a bad range stores nothing', () => {
    const { host } = setUp();
    const input = field(host, 'Strength range (optional)');
    typeInto(input, '0.2..0.9');
    leave(input);
    expect(link().strengthRange).toEqual({ low: 0.2, high: 0.9 });
    typeInto(input, 'wide');
    key(input, 'Enter');
    expect(link().strengthRange).toEqual({ low: 0.2, high: 0.9 });
  });
});
