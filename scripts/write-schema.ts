// Writes the published JSON Schema of the model file from the definition the app validates with.
import { writeFileSync } from 'node:fs';
import { modelJsonSchema } from '../src/core/model/schema';

const schema = { $id: 'loopfold-model.v1.json', title: 'Loopfold model file, version 1', ...(modelJsonSchema() as object) };
writeFileSync(new URL('../public/schema/loopfold-model.v1.json', import.meta.url), `${JSON.stringify(schema, null, 2)}\n`);
