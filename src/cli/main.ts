import { readFileSync, writeFileSync } from 'node:fs';
import { runCli } from './run';

const code = await runCli(process.argv.slice(2), {
  out: (t) => process.stdout.write(t.endsWith('\n') ? t : `${t}\n`),
  err: (t) => process.stderr.write(t.endsWith('\n') ? t : `${t}\n`),
  readFile: (p) => readFileSync(p, 'utf8'),
  writeFile: (p, c) => writeFileSync(p, c),
  writeBytes: (p, c) => writeFileSync(p, c),
});
process.exitCode = code;
