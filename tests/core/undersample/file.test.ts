import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { edgeList, graphFileText, parseGraphText, stepGraphOfModel } from '../../../src/core/undersample/index';
import { parseModelText } from '../../../src/core/model/schema';

const text = (x: unknown) => JSON.stringify(x);

describe('graph files', () => {
  it('reads names or a count, edges by name or 1-based number, self-loops for all', () => {
    const r = parseGraphText(text({ format: 'loopfold-graph', version: 1, variables: ['sleep', 'stress', 'mood'], directed: [['sleep', 'stress'], [2, 3]], bidirected: [['sleep', 'mood']], selfLoops: true, rate: 2 }));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(edgeList(r.file.graph)).toEqual({
      directed: [['sleep', 'sleep'], ['sleep', 'stress'], ['stress', 'stress'], ['stress', 'mood'], ['mood', 'mood']],
      bidirected: [['sleep', 'mood']],
    });
    expect(r.file.rate).toBe(2);
    const c = parseGraphText(text({ format: 'loopfold-graph', version: 1, variables: 3, directed: [[1, 2], ['2', '3']] }));
    expect(c.ok && edgeList(c.file.graph).directed).toEqual([['1', '2'], ['2', '3']]);
  });

  it('writes what it reads', () => {
    const src = { format: 'loopfold-graph', version: 1, name: 'x', variables: ['a', 'b'], directed: [['a', 'b'], ['b', 'b']], bidirected: [['a', 'b']], rate: 3 };
    const r = parseGraphText(text(src));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(JSON.parse(graphFileText(r.file.graph, { name: 'x', rate: 3 }))).toEqual(src);
  });

  it('names the field of every problem', () => {
    const bad = (x: unknown) => {
      const r = parseGraphText(typeof x === 'string' ? x : text(x));
      expect(r.ok).toBe(false);
      return r.ok ? [] : r.issues.map((i) => `${i.path} ${i.message}`);
    };
    expect(bad('{ nope')[0]).toMatch(/^\(file\) is not valid JSON/);
    expect(bad({ format: 'loopfold-graph', version: 1, variables: ['a'], directed: [['a', 'z']] })).toEqual(['directed[0][1] no variable "z" (the variables are a)']);
    expect(bad({ format: 'loopfold-graph', version: 1, variables: 2, directed: [[1, 3]] })).toEqual(['directed[0][1] 3 is not a variable number: numbers run from 1 to 2']);
    expect(bad({ format: 'loopfold-graph', version: 1, variables: ['a', 'b'], bidirected: [['a', 'a']] })[0]).toMatch(/^bidirected\[0\] .*two different variables/);
    expect(bad({ format: 'loopfold-graph', version: 1, variables: ['a', 'a'] })[0]).toMatch(/^variables\[1\] "a" is listed twice/);
    expect(bad({ format: 'loopfold-graph', version: 1, variables: ['a'], directed: [['a']] })[0]).toMatch(/^directed\[0\]/);
    expect(bad({ format: 'loopfold-graph', version: 1, variables: ['a'], colour: 'red' })).toEqual(['(top level) has unknown field "colour"']);
    expect(bad({ format: 'loopfold-graph', version: 1 })).toEqual(['variables is missing']);
    expect(bad({ format: 'loopfold-graph', version: 1, variables: 31 })[0]).toMatch(/^variables must be at most 30/);
    expect(bad({ format: 'loopfold-graph', version: 1, variables: 2, rate: 0 })[0]).toMatch(/^rate must be a whole number ≥ 1/);
  });
});

describe('the causal-step graph of a model', () => {
  it('greenhouse: states carry over, integrating links are one-step effects, derived sources are folded to what they follow', () => {
    // Worked by hand from src/examples/greenhouse.json: heater follows setpoint and airTemp, light follows
    // sunlight and dust, transpiration follows soilWater and airTemp (instantaneous links).
    const m = parseModelText(readFileSync('src/examples/greenhouse.json', 'utf8'));
    if (!m.ok) throw new Error('example does not load');
    const { graph, ids } = stepGraphOfModel(m.model);
    expect(ids).toEqual(['outsideTemp', 'setpoint', 'sunlight', 'vent', 'irrigation', 'airTemp', 'humidity', 'soilWater', 'dust']);
    const byId = { names: ids, directed: graph.directed, bidirected: graph.bidirected };
    expect(edgeList(byId).directed.map(([a, b]) => `${a}>${b}`).sort()).toEqual([
      'airTemp>airTemp', 'airTemp>humidity', 'airTemp>soilWater', 'dust>airTemp', 'dust>dust', 'humidity>humidity', 'irrigation>soilWater',
      'outsideTemp>airTemp', 'setpoint>airTemp', 'soilWater>humidity', 'soilWater>soilWater', 'sunlight>airTemp', 'vent>humidity',
    ].sort());
  });

  it('a model file given where a graph is expected is read as its causal-step graph', () => {
    const r = parseGraphText(readFileSync('src/examples/lake.json', 'utf8'));
    expect(r.ok && r.file.source).toBe('model');
    expect(r.ok && r.file.graph.names.length).toBe(6);
  });
});
