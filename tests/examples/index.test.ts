import { describe, expect, it } from 'vitest';
import { EXAMPLES } from '../../src/examples/index';
import { parseModel } from '../../src/core/model/schema';

describe('example gallery', () => {
  it.each(EXAMPLES.map((e) => [e.id, e] as const))('%s is a valid model file', (_id, e) => {
    const r = parseModel(e.model);
    if (!r.ok) throw new Error(r.issues.map((i) => `${i.path} ${i.message}`).join('\n'));
    expect(r.model.name.length).toBeGreaterThan(0);
  });
  it('the evening-unrest example carries a caution', () => {
    const r = parseModel(EXAMPLES.find((e) => e.id === 'evening-unrest')!.model);
    expect(r.ok && r.model.caution).toMatch(/no clinical advice/);
  });
  it('the clinical example carries a caution', () => {
    const r = parseModel(EXAMPLES.find((e) => e.id === 'sleep-stress')!.model);
    expect(r.ok && r.model.caution).toMatch(/no clinical advice/);
  });
});
