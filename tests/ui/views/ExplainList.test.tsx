// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from 'vitest';
import { act } from 'react';
import { mount, rerender, unmountAll } from '../../helpers/mount';
import { ExplainList, SHOWN_PER_TOPIC } from '../../../src/ui/views/ExplainList';
import { explainOrdering } from '../../../src/core/view/explain';
import { breakpoints, orderingAt } from '../../../src/core/ordering/index';
import { generatedSketch as generatedModel } from '../../helpers/sketches';

afterEach(unmountAll);

// a generated sketch of 300 variables (the benchmark's generator): at a middle interval dozens settle and freeze
const model = generatedModel(300);
const design = (() => { const bps = breakpoints(model, { samples: 50 }); return { interval: bps[Math.floor(bps.length / 2)].interval * 1.01, samples: 50 }; })();
const lines = explainOrdering(model, orderingAt(model, design), design, breakpoints(model, { samples: 50 }));
const count = (topic: string) => lines.filter((l) => l.topic === topic).length;

describe('the explanation list of a big model', () => {
  it('shows the first lines of each topic and folds the rest behind one disclosure per topic, drawn only when opened', () => {
    expect(count('settled')).toBeGreaterThan(SHOWN_PER_TOPIC);
    const el = mount(<ExplainList lines={lines} />);
    const shown = (topic: string) => el.querySelectorAll(`:scope > ul > li[data-topic="${topic}"]`).length;
    for (const topic of new Set(lines.map((l) => l.topic))) expect(shown(topic)).toBe(Math.min(SHOWN_PER_TOPIC, count(topic)));
    const more = el.querySelector('li[data-topic="settled-more"]')!;
    expect(more.querySelector('summary')!.textContent).toContain(`${count('settled') - SHOWN_PER_TOPIC} more`);
    expect(more.querySelectorAll('li')).toHaveLength(0); // not drawn while closed
    const details = more.querySelector<HTMLDetailsElement>('details')!;
    act(() => { details.open = true; details.dispatchEvent(new Event('toggle')); });
    const hidden = lines.filter((l) => l.topic === 'settled').slice(SHOWN_PER_TOPIC).map((l) => l.text);
    expect([...more.querySelectorAll('li')].map((li) => li.textContent)).toEqual(hidden);
    // every line of the band is reachable: shown at the top level or counted in a disclosure
    const top = el.querySelectorAll(':scope > ul > li:not(.lf-explain-more)').length;
    const folded = [...el.querySelectorAll('li.lf-explain-more summary')].reduce((n, m) => n + Number(/^\d+/.exec(m.textContent!)![0]), 0);
    expect(top + folded).toBe(lines.length);
  });

  it('a small model’s lines are all shown, with no disclosure', () => {
    const few = lines.filter((l) => l.topic === 'summary' || l.topic === 'nearby');
    const el = mount(<ExplainList lines={few} />);
    expect(el.querySelectorAll('li')).toHaveLength(few.length);
    expect(el.querySelector('details')).toBeNull();
  });

  it('an opened disclosure stays open when the band changes', () => {
    const el = mount(<ExplainList lines={lines} />);
    const details = el.querySelector<HTMLDetailsElement>('li[data-topic="settled-more"] details')!;
    act(() => { details.open = true; details.dispatchEvent(new Event('toggle')); });
    const other = lines.map((l) => (l.topic === 'settled' ? { ...l, text: `${l.text} (next band)` } : l));
    rerender(<ExplainList lines={other} />);
    const now = el.querySelector<HTMLDetailsElement>('li[data-topic="settled-more"] details')!;
    expect(now.open).toBe(true);
    expect(now.querySelector('li')!.textContent).toContain('(next band)');
  });
});
