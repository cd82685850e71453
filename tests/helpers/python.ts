import { spawnSync } from 'node:child_process';

function hasReferenceLibraries(python: string): boolean {
  return spawnSync(python, ['-c', 'import scipy, numpy, networkx'], { encoding: 'utf8' }).status === 0;
}

/**
 * The interpreter with SciPy, NumPy and NetworkX: LOOPFOLD_PYTHON when set, else the first
 * python3 on PATH when it has them, else Debian's /usr/bin/python3 (where scripts/setup.sh
 * installs them).
 */
export const PYTHON = process.env.LOOPFOLD_PYTHON ?? (hasReferenceLibraries('python3') ? 'python3' : '/usr/bin/python3');

/**
 * Run a Python reference script (SciPy / NumPy / NetworkX) with JSON on stdin
 * and JSON on stdout. Reference values come from these general-purpose
 * libraries, never from the project's own code.
 */
export function runPython<T>(script: string, input: unknown): T {
  const r = spawnSync(PYTHON, [script], { input: JSON.stringify(input), encoding: 'utf8', maxBuffer: 1 << 30 });
  if (r.status !== 0) throw new Error(`${PYTHON} ${script} failed (${r.status}): ${r.stderr}`);
  return JSON.parse(r.stdout) as T;
}
