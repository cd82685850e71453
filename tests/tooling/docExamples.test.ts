/**
 * The `Example:` lines of the doc comments in src/core and src/present run as
 * tests. Each code span after "Example:" is run with node:vm in a context
 * holding the module's own exports (plus `fromRows` for matrices); when the
 * comment shows a result (`→ value`, `≈ number`, `= value`, or the result in
 * a code span after the arrow), the value is checked against it, numbers to
 * the digits shown. An example that needs an input the comment does not give
 * (a `model`, a `panel`) cannot run: its functions must still be exports of
 * the module, so a renamed function fails here too.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import vm from 'node:vm';
import { describe, expect, it } from 'vitest';

const ROOT = join(__dirname, '..', '..');

function sources(dir: string): string[] {
  return readdirSync(dir).flatMap((f) => {
    const p = join(dir, f);
    if (statSync(p).isDirectory()) return sources(p);
    return p.endsWith('.ts') && !p.endsWith('.d.ts') ? [relative(ROOT, p).split('\\').join('/')] : [];
  });
}

export interface DocExample {
  file: string;
  line: number;
  code: string;
  /** The shown result as written, and how it is related to the code's value. */
  result?: { text: string; relation: '→' | '≈' | '=' ; span: boolean };
}

/** The text of every doc comment with the line it starts on, leading `*` stripped. */
function comments(text: string): { line: number; body: string }[] {
  const out: { line: number; body: string }[] = [];
  const re = /\/\*\*([\s\S]*?)\*\//g;
  let m: RegExpExecArray | null;
  while ((m = re.exec(text))) {
    const line = text.slice(0, m.index).split('\n').length;
    out.push({ line, body: m[1].split('\n').map((l) => l.replace(/^\s*\*\s?/, '')).join(' ') });
  }
  return out;
}

/** The examples of one file: code spans after "Example:", each with the result the comment shows, if any. */
export function examplesOf(file: string, text: string): DocExample[] {
  const out: DocExample[] = [];
  for (const c of comments(text)) {
    const at = c.body.indexOf('Example:');
    if (at < 0) continue;
    const rest = c.body.slice(at + 'Example:'.length);
    const spans = [...rest.matchAll(/`([^`]+)`/g)];
    for (let i = 0; i < spans.length; i++) {
      const s = spans[i];
      const code = s[1];
      if (!/[A-Za-z_$][\w$]*\s*\(/.test(code)) continue; // a literal, not a call
      if (/^(?:formula|rate|hold)\([\w$]+\)$/.test(code)) continue; // an equation's name, not a call
      const end = s.index! + s[0].length;
      const next = spans[i + 1];
      const between = rest.slice(end, next ? next.index : undefined);
      const arrowToSpan = /^\s*(→|≈|=)\s*$/.exec(next ? rest.slice(end, next.index) : '');
      if (arrowToSpan && next) {
        out.push({ file, line: c.line, code, result: { text: next[1], relation: arrowToSpan[1] as '→', span: true } });
        i++;
        continue;
      }
      const shown = /^\s*(?:is\s+|gives\s+)?(→|≈|=)\s*(.+)$/.exec(between);
      out.push({ file, line: c.line, code, result: shown ? { text: shown[2], relation: shown[1] as '→', span: false } : undefined });
    }
  }
  return out;
}

/** The shown result as a value: a code span as a string (escapes read as in JS), else the longest leading JS literal; undefined when it is prose. */
export function shownValue(r: NonNullable<DocExample['result']>): { ok: true; value: unknown } | { ok: false } {
  if (r.span) {
    try {
      return { ok: true, value: vm.runInNewContext('`' + r.text + '`') };
    } catch {
      return { ok: false };
    }
  }
  // typographic minus signs in shown numbers are read as hyphens (the module's own output keeps them as written)
  const text = r.text.trim();
  for (let n = text.length; n > 0; n--) {
    const cand = text.slice(0, n).trim();
    if (!cand || /[.;,]$/.test(cand)) continue;
    try {
      const value = vm.runInNewContext(`(${cand})`, {});
      if (value === undefined || typeof value === 'function') continue; // "[3, 1]. The" reads as a property
      return { ok: true, value };
    } catch {
      // shorter
    }
  }
  return { ok: false };
}

/** Decimals a shown number carries: "0.975" → 3, "300" → 0, "1.959963984540054" → 15. */
function shownDecimals(x: number, source: string): number {
  const m = new RegExp(`${String(x).replace('.', '\\.')}`).exec(source);
  if (!m) return 12;
  const d = /\.(\d+)/.exec(String(x));
  return d ? d[1].length : 0;
}

/** Does `actual` show as `expected` (objects: the shown keys only; numbers: to the digits shown)? */
export function showsAs(actual: unknown, expected: unknown, source: string, exact: boolean): string | null {
  if (typeof expected === 'number') {
    const a = typeof actual === 'number' ? actual : actual instanceof Number ? Number(actual) : NaN;
    if (!Number.isFinite(expected)) return Object.is(a, expected) ? null : `${a} is not ${expected}`;
    const tol = exact && Number.isInteger(expected) ? 1e-9 * Math.max(1, Math.abs(expected)) : 0.5 * 10 ** -shownDecimals(expected, source) + 1e-12 * Math.abs(expected);
    return Math.abs(a - expected) <= tol ? null : `${a} is not ${expected} (to ±${tol})`;
  }
  if (Array.isArray(expected)) {
    const arr = actual && typeof actual === 'object' && Symbol.iterator in (actual as object) ? [...(actual as Iterable<unknown>)] : null;
    if (!arr || arr.length !== expected.length) return `${JSON.stringify(actual)} is not ${JSON.stringify(expected)}`;
    for (let i = 0; i < expected.length; i++) {
      const e = showsAs(arr[i], expected[i], source, exact);
      if (e) return `[${i}]: ${e}`;
    }
    return null;
  }
  if (expected && typeof expected === 'object') {
    if (!actual || typeof actual !== 'object') return `${JSON.stringify(actual)} is not an object`;
    for (const [k, v] of Object.entries(expected)) {
      const e = showsAs((actual as Record<string, unknown>)[k], v, source, exact);
      if (e) return `.${k}: ${e}`;
    }
    return null;
  }
  return Object.is(actual, expected) ? null : `${JSON.stringify(actual)} is not ${JSON.stringify(expected)}`;
}

const GLOBALS = new Set(['Math', 'Number', 'String', 'Array', 'Float64Array', 'Object', 'JSON', 'Map', 'Set', 'Boolean', 'Symbol', 'Infinity', 'NaN', 'undefined', 'console', 'Date']);
const KEYWORDS = new Set(['const', 'let', 'var', 'new', 'typeof', 'return', 'function', 'if', 'for', 'while', 'of', 'in', 'true', 'false', 'null', 'this']);

/** Functions an example calls by name (not methods of a value), less those it defines itself. */
export function calledNames(code: string): string[] {
  const bare = code.replace(/"(?:[^"\\]|\\.)*"|'(?:[^'\\]|\\.)*'/g, '""');
  const local = new Set([...bare.matchAll(/\b(?:const|let|var)\s+([A-Za-z_$][\w$]*)/g)].map((m) => m[1]));
  const called = [...bare.matchAll(/(?<![.\w$])([A-Za-z_$][\w$]*)\s*\(/g)].map((m) => m[1]);
  return [...new Set(called.filter((n) => !local.has(n) && !GLOBALS.has(n) && !KEYWORDS.has(n)))];
}

const files = [...sources(join(ROOT, 'src/core')), ...sources(join(ROOT, 'src/present'))].sort();
const examples = files.flatMap((f) => examplesOf(f, readFileSync(join(ROOT, f), 'utf8')));

describe('the reader of doc examples', () => {
  it('finds code and shown results in the forms the comments use', () => {
    const ex = examplesOf('f.ts', '/**\n * Example: `f(1)` → [0.2, 300].\n */\n/** Example: `g("a")` → `a\\r\\n`; `h(2)` ≈ 0.975. Example: `k(model)`. */');
    expect(ex.map((e) => [e.code, e.result?.relation, e.result?.span])).toEqual([['f(1)', '→', false], ['g("a")', '→', true], ['h(2)', '≈', false], ['k(model)', undefined, undefined]]);
    expect(shownValue(ex[0].result!)).toEqual({ ok: true, value: [0.2, 300] });
    expect(shownValue(ex[1].result!)).toEqual({ ok: true, value: 'a\r\n' });
    expect(shownValue({ text: 'point √1.5 ≈ 1.22, low 0.5', relation: '→', span: false })).toEqual({ ok: false });
    expect(shownValue({ text: '{ ok: true, value: 0.125 }.', relation: '→', span: false })).toEqual({ ok: true, value: { ok: true, value: 0.125 } });
    // numbers to the digits shown; objects by the keys shown
    expect(showsAs(0.97500001, 0.975, '0.975', false)).toBeNull();
    expect(showsAs(0.9761, 0.975, '0.975', false)).not.toBeNull();
    expect(showsAs({ ok: true, value: 0.125, extra: 1 }, { ok: true, value: 0.125 }, '', true)).toBeNull();
    expect(calledNames('const r = make(7); r.next(); normal(x.y(2), "a(b)")')).toEqual(['make', 'normal']);
  });
});

describe('Example: lines in src/core and src/present', () => {
  it('there are examples to run, from most folders of the core', () => {
    expect(examples.length).toBeGreaterThan(60);
  });

  /** A function the example takes from another module of the same layer (`parseExpression` beside `compileExpression`). */
  const elsewhere = async (name: string, file: string): Promise<unknown> => {
    const layer = file.startsWith('src/present/') ? 'src/present/' : 'src/core/';
    const folder = file.slice(0, file.lastIndexOf('/') + 1);
    const near = files.filter((f) => f.startsWith(layer)).sort((a, b) => Number(b.startsWith(folder)) - Number(a.startsWith(folder)));
    for (const f of near) {
      const m = (await import(/* @vite-ignore */ join(ROOT, f))) as Record<string, unknown>;
      if (typeof m[name] === 'function') return m[name];
    }
    return undefined;
  };
  const tally = { sketches: [] as string[], ran: [] as string[], checked: [] as string[], unread: [] as string[] };
  for (const ex of examples) {
    it(`${ex.file}:${ex.line} ${ex.code.slice(0, 70)}`, async () => {
      const mod = (await import(/* @vite-ignore */ join(ROOT, ex.file))) as Record<string, unknown>;
      const helpers: Record<string, unknown> = {};
      for (const name of calledNames(ex.code)) {
        if (name in mod) continue;
        helpers[name] = await elsewhere(name, ex.file);
        expect(helpers[name], `${ex.file}: the example calls ${name}, which neither the module nor the rest of its layer exports`).toBeDefined();
      }
      // an elided example ("{ …, version: 1 }") is a sketch of a call: its functions exist (above), it is not run
      if (ex.code.includes('…')) { tally.sketches.push(ex.code); return; }
      const context = vm.createContext({ ...helpers, ...mod });
      let value: unknown;
      try {
        value = vm.runInContext(ex.code, context, { timeout: 5000 });
      } catch (e) {
        // an input the comment does not give (model, panel, A…): the example is a sketch of a call
        if (e instanceof Error && e.name === 'ReferenceError' || (e as { constructor?: { name?: string } })?.constructor?.name === 'ReferenceError') {
          const missing = /(\S+) is not defined/.exec(String((e as Error).message))?.[1];
          expect(missing, String(e)).toBeDefined();
          expect(calledNames(ex.code), `${missing} is called but not defined`).not.toContain(missing);
          tally.sketches.push(ex.code);
          return;
        }
        throw new Error(`${ex.file}:${ex.line}: the example \`${ex.code}\` throws: ${String(e)}`, { cause: e });
      }
      tally.ran.push(ex.code);
      if (!ex.result) return;
      const shown = shownValue(ex.result);
      if (!shown.ok) { tally.unread.push(`${ex.code} ${ex.result.relation} ${ex.result.text}`); return; } // the result is said in words
      const problem = showsAs(value, shown.value, ex.result.text, ex.result.relation === '→');
      expect(problem, `${ex.file}:${ex.line}: \`${ex.code}\` ${ex.result.relation} ${ex.result.text}`).toBeNull();
      tally.checked.push(ex.code);
    });
  }

  it('runs the self-contained examples and checks the results they show', () => {
    // measured when written: 48 sketches (inputs not given), 31 run, 21 with a result checked, 3 results said in words
    expect(tally.ran.length).toBeGreaterThanOrEqual(30);
    expect(tally.checked.length).toBeGreaterThanOrEqual(20);
    expect(tally.checked).toContain('normalQuantile(0.975)');
    expect(tally.unread.length).toBeLessThanOrEqual(5);
  });
});
