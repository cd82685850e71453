/**
 * Tests mirror the source tree: tests/X/Y.test.ts tests src/X/Y.ts (or .tsx). A file may carry
 * one dotted aspect before `.test` (tests/X/Y.fuzz.test.ts, Y.snapshots.test.ts) when one source
 * has more than one kind of test. A test file with no such source fails here unless it stands in
 * CROSS_CUTTING below, with the reason it tests no single source.
 */
import { describe, expect, it } from 'vitest';
import { existsSync, readdirSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';

/** Test files that check the project as a whole rather than one source, and why. */
export const CROSS_CUTTING: Record<string, string> = {
  'tests/tooling/mirror.test.ts': 'checks where the test files stand',
  'tests/tooling/wall.test.ts': 'probes the lint zones and the core tsconfig, which are configuration',
  'tests/tooling/docExamples.test.ts': 'runs the Example: comments of every core and presentation file',
  'tests/tooling/docPaths.test.ts': 'checks that the paths DEVELOPERS.md and docs/dev name exist, which are prose',
  'tests/tooling/benchUndersample.test.ts': 'checks the bench script bench/undersample.ts, which stands outside src/',
};

const ROOT = resolve('.');

function testFiles(dir: string): string[] {
  const out: string[] = [];
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    const p = join(dir, e.name);
    if (e.isDirectory()) out.push(...testFiles(p));
    else if (/\.test\.tsx?$/.test(e.name)) out.push(relative(ROOT, p).split('\\').join('/'));
  }
  return out.sort();
}

/** The source a test file at `path` (relative to the root) mirrors, or null when there is none. */
export function sourceOf(path: string, exists: (p: string) => boolean = (p) => existsSync(join(ROOT, p))): string | null {
  const m = /^tests\/(.+?)\.test\.tsx?$/.exec(path);
  if (!m) return null;
  const stems = [m[1]];
  const dot = /^(.*\/)?([^/]+)\.[^./]+$/.exec(m[1]);
  if (dot) stems.push(`${dot[1] ?? ''}${dot[2]}`);
  for (const stem of stems) for (const ext of ['.ts', '.tsx']) if (exists(`src/${stem}${ext}`)) return `src/${stem}${ext}`;
  return null;
}

describe('test paths mirror src/', () => {
  const files = testFiles(join(ROOT, 'tests'));

  it('every test file has a same-named source or is listed as cross-cutting with its reason', () => {
    expect(files.length).toBeGreaterThan(100);
    const orphans = files.filter((f) => sourceOf(f) === null && !(f in CROSS_CUTTING));
    expect(orphans, 'move these next to the path of their source (git mv), or list them in CROSS_CUTTING').toEqual([]);
  });

  it('the cross-cutting list is short, names files that exist, and each has a reason', () => {
    const listed = Object.entries(CROSS_CUTTING);
    expect(listed.length).toBeLessThanOrEqual(8);
    for (const [f, why] of listed) {
      expect(files, f).toContain(f);
      expect(sourceOf(f), `${f} has a source; take it off the list`).toBeNull();
      expect(why.length, f).toBeGreaterThan(10);
    }
  });

  it('the rule reads paths as stated (a made-up tree)', () => {
    const tree = new Set(['src/core/data/import.ts', 'src/ui/views/ExplainList.tsx', 'src/cli/commands/ordering.ts']);
    const has = (p: string) => tree.has(p);
    expect(sourceOf('tests/core/data/import.test.ts', has)).toBe('src/core/data/import.ts');
    expect(sourceOf('tests/core/data/import.fuzz.test.ts', has)).toBe('src/core/data/import.ts');
    expect(sourceOf('tests/ui/views/ExplainList.test.tsx', has)).toBe('src/ui/views/ExplainList.tsx');
    expect(sourceOf('tests/cli/commands/ordering.check.test.ts', has)).toBe('src/cli/commands/ordering.ts');
    expect(sourceOf('tests/core/data/importFuzz.test.ts', has)).toBeNull();
    expect(sourceOf('tests/cli/ordering.test.ts', has)).toBeNull();
    expect(sourceOf('tests/core/data/import.a.b.test.ts', has)).toBeNull();
  });
});
