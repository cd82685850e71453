import { readFileSync } from 'node:fs';
import Ajv2020 from 'ajv/dist/2020';
import { describe, expect, it } from 'vitest';
import { modelJsonSchema } from '../../../src/core/model/schema';
import { EXAMPLES } from '../../../src/examples/index';

const published = JSON.parse(readFileSync(new URL('../../../public/schema/loopfold-model.v1.json', import.meta.url), 'utf8'));

describe('published JSON Schema of the model file', () => {
  it('is in step with the validator (regenerate with `npx tsx scripts/write-schema.ts`)', () => {
    const { $id: _id, title: _title, ...rest } = published;
    expect(rest).toEqual(modelJsonSchema());
  });
  // Ajv is an independent JSON Schema (draft 2020-12) implementation.
  const validate = new Ajv2020({ strict: false, allErrors: true }).compile(published);
  it.each(EXAMPLES.map((e) => [e.id, e.model] as const))('accepts the example %s', (_id, model) => {
    expect(validate(model), JSON.stringify(validate.errors)).toBe(true);
  });
  it('rejects a file with a wrong link kind and an unknown field', () => {
    const bad = { format: 'loopfold-model', version: 1, name: 'x', timeUnit: 'h', variables: [{ id: 'a', kind: 'input', colour: 'red' }], links: [{ from: 'a', to: 'a', kind: 'soon' }] };
    expect(validate(bad)).toBe(false);
    const paths = (validate.errors ?? []).map((e) => e.instancePath);
    expect(paths).toContain('/variables/0');
    expect(paths).toContain('/links/0/kind');
  });
});
