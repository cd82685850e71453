import { parseModelText } from '../core/model/schema';
import type { Model } from '../core/model/types';
import { parseDuration } from '../core/model/units';
import { parseInterval, studyInterval } from '../core/study/convert';
import { CliError, type CliArgs, type CliIO } from './commands/types';

/** The text of the file at `path`; a file that cannot be read is a CliError naming it ("no such file" when missing). */
export function readInput(path: string, io: CliIO): string {
  try {
    return io.readFile(path);
  } catch (e) {
    throw new CliError(`cannot read ${path}: ${(e as NodeJS.ErrnoException).code === 'ENOENT' ? 'no such file' : (e as Error).message}`);
  }
}

/** Read and validate the model named by the first positional argument. */
export function loadModel(args: CliArgs, io: CliIO): Model {
  const path = args.positional[0];
  if (!path) throw new CliError('name a model file, e.g. loopfold order model.json', 2);
  const text = readInput(path, io);
  const r = parseModelText(text);
  if (!r.ok) throw new CliError(`${path} is not a valid model: ${r.issues.map((i) => `${i.path} ${i.message}`).join('; ')}`);
  return r.model;
}

/**
 * A duration option (`--until 3h`) in the model's time unit, or undefined when absent.
 * `--interval` also takes the words the app shows and accepts ("every 3 h", "daily", "5 a day"),
 * and when it is absent the sampling interval of the file's study.
 */
export function durationOption(args: CliArgs, name: string, model: Model): number | undefined {
  const v = args.options[name];
  if (name === 'interval' && v === undefined && model.study) {
    const own = studyInterval(model.study, model.timeUnit);
    if (own !== undefined) return own;
  }
  if (v === undefined) return undefined;
  if (v === true) throw new CliError(`--${name} needs a value`, 2);
  const d = name === 'interval' ? parseInterval(v, model.timeUnit) : parseDuration(v, model.timeUnit);
  if (!d.ok) throw new CliError(`--${name}: ${d.message}`, 2);
  return d.value;
}

/**
 * A variable named on the command line by its id or its label (ids first; a label is matched ignoring case
 * and spaces at the ends). Unknown or ambiguous names are errors that list the variables.
 */
export function variableByIdOrLabel(model: Model, name: string, option: string): string {
  if (model.variables.some((v) => v.id === name)) return name;
  const norm = (s: string) => s.trim().toLowerCase();
  const hits = model.variables.filter((v) => v.label !== undefined && norm(v.label) === norm(name));
  if (hits.length === 1) return hits[0].id;
  const list = model.variables.map((v) => (v.label && v.label !== v.id ? `${v.id} ("${v.label}")` : v.id)).join(', ');
  if (hits.length > 1) throw new CliError(`--${option}: "${name}" is the label of ${hits.length} variables (${hits.map((h) => h.id).join(', ')}); give the id`, 2);
  throw new CliError(`--${option}: the model has no variable "${name}" (variables: ${list})`, 2);
}
