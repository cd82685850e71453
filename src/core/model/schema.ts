import { z } from 'zod';
import { TIME_UNITS, type Model } from './types';
import { readTimescale } from './timescale';

/** One problem found in a model file, located by its JSON path. */
export interface ModelIssue {
  /** JSON path such as `variables[2].timescale`. */
  path: string;
  message: string;
}

export type ParseResult = { ok: true; model: Model; warnings: ModelIssue[] } | { ok: false; issues: ModelIssue[] };

const ID = /^[A-Za-z_][A-Za-z0-9_]*$/;
const idField = z
  .string({ error: 'must be a text id' })
  .regex(ID, { error: 'must start with a letter or "_" and contain only letters, digits and "_" (it is used as a name in formulas)' })
  .max(64, { error: 'must be at most 64 characters long' });
const finite = (what: string) => z.number({ error: `${what} must be a number` }).refine(Number.isFinite, { error: `${what} must be a finite number` });
const text = (max: number) => z.string({ error: 'must be text' }).max(max, { error: `must be at most ${max} characters long` });
const position = z.strictObject({ x: finite('x'), y: finite('y') }, { error: 'must be an object { x, y }' });

const variableSchema = z.strictObject(
  {
    id: idField,
    label: text(200).optional(),
    kind: z.enum(['input', 'state', 'derived'], { error: 'must be "input", "state" or "derived"' }),
    value: finite('value').optional(),
    initial: finite('initial').optional(),
    timescale: z
      .union([z.number(), z.string(), z.strictObject({ low: z.union([z.number(), z.string()]), high: z.union([z.number(), z.string()]) })], {
        error: 'must be a number in the model time unit, a duration such as "90 min", or a range { "low": "30 min", "high": "3 h" }',
      })
      .optional(),
    selfRegulating: z.boolean({ error: 'must be true or false' }).optional(),
    rate: text(4000).optional(),
    formula: text(4000).optional(),
    unit: text(40).optional(),
    note: text(4000).optional(),
    position: position.optional(),
  },
  { error: 'must be an object describing a variable' },
);

const relationSchema = z.strictObject(
  { id: idField, equation: text(4000), note: text(4000).optional(), position: position.optional() },
  { error: 'must be an object { id, equation }' },
);

const linkSchema = z.strictObject(
  {
    id: text(140).optional(),
    from: idField,
    to: idField,
    kind: z.enum(['instantaneous', 'integrating'], { error: 'must be "instantaneous" or "integrating"' }),
    sign: z.enum(['+', '-'], { error: 'must be "+" or "-"' }).optional(),
    weight: finite('weight').optional(),
  },
  { error: 'must be an object { from, to, kind }' },
);

const modelSchema = z.strictObject(
  {
    $schema: z.string().optional(),
    format: z.literal('loopfold-model', { error: 'must be "loopfold-model": this does not look like a Loopfold model file' }),
    version: z.literal(1, { error: 'must be 1: this file was written by a version of Loopfold this one does not know' }),
    name: text(200),
    description: text(8000).optional(),
    caution: text(2000).optional(),
    timeUnit: z.enum(TIME_UNITS, { error: `must be one of ${TIME_UNITS.join(', ')}` }),
    variables: z.array(variableSchema, { error: 'must be a list of variables' }).max(20000, { error: 'holds more than 20,000 variables' }),
    relations: z.array(relationSchema, { error: 'must be a list of relations' }).max(20000).optional(),
    links: z.array(linkSchema, { error: 'must be a list of links' }).max(100000, { error: 'holds more than 100,000 links' }),
    settings: z
      .strictObject(
        {
          separation: finite('separation').refine((k) => k >= 1, { error: 'must be at least 1' }).optional(),
          samples: z.number({ error: 'must be a number' }).int({ error: 'must be a whole number' }).min(2, { error: 'must be at least 2' }).max(1e6).optional(),
          noise: z.record(z.string(), finite('noise')).optional(),
        },
        { error: 'must be an object' },
      )
      .optional(),
  },
  { error: 'must be a JSON object' },
);

/** Format a path of keys and indices as `variables[2].timescale`. */
export function formatPath(path: readonly PropertyKey[]): string {
  let out = '';
  for (const p of path) {
    if (typeof p === 'number') out += `[${p}]`;
    else out += out === '' ? String(p) : `.${String(p)}`;
  }
  return out === '' ? '(top level)' : out;
}

function zodIssues(error: z.ZodError): ModelIssue[] {
  return error.issues.map((iss) => {
    const path = formatPath(iss.path);
    let message = iss.message;
    if (iss.code === 'unrecognized_keys') message = `has unknown field${iss.keys.length > 1 ? 's' : ''} ${iss.keys.map((k) => `"${k}"`).join(', ')}`;
    if (iss.code === 'invalid_type' && iss.input === undefined) message = 'is missing';
    return { path, message };
  });
}

/**
 * Validate untrusted JSON (already parsed) as a Loopfold model.
 * Nothing in it is executed; formulas stay text here.
 */
export function parseModel(json: unknown): ParseResult {
  const r = modelSchema.safeParse(json);
  if (!r.success) return { ok: false, issues: zodIssues(r.error) };
  const { $schema: _ignored, ...rest } = r.data;
  void _ignored;
  const model = rest as Model;
  const issues: ModelIssue[] = [];
  const warnings: ModelIssue[] = [];
  const ids = new Map<string, string>();
  model.variables.forEach((v, i) => {
    const p = `variables[${i}]`;
    if (ids.has(v.id)) issues.push({ path: `${p}.id`, message: `"${v.id}" is used twice (also at ${ids.get(v.id)}): every variable needs its own id` });
    else ids.set(v.id, p);
    if (v.kind !== 'state') {
      for (const f of ['initial', 'timescale', 'selfRegulating', 'rate'] as const)
        if (v[f] !== undefined) issues.push({ path: `${p}.${f}`, message: `only a state has "${f}"; "${v.id}" is ${v.kind === 'input' ? 'an input' : 'a derived variable'}` });
    }
    if (v.kind !== 'input' && v.value !== undefined) issues.push({ path: `${p}.value`, message: `only an input has "value"; "${v.id}" is a ${v.kind} (use "initial" for a state)` });
    if (v.kind !== 'derived' && v.formula !== undefined) issues.push({ path: `${p}.formula`, message: `only a derived variable has "formula"; "${v.id}" is ${v.kind === 'input' ? 'an input' : 'a state (use "rate")'}` });
    if (v.timescale !== undefined) {
      const d = readTimescale(v.timescale, model.timeUnit);
      if (!d.ok) issues.push({ path: `${p}.timescale${d.field ? `.${d.field}` : ''}`, message: d.message });
    }
  });
  (model.relations ?? []).forEach((r2, i) => {
    const p = `relations[${i}]`;
    if (ids.has(r2.id)) issues.push({ path: `${p}.id`, message: `"${r2.id}" is already used by ${ids.get(r2.id)}: relations and variables need distinct ids` });
    else ids.set(r2.id, p);
  });
  const seenLinks = new Map<string, number>();
  model.links.forEach((l, i) => {
    const p = `links[${i}]`;
    const fromVar = model.variables.find((v) => v.id === l.from);
    if (!model.variables.some((v) => v.id === l.from)) issues.push({ path: `${p}.from`, message: `no variable "${l.from}" exists` });
    if (!model.variables.some((v) => v.id === l.to)) issues.push({ path: `${p}.to`, message: `no variable "${l.to}" exists` });
    if (l.from === l.to) issues.push({ path: p, message: `a link from "${l.from}" to itself is not allowed: mark the state self-regulating instead` });
    void fromVar;
    const key = `${l.from}->${l.to}`;
    if (seenLinks.has(key)) warnings.push({ path: p, message: `duplicates links[${seenLinks.get(key)}] from "${l.from}" to "${l.to}"` });
    else seenLinks.set(key, i);
  });
  if (model.settings?.noise) {
    for (const [id, n] of Object.entries(model.settings.noise)) {
      const v = model.variables.find((x) => x.id === id);
      if (!v) issues.push({ path: `settings.noise.${id}`, message: `no variable "${id}" exists` });
      else if (v.kind !== 'state') issues.push({ path: `settings.noise.${id}`, message: `"${id}" is not a state: noise applies to states only` });
      if (n < 0) issues.push({ path: `settings.noise.${id}`, message: 'must not be negative' });
    }
  }
  if (issues.length > 0) return { ok: false, issues };
  return { ok: true, model, warnings };
}

/** Parse model text (JSON) with a located message when the JSON itself is broken. */
export function parseModelText(textIn: string): ParseResult {
  let json: unknown;
  try {
    json = JSON.parse(textIn);
  } catch (e) {
    return { ok: false, issues: [{ path: '(file)', message: `is not valid JSON: ${(e as Error).message}` }] };
  }
  return parseModel(json);
}

/** The JSON Schema of the model file, generated from the same definition the app validates with. */
export function modelJsonSchema(): unknown {
  return z.toJSONSchema(modelSchema, { target: 'draft-2020-12', unrepresentable: 'any' });
}
