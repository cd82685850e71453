// `npm run bench`: every benchmark, each printing its figures and its ratio against a
// reference implementation (SciPy, NetworkX, ELK defaults) measured in the same run.
// `npm run bench -- ordering numeric` runs only the named parts.
import { existsSync } from 'node:fs';

const PARTS: { name: string; file: string; fn: string }[] = [
  { name: 'ordering', file: './ordering.ts', fn: 'benchOrdering' },
  { name: 'numeric', file: './numeric.ts', fn: 'benchNumeric' },
  { name: 'layout', file: './layout.ts', fn: 'benchLayout' },
  { name: 'canvas', file: './canvas.ts', fn: 'benchCanvas' },
  { name: 'bands', file: './bands.ts', fn: 'benchBands' },
  { name: 'cli', file: './cli.ts', fn: 'benchCli' },
  { name: 'undersample', file: './undersample.ts', fn: 'benchUndersample' },
  { name: 'data', file: './data.ts', fn: 'benchData' },
  { name: 'data', file: './coint.ts', fn: 'benchCoint' },
  { name: 'power', file: './power.ts', fn: 'benchPower' },
];

const wanted = process.argv.slice(2);
let failed = 0;
for (const part of PARTS) {
  if (wanted.length > 0 && !wanted.includes(part.name)) continue;
  if (!existsSync(new URL(part.file, import.meta.url))) {
    console.log(`\n## ${part.name}: no benchmark yet`);
    continue;
  }
  console.log(`\n## ${part.name}`);
  try {
    const mod = (await import(part.file)) as Record<string, () => Promise<void>>;
    await mod[part.fn]();
  } catch (e) {
    failed++;
    console.log(`${part.name} benchmark failed: ${(e as Error).stack ?? e}`);
  }
}
process.exitCode = failed > 0 ? 1 : 0;
