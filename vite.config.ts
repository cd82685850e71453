import { defineConfig } from 'vitest/config';
import react from '@vitejs/plugin-react';

export default defineConfig({
  plugins: [react()],
  worker: { format: 'es' },
  optimizeDeps: {
    // Dependencies used only inside workers are otherwise discovered late and
    // make the dev server reload the page in the middle of a session.
    include: ['mathjs', 'comlink', 'elkjs/lib/elk-api.js', 'elkjs/lib/elk.bundled.js', 'ml-matrix', 'zod', 'lz-string', 'idb-keyval', 'papaparse'],
  },
  build: { target: 'es2022', chunkSizeWarningLimit: 2000 },
  test: {
    include: ['tests/**/*.test.ts', 'tests/**/*.test.tsx'],
    environment: 'node',
    testTimeout: 60_000,
    pool: 'forks',
  },
});
