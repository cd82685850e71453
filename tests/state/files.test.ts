import { describe, expect, it } from 'vitest';
import { compressToEncodedURIComponent } from 'lz-string';
import { describeIssues, fileNameFor, readModelText, readShareFragment, serializeModel, shareFragment } from '../../src/state/files';
import { EXAMPLES } from '../../src/examples/index';
import { parseModel } from '../../src/core/model/schema';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runPython } from '../helpers/python';

const example = () => {
  const r = parseModel(EXAMPLES[0].model);
  if (!r.ok) throw new Error('example does not parse');
  return r.model;
};

describe('model files', () => {
  it('save then open gives back the same model (ids are added to links)', () => {
    const m = example();
    const r = readModelText(serializeModel(m));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.model.variables).toEqual(m.variables);
    expect(r.model.links.map(({ id: _id, ...l }) => l)).toEqual(m.links);
    expect(new Set(r.model.links.map((l) => l.id)).size).toBe(m.links.length);
  });

  it('the saved text is plain JSON that Python’s json module reads to the same data', () => {
    const text = serializeModel(example());
    const dir = mkdtempSync(join(tmpdir(), 'lf-'));
    const script = join(dir, 'read.py');
    // strict reading: Python's json module refuses NaN/Infinity only with parse_constant raising
    writeFileSync(script, 'import json,sys\ntext=json.load(sys.stdin)\ndef no(c):\n    raise ValueError(c)\nprint(json.dumps(json.loads(text, parse_constant=no)))\n');
    const out = runPython<unknown>(script, text);
    expect(out).toEqual(JSON.parse(text));
  });

  it('names files after the model with the Loopfold suffix', () => {
    expect(fileNameFor('Sleep, stress and mood (illustrative)')).toBe('sleep-stress-and-mood-illustrative.loopfold.json');
    expect(fileNameFor('../../etc/passwd')).toBe('etcpasswd.loopfold.json');
    expect(fileNameFor('')).toBe('model.loopfold.json');
  });

  it('reports broken JSON and schema problems with their JSON paths', () => {
    const broken = readModelText('{ "format": "loopfold-model", ');
    expect(broken.ok).toBe(false);
    if (!broken.ok) expect(describeIssues(broken.issues)[0]).toMatch(/^\(file\): is not valid JSON/);
    const bad = readModelText(JSON.stringify({ format: 'loopfold-model', version: 1, name: 'x', timeUnit: 'h', variables: [{ id: 'a', kind: 'input', timescale: 'soon' }], links: [{ from: 'a', to: 'ghost', kind: 'instantaneous' }] }));
    expect(bad.ok).toBe(false);
    if (!bad.ok) {
      const lines = describeIssues(bad.issues);
      expect(lines.some((l) => l.startsWith('variables[0].timescale'))).toBe(true);
      expect(lines.some((l) => l.startsWith('links[0].to') && l.includes('ghost'))).toBe(true);
    }
  });

  it('refuses hostile content without executing it', () => {
    (globalThis as Record<string, unknown>).__pwned = false;
    const hostile = [
      serializeModel(example()).replace('{', '{"__proto__": {"polluted": true},'),
      '{"format":"loopfold-model","version":1,"name":"x","timeUnit":"h","variables":[{"id":"constructor","kind":"derived","formula":"import(\\"x\\")"}],"links":[],"toString":1}',
      JSON.stringify({ ...example(), variables: [{ id: 'a', kind: 'derived', formula: 'globalThis.__pwned = true' }] }),
    ];
    const results = hostile.map(readModelText);
    expect(results[0].ok).toBe(false); // an own "__proto__" field is an unknown field
    expect(results[1].ok).toBe(false); // unknown top-level field "toString"
    // the formula text is only stored, never evaluated
    expect((globalThis as Record<string, unknown>).__pwned).toBe(false);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });
});

describe('share links', () => {
  it('round-trips the model through the URL fragment', () => {
    const m = example();
    const frag = shareFragment(m);
    expect(frag.startsWith('#m=')).toBe(true);
    // the fragment only uses characters that need no escaping in a URL (RFC 3986 unreserved plus "+" and "$")
    expect(/^#m=[A-Za-z0-9+\-$_.!~*'()]*$/.test(frag)).toBe(true);
    const r = readShareFragment(frag);
    expect(r && r.ok && r.model.variables).toEqual(m.variables);
  });

  it('returns null for a fragment without a model, and a message for damaged ones', () => {
    expect(readShareFragment('')).toBeNull();
    expect(readShareFragment('#view=2')).toBeNull();
    for (const h of ['#m=', '#m=%%%', '#m=AAAAAAAA', `#m=${compressToEncodedURIComponent('not json')}`, `#m=${compressToEncodedURIComponent('{"format":"other"}')}`]) {
      const r = readShareFragment(h);
      expect(r).not.toBeNull();
      expect(r!.ok).toBe(false);
      if (r && !r.ok) expect(r.issues[0].message.length).toBeGreaterThan(5);
    }
  });
});
