// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from 'vitest';
import { act } from 'react';
import { mount, unmountAll } from '../../helpers/mount';
import { renderToStaticMarkup } from 'react-dom/server';
import { CommutationPanelFor, HoldControl } from '../../../src/ui/interventions/index';
import { releaseAllHolds, setHold } from '../../../src/ui/interventions/holds';
import { currentStudy, startSession } from '../../../src/state/session';
import { analysisStore, setStudyDesign } from '../../../src/state/analysis';
import { documentStore } from '../../../src/state/document';
import { parseModel } from '../../../src/core/model/schema';
import greenhouse from '../../../src/examples/greenhouse.json';


const model = (() => {
  const r = parseModel(greenhouse);
  if (!r.ok) throw new Error('example does not load');
  return r.model;
})();

afterEach(() => {
  unmountAll();
  releaseAllHolds();
  setStudyDesign({});
});

describe('HoldControl', () => {
  it('holds the chosen variable at the typed value and puts it into the study design', () => {
    act(() => documentStore.getState().load(model));
    // The app shell keeps the analysis design in step with the session's study.
    const stop = startSession();
    const el = mount(<HoldControl />);
    const select = el.querySelector('select')!;
    const input = el.querySelector('input')!;
    act(() => {
      select.value = 'heater';
      select.dispatchEvent(new Event('change', { bubbles: true }));
    });
    act(() => {
      const set = Object.getOwnPropertyDescriptor(HTMLInputElement.prototype, 'value')!.set!;
      set.call(input, '0');
      input.dispatchEvent(new Event('input', { bubbles: true }));
    });
    act(() => el.querySelector('form')!.dispatchEvent(new Event('submit', { bubbles: true, cancelable: true })));
    expect(currentStudy()?.holds).toEqual({ heater: 0 });
    // the hold is part of the study in the document: saved with it, undone with it
    expect(documentStore.getState().history.present.study?.holds).toEqual({ heater: 0 });
    expect(analysisStore.getState().design.hold).toEqual({ heater: 0 });
    expect(el.textContent).toMatch(/Heating power = 0/);
    act(() => (el.querySelector('button[aria-label="Release Heating power"]') as HTMLButtonElement).click());
    expect(analysisStore.getState().design.hold).toBeUndefined();
    stop();
  });

  it('refuses a value that is not a number, in words', () => {
    act(() => documentStore.getState().load(model));
    const el = mount(<HoldControl />);
    const input = el.querySelector('input')!;
    act(() => {
      const set = Object.getOwnPropertyDescriptor(HTMLInputElement.prototype, 'value')!.set!;
      set.call(input, 'warm');
      input.dispatchEvent(new Event('input', { bubbles: true }));
    });
    expect(el.querySelector('[role="alert"]')!.textContent).toMatch(/must be a number/);
    expect((el.querySelector('button[type="submit"]') as HTMLButtonElement).disabled).toBe(true);
  });
});

describe('CommutationPanel', () => {
  it('shows the verdict in words and glyph, the ambiguity and the differing links (greenhouse heater held, hourly)', () => {
    const html = renderToStaticMarkup(<CommutationPanelFor model={model} design={{ interval: 60, samples: 50, hold: { heater: 0 } }} />);
    expect(html).toMatch(/The two orders differ\./);
    expect(html).toContain('≠');
    expect(html).toMatch(/Ambiguous in the equilibrium model/);
    expect(html).toMatch(/Links that differ/);
  });

  it('says the orders agree where nothing settles (every minute)', () => {
    const html = renderToStaticMarkup(<CommutationPanelFor model={model} design={{ interval: 1, samples: 50, hold: { heater: 0 } }} />);
    expect(html).toMatch(/The two orders agree\./);
  });

  it('with formulas, shows how the equilibrium moves when held (greenhouse heater off: the air cools)', () => {
    const html = renderToStaticMarkup(<CommutationPanelFor model={model} design={{ interval: 60, samples: 50, hold: { heater: 0 } }} />);
    expect(html).toMatch(/the equilibrium held/);
    // Hand-derived from the example: heater off ⇒ 0 = (8 − T)/12 + 0.3·0.36 ⇒ T = 9.296 (from 15.03).
    expect(html).toMatch(/Air temperature: 15\.03 → 9\.296/);
  });

  it('asks for a hold first', () => {
    expect(renderToStaticMarkup(<CommutationPanelFor model={model} design={{ interval: 60 }} />)).toMatch(/Hold a variable/);
  });

  it('releases a hold when the document no longer has the variable', () => {
    act(() => documentStore.getState().load(model));
    const stop = startSession();
    act(() => setHold('vent', 1));
    expect(analysisStore.getState().design.hold).toEqual({ vent: 1 });
    // deleting the variable releases its hold (one edit, undone together)
    act(() => documentStore.getState().apply({ type: 'remove', variables: ['vent'] }));
    expect(currentStudy()?.holds).toEqual({});
    expect(analysisStore.getState().design.hold).toBeUndefined();
    act(() => documentStore.getState().undo());
    expect(currentStudy()?.holds).toEqual({ vent: 1 });
    stop();
  });

  it('the session stops when asked', () => {
    act(() => documentStore.getState().load(model));
    const stop = startSession();
    setHold('vent', 1);
    expect(analysisStore.getState().design.hold).toEqual({ vent: 1 });
    stop();
    setHold('vent', 2);
    expect(analysisStore.getState().design.hold).toEqual({ vent: 1 });
  });
});
