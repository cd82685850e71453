import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';

const NO_ONLY = { selector: "CallExpression[callee.property.name='only']", message: 'no .only in committed tests' };
/** Hex colours are written in src/theme/ only, under a name that says what they do. */
const HEX = /^#([0-9a-fA-F]{3,4}|[0-9a-fA-F]{6}|[0-9a-fA-F]{8})$/.source;
const NO_HEX = [
  { selector: `Literal[value=/${HEX}/]`, message: 'hex colours live in src/theme/ (name a token there)' },
  { selector: `TemplateElement[value.raw=/#([0-9a-fA-F]{3,4}|[0-9a-fA-F]{6}|[0-9a-fA-F]{8})\\b/]`, message: 'hex colours live in src/theme/ (name a token there)' },
];
const NO_CLOSE_TO = { selector: "CallExpression[callee.property.name='toBeCloseTo']", message: 'approximate checks go through tests/helpers/tolerance.ts (expectClose / close), one tolerance policy' };

/** Numbers become text in src/present/numbers.ts only (one rounding, one minus sign). */
const NO_NUMBER_TEXT = ['toFixed', 'toPrecision'].map((property) => ({
  property,
  message: 'numbers are written by src/present/ (formatNumber, fixedText, precisionText, significant, rounded)',
}));
/** Variable names come from src/present/labels.ts: `labelOf(model, id)` or `labeller(model)`. */
const NO_LABEL_FALLBACK = {
  selector: "LogicalExpression[left.type='ChainExpression'][left.expression.type='MemberExpression'][left.expression.property.name='label']",
  message: 'a variable is named by labelOf(model, id) / labeller(model) from src/present/, not `?.label ?? id`',
};
/**
 * Files that still write numbers or labels by hand because another branch is changing them now;
 * each entry leaves with its branch's merge (then the rules above cover it).
 */
export const PRESENTATION_PENDING = {};

/**
 * The layers and what each may not import (see DEVELOPERS.md, "Layers").
 * Data flows one way: document and study → core → derived views → layout →
 * canvas, figures, files.
 */
const UI_LIBS = ['react', 'react-dom', 'react/*', 'react-dom/*', '@xyflow/*', 'zustand', 'zustand/*', 'zundo', 'idb-keyval'];
const layer = (dirs) => dirs.map((d) => `**/${d}/**`);
const ZONES = {
  'src/core': { libs: [...UI_LIBS, 'elkjs', 'elkjs/*', 'comlink'], dirs: ['ui', 'state', 'theme', 'report', 'examples', 'layout', 'worker', 'export', 'cli'] },
  'src/present': { libs: [...UI_LIBS, 'elkjs', 'elkjs/*', 'comlink'], dirs: ['ui', 'state', 'theme', 'report', 'examples', 'layout', 'worker', 'export', 'cli'], only: '/core/(?!model/)' },
  'src/theme': { libs: [...UI_LIBS, 'elkjs', 'elkjs/*'], dirs: ['ui', 'state', 'report', 'examples', 'layout', 'worker', 'export', 'cli', 'present'] },
  'src/export': { libs: UI_LIBS, dirs: ['ui', 'state', 'worker', 'cli', 'report', 'examples'] },
  'src/layout': { libs: UI_LIBS.filter((l) => !l.startsWith('@xyflow')), dirs: ['ui', 'state', 'cli', 'report', 'export'] },
  'src/report': { libs: UI_LIBS, dirs: ['ui', 'state', 'worker', 'cli'] },
  'src/worker': { libs: UI_LIBS, dirs: ['ui', 'state', 'cli', 'report', 'export', 'layout'] },
  'src/state': { libs: ['react-dom', '@xyflow/*'], dirs: ['ui', 'cli'] },
  'src/cli': { libs: UI_LIBS, dirs: ['ui', 'state', 'worker'] },
};
const zone = (dir, z) => ({
  files: [`${dir}/**/*.{ts,tsx}`],
  rules: {
    'no-restricted-imports': ['error', {
      patterns: [
        { group: z.libs, message: `${dir} may not use UI, store or layout libraries (DEVELOPERS.md, "Layers")` },
        { group: layer(z.dirs), message: `${dir} may not import from here (DEVELOPERS.md, "Layers")` },
        ...(z.only ? [{ regex: z.only, message: `${dir} reads only the core's model types (DEVELOPERS.md, "Layers")` }] : []),
      ],
    }],
  },
});
/** Browser and Node globals the pure layers may not touch (the compiler checks the DOM types: tsconfig.core.json). */
const PURE_GLOBALS = ['window', 'document', 'navigator', 'location', 'performance', 'requestAnimationFrame', 'cancelAnimationFrame', 'requestIdleCallback', 'localStorage', 'sessionStorage', 'indexedDB', 'setTimeout', 'setInterval', 'clearTimeout', 'clearInterval', 'fetch', 'XMLHttpRequest', 'WebSocket', 'Worker', 'self', 'alert', 'matchMedia', 'getComputedStyle', 'process', 'Buffer'];

export default tseslint.config(
  { ignores: ['dist', 'node_modules', 'test-results', 'playwright-report', 'reports'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ['**/*.{ts,tsx}'],
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      'no-restricted-syntax': ['error', NO_ONLY],
    },
  },
  // Every source file: no hex colour, numbers and names through src/present/. The blocks after this one
  // relax one rule each for a few folders; `no-restricted-syntax` is one rule, so each block that
  // narrows it restates what stays (a later block replaces the options of an earlier one).
  { files: ['src/**/*.{ts,tsx}'], rules: { 'no-restricted-syntax': ['error', NO_ONLY, ...NO_HEX, NO_LABEL_FALLBACK], 'no-restricted-properties': ['error', ...NO_NUMBER_TEXT] } },
  // The theme names the colours: hex allowed there, nothing else.
  { files: ['src/theme/**/*.{ts,tsx}'], rules: { 'no-restricted-syntax': ['error', NO_ONLY, NO_LABEL_FALLBACK] } },
  // src/present/ writes the numbers and names; the pending files still do by hand. Hex stays banned in both.
  { files: ['src/present/**/*.{ts,tsx}', ...Object.keys(PRESENTATION_PENDING)], rules: { 'no-restricted-syntax': ['error', NO_ONLY, ...NO_HEX], 'no-restricted-properties': 'off' } },
  { files: ['tests/**/*.{ts,tsx}'], rules: { 'no-restricted-syntax': ['error', NO_ONLY, NO_CLOSE_TO] } },
  {
    files: ['src/ui/**/*.{ts,tsx}', 'src/main.tsx'],
    plugins: { 'react-hooks': reactHooks },
    rules: { 'react-hooks/rules-of-hooks': 'error', 'react-hooks/exhaustive-deps': 'warn' },
  },
  ...Object.entries(ZONES).map(([dir, z]) => zone(dir, z)),
  {
    // The wall round the core: pure TypeScript, no browser or Node globals.
    files: ['src/core/**/*.ts', 'src/present/**/*.ts', 'src/export/**/*.ts'],
    rules: { 'no-restricted-globals': ['error', ...PURE_GLOBALS] },
  },
);
