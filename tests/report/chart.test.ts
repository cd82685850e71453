import { describe, expect, it } from 'vitest';
import { settledIndex, trajectoryChart } from '../../src/report/chart';

describe('the two-run chart', () => {
  const times = Array.from({ length: 101 }, (_, k) => k);
  const decay = times.map((t) => 10 - 10 * Math.exp(-t / 5)); // settles within about 5·ln(100) ≈ 23 (hand-derived)
  const flat = times.map(() => 0);

  it('crops where the runs have done 99% of their moving, with a margin of half as long again', () => {
    const k = settledIndex(times, [flat, decay]);
    // Last point more than 1% of the range (0.1) from the end: 10·e^(−t/5) > 0.1 ⇒ t < 23.03, so t = 23; 1.5 × 23 = 34.5 → 35.
    expect(k).toBe(35);
  });

  it('draws both runs, dashed without and solid with, and escapes the label', () => {
    const svg = trajectoryChart({ times, without: { a: flat }, with: { a: decay } }, 'a', 'Soil <water> & "more"', { timeUnit: 'min', crop: true });
    expect(svg.match(/<polyline/g)).toHaveLength(2);
    expect(svg).toMatch(/class="without"[^>]*stroke-dasharray/);
    expect(svg).not.toMatch(/class="with"[^>]*stroke-dasharray/);
    expect(svg).toContain('Soil &lt;water&gt; &amp; &quot;more&quot;');
    expect(svg.match(/class="with" points="([^"]*)"/)![1].split(' ')).toHaveLength(36);
  });
});
