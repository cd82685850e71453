import { z } from 'zod';
import { lengthAxis, parseInterval } from '../study/convert';
import { nominalSpacing } from '../study/schedule';
import { migrateV1 } from './migrate';
import { MODEL_VERSION, TIME_UNITS, type Model, type Study } from './types';
import { convertDuration, formatDuration } from './units';
import { readTimescale } from './timescale';

/** One problem found in a model file, located by its JSON path. */
export interface ModelIssue {
  /** JSON path such as `variables[2].timescale`. */
  path: string;
  message: string;
}

/** `migratedFrom`: the file's version when it was older than this program writes (the model is migrated). */
export type ParseResult = { ok: true; model: Model; warnings: ModelIssue[]; migratedFrom?: number } | { ok: false; issues: ModelIssue[] };

const ID = /^[A-Za-z_][A-Za-z0-9_]*$/;
const idField = z
  .string({ error: 'must be a text id' })
  .regex(ID, { error: 'must start with a letter or "_" and contain only letters, digits and "_" (it is used as a name in formulas)' })
  .max(64, { error: 'must be at most 64 characters long' });
const finite = (what: string) => z.number({ error: `${what} must be a number` }).refine(Number.isFinite, { error: `${what} must be a finite number` });
const text = (max: number) => z.string({ error: 'must be text' }).max(max, { error: `must be at most ${max} characters long` });
const position = z.strictObject({ x: finite('x'), y: finite('y') }, { error: 'must be an object { x, y }' });

/**
 * A state's characteristic time: a number in the model's time unit or a duration in text.
 * Kept in one place so that it can take further forms (such as a range) without touching the rest.
 */
const timescaleSchema = z.union([z.number(), z.string(), z.strictObject({ low: z.union([z.number(), z.string()]), high: z.union([z.number(), z.string()]) })], {
  error: 'must be a number in the model time unit, a duration such as "90 min", or a range { "low": "30 min", "high": "3 h" }',
});

const variableFieldsV1 = {
  id: idField,
  label: text(200).optional(),
  kind: z.enum(['input', 'state', 'derived'], { error: 'must be "input", "state" or "derived"' }),
  value: finite('value').optional(),
  initial: finite('initial').optional(),
  timescale: timescaleSchema.optional(),
  selfRegulating: z.boolean({ error: 'must be true or false' }).optional(),
  rate: text(4000).optional(),
  formula: text(4000).optional(),
  unit: text(40).optional(),
  note: text(4000).optional(),
  position: position.optional(),
};
const variableSchemaV1 = z.strictObject(variableFieldsV1, { error: 'must be an object describing a variable' });
const variableSchemaV2 = z.strictObject(
  {
    ...variableFieldsV1,
    noise: finite('noise').refine((n) => n >= 0, { error: 'must not be negative (the variance the process adds per unit time)' }).optional(),
    reliability: finite('reliability').refine((r) => r > 0 && r <= 1, { error: 'must be above 0 and at most 1 (the share of true-score variance in a measurement)' }).optional(),
    personSD: finite('personSD').refine((n) => n >= 0, { error: 'must not be negative (a standard deviation across persons)' }).optional(),
  },
  { error: 'must be an object describing a variable' },
);

const relationSchema = z.strictObject(
  { id: idField, equation: text(4000), note: text(4000).optional(), position: position.optional() },
  { error: 'must be an object { id, equation }' },
);

const linkFieldsV1 = {
  id: text(140).optional(),
  from: idField,
  to: idField,
  kind: z.enum(['instantaneous', 'integrating'], { error: 'must be "instantaneous" or "integrating"' }),
  sign: z.enum(['+', '-'], { error: 'must be "+" or "-"' }).optional(),
  weight: finite('weight').optional(),
};
const linkSchemaV1 = z.strictObject(linkFieldsV1, { error: 'must be an object { from, to, kind }' });
const linkSchemaV2 = z.strictObject(
  {
    ...linkFieldsV1,
    personSD: finite('personSD').refine((n) => n >= 0, { error: 'must not be negative (a standard deviation across persons)' }).optional(),
    strengthRange: z
      .strictObject(
        {
          low: finite('low').refine((n) => n >= 0, { error: 'must not be negative (a strength is a size; the sign is the link\'s sign)' }),
          high: finite('high').refine((n) => n >= 0, { error: 'must not be negative (a strength is a size; the sign is the link\'s sign)' }),
        },
        { error: 'must be an object { low, high } (the range the strength may lie in)' },
      )
      .optional(),
  },
  { error: 'must be an object { from, to, kind }' },
);

const durationSchema = z.union([z.number(), z.string().max(100, { error: 'must be at most 100 characters long' })], { error: 'must be a duration: a number in the model time unit or text such as "3h" or "14 days"' });
const clock = z.string({ error: 'must be a time of day such as "09:00"' }).regex(/^([01][0-9]|2[0-3]):[0-5][0-9]$|^24:00$/, { error: 'must be a time of day "HH:MM" between "00:00" and "24:00", such as "09:00"' });

const scheduleSchema = z.discriminatedUnion(
  'kind',
  [
    z.strictObject({ kind: z.literal('fixed') }, { error: 'must be an object { kind }' }),
    z.strictObject(
      {
        kind: z.literal('daily-window'),
        promptsPerDay: z.number({ error: 'must be a number' }).int({ error: 'must be a whole number' }).min(1, { error: 'must be at least 1' }).max(288, { error: 'must be at most 288 (one every 5 minutes)' }),
        from: clock,
        to: clock,
        timing: z.enum(['fixed', 'stratified-random'], { error: 'must be "fixed" (evenly spaced) or "stratified-random" (one at a random time in each equal part of the window)' }),
      },
      { error: 'must be an object { kind, promptsPerDay, from, to, timing }' },
    ),
    z.strictObject({ kind: z.literal('daily') }, { error: 'must be an object { kind }' }),
    z.strictObject({ kind: z.literal('weekly') }, { error: 'must be an object { kind }' }),
  ],
  { error: 'must be an object whose kind is "fixed", "daily-window", "daily" or "weekly"' },
);

const studySchema = z.strictObject(
  {
    interval: durationSchema,
    length: z.union([z.number(), z.string().max(100)], { error: 'must be a duration such as "14 days" or a number of samples' }),
    schedule: scheduleSchema,
    persons: z.number({ error: 'must be a number' }).int({ error: 'must be a whole number' }).min(1, { error: 'must be at least 1' }).max(100000, { error: 'must be at most 100,000' }).optional(),
    missedPrompts: finite('missedPrompts').refine((p) => p >= 0 && p < 1, { error: 'must be a share from 0 up to (not including) 1, such as 0.2 for 20 % missed' }).optional(),
    holds: z.record(z.string(), finite('hold')).optional(),
    seed: z.number({ error: 'must be a number' }).int({ error: 'must be a whole number' }).min(0, { error: 'must not be negative' }).max(4294967295, { error: 'must be below 2^32' }).optional(),
  },
  { error: 'must be an object { interval, length, schedule }' },
);

const modelHead = {
  $schema: z.string().optional(),
  format: z.literal('loopfold-model', { error: 'must be "loopfold-model": this does not look like a Loopfold model file' }),
};
const modelFields = {
  name: text(200),
  description: text(8000).optional(),
  caution: text(2000).optional(),
  timeUnit: z.enum(TIME_UNITS, { error: `must be one of ${TIME_UNITS.join(', ')}` }),
};
const relationsField = z.array(relationSchema, { error: 'must be a list of relations' }).max(20000).optional();
const separation = finite('separation').refine((k) => k >= 1, { error: 'must be at least 1' });

const modelSchemaV1 = z.strictObject(
  {
    ...modelHead,
    version: z.literal(1, { error: 'must be 1' }),
    ...modelFields,
    variables: z.array(variableSchemaV1, { error: 'must be a list of variables' }).max(20000, { error: 'holds more than 20,000 variables' }),
    relations: relationsField,
    links: z.array(linkSchemaV1, { error: 'must be a list of links' }).max(100000, { error: 'holds more than 100,000 links' }),
    settings: z
      .strictObject(
        {
          separation: separation.optional(),
          samples: z.number({ error: 'must be a number' }).int({ error: 'must be a whole number' }).min(2, { error: 'must be at least 2' }).max(1e6).optional(),
          noise: z.record(z.string(), finite('noise')).optional(),
        },
        { error: 'must be an object' },
      )
      .optional(),
  },
  { error: 'must be a JSON object' },
);

const modelSchemaV2 = z.strictObject(
  {
    ...modelHead,
    version: z.literal(2, { error: 'must be 2' }),
    ...modelFields,
    variables: z.array(variableSchemaV2, { error: 'must be a list of variables' }).max(20000, { error: 'holds more than 20,000 variables' }),
    relations: relationsField,
    links: z.array(linkSchemaV2, { error: 'must be a list of links' }).max(100000, { error: 'holds more than 100,000 links' }),
    settings: z
      .strictObject(
        {
          separation: separation.optional(),
          samples: z.never({ error: 'belongs to version 1: in version 2 the study length is "study.length"' }).optional(),
          noise: z.never({ error: 'belongs to version 1: in version 2 each state has its own "noise"' }).optional(),
        },
        { error: 'must be an object' },
      )
      .optional(),
    study: studySchema.optional(),
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

/** The versions of the model file this program reads (older ones are migrated on open). */
export const READABLE_VERSIONS = [1, 2] as const;

/**
 * Validate untrusted JSON (already parsed) as a Loopfold model, of any
 * version this program reads; a version-1 file comes back migrated to
 * version 2 (`migratedFrom: 1`). Nothing in it is executed; formulas stay text here.
 */
export function parseModel(json: unknown): ParseResult {
  const version = json !== null && typeof json === 'object' && !Array.isArray(json) ? (json as { version?: unknown }).version : undefined;
  if (typeof version === 'number' && Number.isInteger(version) && version > MODEL_VERSION) {
    const issues: ModelIssue[] = [{ path: 'version', message: `is ${version}: this file was written by a newer Loopfold (model file version ${version}); this one reads versions ${READABLE_VERSIONS.join(' and ')}` }];
    if ((json as { format?: unknown }).format !== 'loopfold-model') issues.unshift({ path: 'format', message: 'must be "loopfold-model": this does not look like a Loopfold model file' });
    return { ok: false, issues };
  }
  if (version === 1) {
    const r = modelSchemaV1.safeParse(json, { reportInput: true });
    if (!r.success) return { ok: false, issues: zodIssues(r.error) };
    const checked = checkModel(withoutSchemaField(r.data) as Model);
    if (!checked.ok) return checked;
    return { ok: true, model: migrateV1(checked.model), warnings: checked.warnings, migratedFrom: 1 };
  }
  const r = modelSchemaV2.safeParse(json, { reportInput: true });
  if (!r.success) {
    const issues = zodIssues(r.error);
    if (version !== 2 && !issues.some((i) => i.path === 'version')) issues.push({ path: 'version', message: 'must be 1 or 2' });
    return { ok: false, issues: issues.map((i) => (i.path === 'version' && version !== undefined ? { path: 'version', message: `must be 1 or 2 (the model file versions this Loopfold reads), not ${JSON.stringify(version)}` } : i)) };
  }
  return checkModel(withoutSchemaField(r.data) as Model);
}

function withoutSchemaField<T extends { $schema?: string }>(data: T): Omit<T, '$schema'> {
  const { $schema: _ignored, ...rest } = data;
  void _ignored;
  return rest;
}

/** The checks a schema cannot express: ids, kinds, references, durations, the study. */
function checkModel(model: Model): ParseResult {
  const issues: ModelIssue[] = [];
  const warnings: ModelIssue[] = [];
  const ids = new Map<string, string>();
  model.variables.forEach((v, i) => {
    const p = `variables[${i}]`;
    if (ids.has(v.id)) issues.push({ path: `${p}.id`, message: `"${v.id}" is used twice (also at ${ids.get(v.id)}): every variable needs its own id` });
    else ids.set(v.id, p);
    if (v.kind !== 'state') {
      for (const f of ['initial', 'timescale', 'selfRegulating', 'rate', 'noise'] as const)
        if (v[f] !== undefined) issues.push({ path: `${p}.${f}`, message: `only a state has "${f}"; "${v.id}" is ${v.kind === 'input' ? 'an input' : 'a derived variable'}` });
    }
    if (v.kind !== 'input' && v.personSD !== undefined) issues.push({ path: `${p}.personSD`, message: `only an input has "personSD" (its spread across persons); "${v.id}" is a ${v.kind} (for person differences in a strength, give the link a "personSD")` });
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
    if (!model.variables.some((v) => v.id === l.from)) issues.push({ path: `${p}.from`, message: `no variable "${l.from}" exists` });
    if (!model.variables.some((v) => v.id === l.to)) issues.push({ path: `${p}.to`, message: `no variable "${l.to}" exists` });
    if (l.from === l.to) issues.push({ path: p, message: `a link from "${l.from}" to itself is not allowed: mark the state self-regulating instead` });
    if (l.strengthRange && l.strengthRange.low > l.strengthRange.high) issues.push({ path: `${p}.strengthRange.high`, message: `must be at least low (${l.strengthRange.low})` });
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
  if (model.study) checkStudy(model, model.study, issues, warnings);
  if (issues.length > 0) return { ok: false, issues };
  return { ok: true, model, warnings };
}

function minutesOf(clockText: string): number {
  const [h, m] = clockText.split(':').map(Number);
  return h * 60 + m;
}

function checkStudy(model: Model, study: Study, issues: ModelIssue[], warnings: ModelIssue[]): void {
  const unit = model.timeUnit;
  const interval = parseInterval(study.interval, unit);
  if (!interval.ok) issues.push({ path: 'study.interval', message: interval.message });
  const length = lengthAxis(study.length, unit);
  if (!length.ok) issues.push({ path: 'study.length', message: length.message });
  for (const [id, value] of Object.entries(study.holds ?? {})) {
    if (!model.variables.some((v) => v.id === id)) issues.push({ path: `study.holds.${id}`, message: `no variable "${id}" exists: a hold names a variable of the model` });
    else if (!Number.isFinite(value)) issues.push({ path: `study.holds.${id}`, message: 'must be a finite number' });
  }
  const sch = study.schedule;
  const day = convertDuration(1, 'day', unit);
  if (sch.kind === 'daily-window') {
    const from = minutesOf(sch.from);
    const to = minutesOf(sch.to);
    if (to <= from) issues.push({ path: 'study.schedule.to', message: `must be later in the day than "from" (${sch.from}): the prompts fall between them, the night outside` });
    else if (interval.ok) {
      const spacing = nominalSpacing(sch, unit);
      if (Math.abs(interval.value - spacing) > 1e-6 * spacing)
        warnings.push({ path: 'study.interval', message: `is ${formatDuration(interval.value, unit)}, but ${sch.promptsPerDay} prompts between ${sch.from} and ${sch.to} are ${formatDuration(spacing, unit)} apart: the ordering uses the interval, the prompt times the schedule` });
    }
  } else if (interval.ok && (sch.kind === 'daily' || sch.kind === 'weekly')) {
    const expected = sch.kind === 'daily' ? day : 7 * day;
    if (Math.abs(interval.value - expected) > 1e-9 * expected)
      warnings.push({ path: 'study.interval', message: `is ${formatDuration(interval.value, unit)}, but a ${sch.kind} schedule prompts every ${sch.kind === 'daily' ? 'day' : 'week'}: the ordering uses the interval, the prompt times the schedule` });
  }
  if (interval.ok && length.ok && length.window !== undefined && interval.value > length.window)
    issues.push({ path: 'study.length', message: `is ${formatDuration(length.window, unit)}, shorter than the interval (${formatDuration(interval.value, unit)}): no two prompts fit in it` });
}

/**
 * The problems of a study as the modeller edits it, before it is written into
 * the model: its form (the same rules as the file) and the checks against the
 * model (interval and length readable, holds naming variables, a window that
 * ends after its start, a length that fits two prompts). Paths start at
 * "study" ("study.schedule.promptsPerDay"). Issues block the edit; warnings do not.
 * Example: `studyIssues({ interval: "3h", length: 1, schedule: { kind: "fixed" } }, model).issues`
 * → [{ path: "study.length", message: "a study length in samples must be a whole number of at least 2, not 1" }].
 */
export function studyIssues(study: unknown, model: Model): { issues: ModelIssue[]; warnings: ModelIssue[] } {
  const r = studySchema.safeParse(study, { reportInput: true });
  if (!r.success) return { issues: zodIssues(r.error).map((i) => ({ ...i, path: i.path === '(top level)' ? 'study' : `study.${i.path}` })), warnings: [] };
  const issues: ModelIssue[] = [];
  const warnings: ModelIssue[] = [];
  checkStudy(model, r.data as Study, issues, warnings);
  return { issues, warnings };
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
export function modelJsonSchema(version: 1 | 2 = MODEL_VERSION): unknown {
  return z.toJSONSchema(version === 1 ? modelSchemaV1 : modelSchemaV2, { target: 'draft-2020-12', unrepresentable: 'any' });
}
