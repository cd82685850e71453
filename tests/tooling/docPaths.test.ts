/**
 * The guide names files that exist: every path in a code span or a link of DEVELOPERS.md and
 * docs/dev/*.md resolves in the tree, so a moved or deleted file cannot leave the map pointing
 * at nothing. A path is taken as named when it has a slash and either starts with a top-level
 * entry of the repository (`src/`, `tests/`, `bench/`, …) or ends in a file extension; a short
 * one (`numeric/system.ts`) is looked up under `src/` and `src/core/` too, a relative link
 * (`../SOURCES.md`) from the note's folder, a module without its extension (`src/state/analysis`)
 * as `.ts`, `.tsx` or `/index.ts`, and a `*` in the last segment as a pattern.
 */
import { describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { dirname, join, normalize, relative, resolve } from 'node:path';

const ROOT = resolve('.');

/** Paths that stand in the notes on purpose though no such file exists, and why. */
const NOT_FILES: Record<string, string> = {
  'tests/x/y.test.ts': 'placeholder of the mirror rule',
  'src/x/y.ts': 'placeholder of the mirror rule',
};

/**
 * Stale paths in notes another branch is rewriting now ("pending: other branch"): each names the
 * note and the path, so a new stale path in the same note still fails.
 */
const PENDING: Record<string, string> = {};

/** Every path-like token in the code spans and link targets of a Markdown text. */
export function namedPaths(markdown: string, topLevel: ReadonlySet<string>): string[] {
  const spans = [...markdown.matchAll(/`([^`\n]+)`/g)].map((m) => m[1]).concat([...markdown.matchAll(/\]\(([^)\s]+)\)/g)].map((m) => m[1]));
  const out: string[] = [];
  for (const span of spans) {
    if (/:\/\//.test(span)) continue;
    for (const [tok] of span.matchAll(/(?:\.{1,2}\/)*[\w.@-]+(?:\/[\w.*@-]+)+\/?/g)) {
      if (tok.startsWith('@')) continue; // a package name
      const first = tok.replace(/^(\.{1,2}\/)+/, '').split('/')[0];
      const relativeLink = tok.startsWith('./') || tok.startsWith('../');
      if (relativeLink || topLevel.has(first) || /\.[a-z]{1,4}$/.test(tok)) out.push(tok);
    }
  }
  return [...new Set(out)];
}

/** Whether `path`, named in a note in folder `noteDir` (relative to the root), stands in the tree. */
export function resolves(path: string, noteDir: string, exists: (p: string) => boolean, list: (dir: string) => string[]): boolean {
  const bases = path.startsWith('.') ? [noteDir] : ['', 'src', 'src/core'];
  for (const base of bases) {
    const p = normalize(join(base, path)).split('\\').join('/').replace(/\/$/, '');
    if (p.startsWith('..')) continue;
    if (p.includes('*')) {
      const dir = dirname(p);
      const last = p.slice(dir.length + 1);
      if (dir.includes('*')) continue;
      const re = new RegExp(`^${last.split('*').map((s) => s.replace(/[.+?^${}()|[\]\\]/g, '\\$&')).join('.*')}$`);
      if (exists(dir) && list(dir).some((n) => re.test(n))) return true;
      continue;
    }
    for (const ext of ['', '.ts', '.tsx', '/index.ts']) if (exists(p + ext)) return true;
  }
  return false;
}

const notes = ['DEVELOPERS.md', ...readdirSync(join(ROOT, 'docs/dev')).filter((f) => f.endsWith('.md')).sort().map((f) => `docs/dev/${f}`)];
/** The repository's own top-level entries: what git tracks (a cache or build folder on this machine is not the tree). */
function trackedTopLevel(): Set<string> {
  try {
    return new Set(execFileSync('git', ['ls-files'], { cwd: ROOT, encoding: 'utf8', maxBuffer: 64 << 20 }).split('\n').filter(Boolean).map((p) => p.split('/')[0]));
  } catch {
    return new Set(readdirSync(ROOT).filter((n) => !n.startsWith('.') && n !== 'node_modules' && n !== 'dist'));
  }
}
const topLevel = trackedTopLevel();
const onDisk = (p: string) => existsSync(join(ROOT, p));
const listDir = (d: string) => readdirSync(join(ROOT, d));

describe('the guide names files that exist', () => {
  it.each(notes)('%s', (note) => {
    const named = namedPaths(readFileSync(join(ROOT, note), 'utf8'), topLevel);
    const missing = named.filter((p) => !(p in NOT_FILES) && !(`${note} ${p}` in PENDING) && !resolves(p, dirname(note), onDisk, listDir));
    expect(missing, `${note} names paths that are not in the tree: fix the note (git log --follow finds where a file went)`).toEqual([]);
  });

  it('reads enough of the guide to mean something', () => {
    const all = notes.flatMap((n) => namedPaths(readFileSync(join(ROOT, n), 'utf8'), topLevel));
    expect(notes.length).toBeGreaterThan(10);
    expect(all.length).toBeGreaterThan(200);
    expect(all).toContain('bench/HISTORY.md');
  });

  it('the allow-lists name notes that exist, each with a reason', () => {
    for (const [key, why] of Object.entries(PENDING)) {
      expect(notes, key).toContain(key.split(' ')[0]);
      expect(why).toBe('pending: other branch');
    }
    for (const why of Object.values(NOT_FILES)) expect(why.length).toBeGreaterThan(10);
  });

  it('the rule reads paths as stated (a made-up tree)', () => {
    const tree = new Set(['src', 'src/core', 'src/core/numeric', 'src/core/numeric/system.ts', 'src/state', 'src/state/analysis.ts', 'docs', 'docs/SOURCES.md', 'tests', 'tests/export', 'tests/export/snapshots', 'bench', 'bench/HISTORY.md']);
    const has = (p: string) => tree.has(p);
    const ls = (d: string) => [...tree].filter((p) => dirname(p) === d).map((p) => relative(d, p));
    const md = [
      'See `src/state/analysis` and [history](bench/HISTORY.md), [sources](../SOURCES.md),',
      '`numeric/system.ts`, `npx vitest run tests/export`, `tests/export/snapshots/*.svg`,',
      '`@resvg/resvg-js`, `https://example.org/a/b.ts`, `src/gone.ts`, `a + b`, `x/y`.',
    ].join('\n');
    const named = namedPaths(md, new Set(['src', 'tests', 'bench', 'docs']));
    expect(named).toEqual(['src/state/analysis', 'numeric/system.ts', 'tests/export', 'tests/export/snapshots/*.svg', 'src/gone.ts', 'bench/HISTORY.md', '../SOURCES.md']);
    const ok = (p: string) => resolves(p, 'docs/dev', has, ls);
    expect(named.filter((p) => !ok(p))).toEqual(['tests/export/snapshots/*.svg', 'src/gone.ts']);
    expect(resolves('../SOURCES.md', 'docs', has, ls)).toBe(false);
  });
});
