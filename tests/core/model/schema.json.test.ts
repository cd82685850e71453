import { readFileSync } from 'node:fs';
import Ajv2020 from 'ajv/dist/2020';
import { describe, expect, it } from 'vitest';
import { modelJsonSchema } from '../../../src/core/model/schema';
import { EXAMPLES } from '../../../src/examples/index';

const publishedV1 = JSON.parse(readFileSync(new URL('../../../public/schema/loopfold-model.v1.json', import.meta.url), 'utf8'));
const published = JSON.parse(readFileSync(new URL('../../../public/schema/loopfold-model.v2.json', import.meta.url), 'utf8'));
const v1Fixtures = ['greenhouse', 'lake', 'sleep-stress', 'warehouse'].map((id) => [id, JSON.parse(readFileSync(new URL(`../../fixtures/model-v1/${id}.json`, import.meta.url), 'utf8'))] as const);

describe('published JSON Schema of the model file', () => {
  it('is in step with the validator (regenerate with `npx tsx scripts/write-schema.ts`)', () => {
    const { $id: _id, title: _title, ...rest } = published;
    expect(rest).toEqual(modelJsonSchema(2));
    const { $id: _id1, title: _title1, ...rest1 } = publishedV1;
    expect(rest1).toEqual(modelJsonSchema(1));
  });
  const validateV1 = new Ajv2020({ strict: false, allErrors: true }).compile(publishedV1);
  it.each(v1Fixtures)('the version-1 schema accepts the version-1 file %s and the version-2 schema refuses it', (_id, model) => {
    expect(validateV1(model), JSON.stringify(validateV1.errors)).toBe(true);
    const v2 = new Ajv2020({ strict: false, allErrors: true }).compile(published);
    expect(v2(model)).toBe(false);
  });
  // Ajv is an independent JSON Schema (draft 2020-12) implementation.
  const validate = new Ajv2020({ strict: false, allErrors: true }).compile(published);
  it.each(EXAMPLES.map((e) => [e.id, e.model] as const))('accepts the example %s', (_id, model) => {
    expect(validate(model), JSON.stringify(validate.errors)).toBe(true);
  });
  it('rejects a file with a wrong link kind and an unknown field', () => {
    const bad = { format: 'loopfold-model', version: 2, name: 'x', timeUnit: 'h', variables: [{ id: 'a', kind: 'input', colour: 'red' }], links: [{ from: 'a', to: 'a', kind: 'soon' }] };
    expect(validate(bad)).toBe(false);
    const paths = (validate.errors ?? []).map((e) => e.instancePath);
    expect(paths).toContain('/variables/0');
    expect(paths).toContain('/links/0/kind');
  });
});

describe('published JSON Schema, version 2: the study', () => {
  const validate = new Ajv2020({ strict: false, allErrors: true }).compile(published);
  const base = { format: 'loopfold-model', version: 2, name: 'x', timeUnit: 'h', variables: [{ id: 's', kind: 'state', noise: 0.5, reliability: 0.8 }], links: [] };
  it('accepts each schedule kind', () => {
    for (const schedule of [{ kind: 'fixed' }, { kind: 'daily' }, { kind: 'weekly' }, { kind: 'daily-window', promptsPerDay: 5, from: '09:00', to: '21:00', timing: 'stratified-random' }])
      expect(validate({ ...base, study: { interval: '3h', length: '14 days', schedule, persons: 40, missedPrompts: 0.2 } }), JSON.stringify(validate.errors)).toBe(true);
  });
  it('refuses a version-1 setting, an unknown schedule and a clock time out of range', () => {
    expect(validate({ ...base, settings: { samples: 50 } })).toBe(false);
    expect(validate({ ...base, study: { interval: '3h', length: 50, schedule: { kind: 'hourly' } } })).toBe(false);
    expect(validate({ ...base, study: { interval: '3h', length: 50, schedule: { kind: 'daily-window', promptsPerDay: 5, from: '9am', to: '21:00', timing: 'fixed' } } })).toBe(false);
  });
});

describe('a link\'s strength range (version 2, additive)', () => {
  const validate = new Ajv2020({ strict: false, allErrors: true }).compile(published);
  const file = (range: unknown) => ({ format: 'loopfold-model', version: 2, name: 'x', timeUnit: 'h', variables: [{ id: 'a', kind: 'state' }, { id: 'b', kind: 'state' }], links: [{ from: 'a', to: 'b', kind: 'integrating', weight: 0.5, strengthRange: range }] });
  it('is accepted by the published schema and the validator, and refused with its path when malformed', async () => {
    const { parseModel } = await import('../../../src/core/model/schema');
    expect(validate(file({ low: 0.2, high: 0.9 }))).toBe(true);
    const ok = parseModel(file({ low: 0.2, high: 0.9 }));
    expect(ok.ok && ok.model.links[0].strengthRange).toEqual({ low: 0.2, high: 0.9 });
    expect(validate(file({ low: 0.2 }))).toBe(false);
    const missing = parseModel(file({ low: 0.2 }));
    expect(!missing.ok && missing.issues.map((i) => i.path)).toEqual(['links[0].strengthRange.high']);
    const reversed = parseModel(file({ low: 0.9, high: 0.2 }));
    expect(!reversed.ok && reversed.issues).toEqual([{ path: 'links[0].strengthRange.high', message: 'must be at least low (0.9)' }]);
    const negative = parseModel(file({ low: -1, high: 0.2 }));
    expect(!negative.ok && negative.issues[0].path).toBe('links[0].strengthRange.low');
  });
});
