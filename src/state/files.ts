/**
 * Model files and share links. Both are untrusted: they are parsed as JSON
 * and validated by parseModel; nothing in them is ever executed.
 */
import { compressToEncodedURIComponent, decompressFromEncodedURIComponent } from 'lz-string';
import { parseModel, parseModelText, type ModelIssue, type ParseResult } from '../core/model/schema';
import { migrateModel } from '../core/model/migrate';
import type { Model } from '../core/model/types';
import { withLinkIds } from './changes';

export const FILE_SUFFIX = '.loopfold.json';
/** Larger files are refused before parsing (the schema's limits would refuse them anyway). */
export const MAX_FILE_BYTES = 20 * 1024 * 1024;
export const MAX_LINK_CHARS = 2_000_000;

export type OpenResult = { ok: true; model: Model; warnings: ModelIssue[] } | { ok: false; issues: ModelIssue[] };

function accept(r: ParseResult): OpenResult {
  if (!r.ok) return r;
  return { ok: true, model: withLinkIds(r.model), warnings: r.warnings };
}

/** The model as written to files and links: the current file version, its fields in a reader's order. */
export function fileModel(model: Model): Model {
  const m = migrateModel(model);
  const { format, version, name, ...rest } = m;
  return { format, version, name, ...rest };
}

/** The text written to a model file (always the current file version). */
export function serializeModel(model: Model): string {
  return `${JSON.stringify(fileModel(model), null, 2)}\n`;
}

/** A file name for the model: its name made safe, with the Loopfold suffix. */
export function fileNameFor(name: string): string {
  const stem = name
    .normalize('NFKD')
    .replace(/[^\w\s-]/g, '')
    .trim()
    .replace(/\s+/g, '-')
    .toLowerCase()
    .slice(0, 60);
  return `${stem || 'model'}${FILE_SUFFIX}`;
}

/** Read model file text. */
export function readModelText(text: string): OpenResult {
  if (text.length > MAX_FILE_BYTES) return { ok: false, issues: [{ path: '(file)', message: `is larger than ${MAX_FILE_BYTES / 1024 / 1024} MB` }] };
  return accept(parseModelText(text));
}

/** The URL fragment `#m=…` that carries a model. */
export function shareFragment(model: Model): string {
  return `#m=${compressToEncodedURIComponent(JSON.stringify(fileModel(model)))}`;
}

/**
 * Read a model from a URL fragment. Returns null when the fragment carries
 * no model, an OpenResult otherwise.
 */
export function readShareFragment(hash: string): OpenResult | null {
  const h = hash.startsWith('#') ? hash.slice(1) : hash;
  const param = new URLSearchParams(h).get('m');
  if (param === null) return null;
  const fail = (message: string): OpenResult => ({ ok: false, issues: [{ path: '(link)', message }] });
  if (param.length > MAX_LINK_CHARS) return fail('is too long to be a Loopfold share link');
  let text: string | null;
  try {
    text = decompressFromEncodedURIComponent(param);
  } catch {
    text = null;
  }
  if (!text) return fail('is damaged: the model it carries cannot be unpacked (was the link cut short?)');
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (e) {
    return fail(`does not carry valid JSON: ${(e as Error).message}`);
  }
  return accept(parseModel(json));
}

/** Issues as lines "path: message", the way the editor and tests show them. */
export function describeIssues(issues: ModelIssue[]): string[] {
  return issues.map((i) => `${i.path}: ${i.message}`);
}
