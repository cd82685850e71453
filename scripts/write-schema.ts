// Writes the published JSON Schemas of the model file (every version this program reads) from the definitions the app validates with.
import { writeFileSync } from 'node:fs';
import { modelJsonSchema } from '../src/core/model/schema';

for (const version of [1, 2] as const) {
  const schema = { $id: `loopfold-model.v${version}.json`, title: `Loopfold model file, version ${version}`, ...(modelJsonSchema(version) as object) };
  writeFileSync(new URL(`../public/schema/loopfold-model.v${version}.json`, import.meta.url), `${JSON.stringify(schema, null, 2)}\n`);
}
