// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from 'vitest';
import { act } from 'react';
import { mount, unmountAll } from '../../helpers/mount';
import { TextField } from '../../../src/ui/inspector/fields';

afterEach(unmountAll);

/** Type into a React-controlled input (the native value setter, then an input event). */
function typeInto(input: HTMLInputElement, text: string) {
  const set = Object.getOwnPropertyDescriptor(HTMLInputElement.prototype, 'value')!.set!;
  act(() => { set.call(input, text); input.dispatchEvent(new Event('input', { bubbles: true })); });
}
const key = (input: HTMLElement, k: string) => act(() => { input.dispatchEvent(new KeyboardEvent('keydown', { key: k, bubbles: true })); });

// Fields store on Enter or when left, once, never per keystroke (the project's rule for inspector fields, common practice for form editors).
describe('TextField', () => {
  it('stores the draft on Enter itself, without the field being left (a window without focus never blurs)', () => {
    const stored: string[] = [];
    const el = mount(<TextField label="Label" value="Old" onChange={(t) => stored.push(t)} />);
    const input = el.querySelector('input')!;
    typeInto(input, 'Daylight');
    expect(stored).toEqual([]);
    key(input, 'Enter');
    expect(stored).toEqual(['Daylight']);
  });
  it('stores once when Enter is followed by leaving the field before React renders again', () => {
    const stored: string[] = [];
    const finished: string[] = [];
    const el = mount(<TextField label="Label" value="Old" onChange={(t) => stored.push(t)} onBlur={(t) => finished.push(t)} />);
    const input = el.querySelector('input')!;
    typeInto(input, 'Daylight');
    act(() => {
      input.dispatchEvent(new KeyboardEvent('keydown', { key: 'Enter', bubbles: true }));
      input.dispatchEvent(new FocusEvent('focusout', { bubbles: true }));
    });
    expect(stored).toEqual(['Daylight']);
    expect(finished[0]).toBe('Daylight');
  });
  it('drops the draft on Escape', () => {
    const stored: string[] = [];
    const el = mount(<TextField label="Label" value="Old" onChange={(t) => stored.push(t)} />);
    const input = el.querySelector('input')!;
    typeInto(input, 'Dayl');
    key(input, 'Escape');
    expect(input.value).toBe('Old');
    key(input, 'Enter');
    expect(stored).toEqual([]);
  });
});
