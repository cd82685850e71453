import { spawnSync } from 'node:child_process';

/**
 * Run a Python reference script (SciPy / NumPy / NetworkX) with JSON on stdin
 * and JSON on stdout. Reference values come from these general-purpose
 * libraries, never from the project's own code.
 */
/** The interpreter with SciPy and NetworkX; .ci/run sets LOOPFOLD_PYTHON when it is not the first python3. */
export const PYTHON = process.env.LOOPFOLD_PYTHON ?? 'python3';

export function runPython<T>(script: string, input: unknown): T {
  const r = spawnSync(PYTHON, [script], { input: JSON.stringify(input), encoding: 'utf8', maxBuffer: 1 << 30 });
  if (r.status !== 0) throw new Error(`${PYTHON} ${script} failed (${r.status}): ${r.stderr}`);
  return JSON.parse(r.stdout) as T;
}
