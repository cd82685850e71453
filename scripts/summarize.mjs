// Reads vitest's and Playwright's JSON reports and prints one closing line "N passed, N failed".
import { existsSync, readFileSync } from 'node:fs';
const [vitestPath, pwPath, otherFail] = process.argv.slice(2);
let passed = 0, failed = 0, skipped = 0;
if (existsSync(vitestPath)) {
  const v = JSON.parse(readFileSync(vitestPath, 'utf8'));
  passed += v.numPassedTests ?? 0; failed += v.numFailedTests ?? 0; skipped += (v.numPendingTests ?? 0) + (v.numTodoTests ?? 0);
  if ((v.numFailedTestSuites ?? 0) > 0 && (v.numFailedTests ?? 0) === 0) failed += v.numFailedTestSuites;
} else { console.log('vitest wrote no report'); failed += 1; }
if (existsSync(pwPath)) {
  const p = JSON.parse(readFileSync(pwPath, 'utf8'));
  passed += p.stats?.expected ?? 0; failed += (p.stats?.unexpected ?? 0); skipped += p.stats?.skipped ?? 0;
  failed += (p.errors ?? []).length;
} else { console.log('playwright wrote no report'); failed += 1; }
if (otherFail === '1' && failed === 0) { console.log('typecheck or lint failed'); failed = 1; }
console.log(`${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}`);
process.exit(failed > 0 ? 1 : 0);
