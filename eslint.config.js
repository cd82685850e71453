import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';

export default tseslint.config(
  { ignores: ['dist', 'node_modules', 'test-results', 'playwright-report', 'reports'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ['**/*.{ts,tsx}'],
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      'no-restricted-syntax': ['error', { selector: "CallExpression[callee.property.name='only']", message: 'no .only in committed tests' }],
    },
  },
  {
    files: ['src/ui/**/*.{ts,tsx}', 'src/main.tsx'],
    plugins: { 'react-hooks': reactHooks },
    rules: { 'react-hooks/rules-of-hooks': 'error', 'react-hooks/exhaustive-deps': 'warn' },
  },
  {
    // The wall around the core: pure TypeScript, no React, no stores, no DOM-facing code.
    files: ['src/core/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', {
        patterns: [
          { group: ['react', 'react-dom', 'react/*', '@xyflow/*', 'zustand', 'zustand/*', 'zundo', 'idb-keyval', 'elkjs', 'elkjs/*'], message: 'src/core stays pure: no UI, store or layout libraries' },
          { group: ['**/ui/**', '**/state/**', '**/worker/**', '**/layout/**', '**/export/**', '**/cli/**'], message: 'src/core imports nothing from the rest of the app' },
        ],
      }],
      'no-restricted-globals': ['error', 'window', 'document', 'localStorage', 'indexedDB', 'setTimeout', 'setInterval', 'fetch'],
    },
  },
);
