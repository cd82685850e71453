/**
 * The ordering and the three instants on the page: for every example at every band, at 1440×900 and
 * 1024×768, the boxes the browser draws for the nodes never overlap or touch, and no block's frame
 * covers a node outside the block, once the tuned layout has arrived. Screenshots of each example's views are kept in the test output.
 */
import { expect, test, type Page } from '@playwright/test';

const EXAMPLES = ['sleep-stress', 'lake', 'greenhouse', 'warehouse', 'evening-unrest'];
const SIZES = [{ width: 1440, height: 900 }, { width: 1024, height: 768 }];
const VIEWS = [{ button: 'Ordering', figure: 'The ordering at the interval' }, { button: 'Three instants', figure: 'The ordering over three instants' }];

const pane = (page: Page) => page.locator('.lf-timescale');
const slider = (page: Page) => page.getByRole('slider', { name: 'Sampling interval' });

/** Node boxes that overlap or touch, and frames over foreign nodes, as the browser lays them out. */
async function clashes(page: Page, name: string): Promise<{ nodes: number; bad: string[] }> {
  return page.getByRole('figure', { name }).evaluate((root) => {
    const nodes = [...root.querySelectorAll('g[data-node]')].map((g) => ({ id: g.getAttribute('data-node')!, variable: g.getAttribute('data-variable'), r: g.getBoundingClientRect() }));
    const bad: string[] = [];
    const meet = (a: DOMRect, b: DOMRect) => a.left <= b.right && b.left <= a.right && a.top <= b.bottom && b.top <= a.bottom;
    for (let i = 0; i < nodes.length; i++) for (let j = i + 1; j < nodes.length; j++) {
      if (meet(nodes[i].r, nodes[j].r)) bad.push(`nodes ${nodes[i].id} and ${nodes[j].id} overlap or touch`);
    }
    for (const g of root.querySelectorAll('g[data-group]')) {
      const frame = g.querySelector('rect')!.getBoundingClientRect();
      const slice = /@(-?\d+)$/.exec(g.getAttribute('data-group')!)?.[1];
      const members = new Set((g.getAttribute('data-members') ?? '').split(' ').map((v) => (slice === undefined ? v : `${v}@${slice}`)));
      for (const n of nodes) if (!members.has(n.id) && n.r.left < frame.right && frame.left < n.r.right && n.r.top < frame.bottom && frame.top < n.r.bottom) bad.push(`the frame of ${g.getAttribute('data-group')} covers ${n.id}`);
    }
    return { nodes: nodes.length, bad };
  });
}

for (const size of SIZES) {
  test.describe(`${size.width}×${size.height}`, () => {
    test.use({ viewport: size });
    for (const id of EXAMPLES) {
      test(`${id}: nodes of the ordering and the three instants never overlap, at every band`, async ({ page }, testInfo) => {
        test.setTimeout(240_000);
        await page.goto(`/?example=${id}`);
        await page.getByRole('tab', { name: 'Timescales' }).click();
        await expect(pane(page)).toHaveAttribute('data-band', /\d+/, { timeout: 60_000 });
        const found: string[] = [];
        for (const v of VIEWS) {
          await page.getByRole('button', { name: v.button, exact: true }).click();
          const fig = page.getByRole('figure', { name: v.figure });
          await expect(fig).toBeVisible();
          await slider(page).focus();
          await page.keyboard.press('Home');
          const seen = new Set<string>();
          for (let step = 0; step < 12; step++) {
            const band = (await slider(page).getAttribute('data-band'))!;
            if (seen.has(band)) break;
            seen.add(band);
            await expect(fig).toHaveAttribute('data-shown', band);
            // once the tuned layout has come and the move to it has ended (the instant placement shown
            // before it lasts a few frames, mid-animation: tests/layout/instant.test.ts checks it)
            await expect(fig).toHaveAttribute('data-pending', 'false', { timeout: 30_000 });
            await page.waitForTimeout(450);
            const late = await clashes(page, v.figure);
            expect(late.nodes).toBeGreaterThan(1);
            found.push(...late.bad.map((b) => `${v.button} band ${band}: ${b}`));
            if (step === 1 || (step === 0 && seen.size === 1)) await page.screenshot({ path: testInfo.outputPath(`overlap-${size.width}-${id}-${v.button.replace(' ', '-')}-band${band}.png`) });
            await slider(page).focus();
            await page.keyboard.press('PageUp');
            await page.waitForTimeout(150);
          }
          expect(seen.size, `${v.button}: bands stepped`).toBeGreaterThan(1);
        }
        expect(found).toEqual([]);
      });
    }
  });
}
