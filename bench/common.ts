/** Pieces every benchmark script prints with: the sizes asked for, median and p95, and the wording of figures. */

/** `--sizes 500` (or `--sizes 200,500`) measures only those models; by default 50, 200, 500 and 2,000 variables. */
export function sizesFromArgs(argv: readonly string[] = process.argv): number[] {
  const arg = argv[argv.indexOf('--sizes') + 1];
  return argv.includes('--sizes') && arg ? arg.split(',').map(Number) : [50, 200, 500, 2000];
}

/** Median and 95th percentile (nearest rank). */
export function stats(xs: number[]): { median: number; p95: number } {
  const s = [...xs].sort((a, b) => a - b);
  const q = (p: number) => s[Math.min(s.length - 1, Math.max(0, Math.ceil(p * s.length) - 1))];
  return { median: q(0.5), p95: q(0.95) };
}

export const ms = (x: number) => `${x < 10 ? x.toFixed(2) : x.toFixed(0)} ms`;
export const verdict = (ok: boolean) => (ok ? 'meets goal' : 'MISSES goal');
