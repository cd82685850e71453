import { describe, expect, it } from 'vitest';
import { parse } from 'mathjs';
import { validateModel } from '../../src/state/validate';
import { emptyModel } from '../../src/state/changes';

/** The 1-based "(char N)" mathjs itself reports for a syntax error: the reference for our caret. */
function mathjsChar(text: string): number | undefined {
  try {
    parse(text);
    return undefined;
  } catch (e) {
    const m = /\(char (\d+)\)/.exec((e as Error).message);
    return m ? Number(m[1]) : undefined;
  }
}

describe('live checks of the document', () => {
  const model = {
    ...emptyModel(),
    variables: [
      { id: 'a', kind: 'input' as const },
      { id: 'b', kind: 'derived' as const, formula: 'a * (2 + ' },
      { id: 'c', kind: 'derived' as const, formula: 'a + ghost' },
      { id: 's', kind: 'state' as const, rate: 'a - s', timescale: 'a while' },
    ],
    links: [],
    relations: [{ id: 'r', equation: 'a = b = c' }],
  };
  const v = validateModel(model);

  it('places a syntax error where mathjs reports it', () => {
    const p = v.problems.find((x) => x.target === 'b')!;
    expect(p.field).toBe('formula');
    expect(p.position).toBe(mathjsChar('a * (2 + ')! - 1);
  });

  it('lists unknown names and locates schema problems by variable', () => {
    expect(v.problems.find((x) => x.target === 'c')!.unknown).toEqual(['ghost']);
    const ts = v.problems.find((x) => x.target === 's' && x.field === 'timescale')!;
    expect(ts.message).toMatch(/^variables\[3\]\.timescale: /);
    expect(v.model).toBeNull(); // the bad timescale fails the file schema
    expect(v.problems.find((x) => x.target === 'r')!.message).toMatch(/exactly one "="/);
    expect(v.problems.some((x) => x.target === 's' && x.field === 'rate')).toBe(false);
  });
});
