/**
 * Every pane's toolbars and button rows stay inside the pane: at 1024 × 768 (a projector) and
 * 1440 × 900, for every example and every tab of the side pane, no control of the pane's own
 * rows ends past the pane's right edge, and the pane never scrolls sideways for them.
 */
import { expect, test, type Page } from '@playwright/test';

const EXAMPLES = ['sleep-stress', 'lake', 'greenhouse', 'warehouse', 'evening-unrest'];
const SIZES = [{ width: 1024, height: 768 }, { width: 1440, height: 900 }];

/** Controls of the open pane that end past its right edge (ignoring those inside a figure box that scrolls on its own). */
async function overflowing(page: Page): Promise<string[]> {
  return page.locator('.lf-panel').evaluate((panel) => {
    const right = panel.getBoundingClientRect().left + panel.clientWidth;
    const out: string[] = [];
    const scrollsItself = (el: Element): boolean => {
      for (let p = el.parentElement; p && p !== panel; p = p.parentElement) {
        const s = getComputedStyle(p);
        if (/(auto|scroll)/.test(s.overflowX) && p.scrollWidth > p.clientWidth + 1) return true;
      }
      return false;
    };
    for (const el of panel.querySelectorAll('button, select, input:not([type=hidden]), [role=toolbar], [role=group], label')) {
      const r = el.getBoundingClientRect();
      if (r.width === 0 && r.height === 0) continue;
      if (scrollsItself(el)) continue;
      if (r.right > right + 0.5) out.push(`${el.tagName.toLowerCase()} "${(el.getAttribute('aria-label') ?? el.textContent ?? '').trim().slice(0, 40)}" ends at ${r.right.toFixed(1)} > ${right.toFixed(1)}`);
    }
    if (panel.scrollWidth > panel.clientWidth + 1) out.push(`the pane scrolls sideways (${panel.scrollWidth} > ${panel.clientWidth})`);
    // a toolbar wraps at most once (its rarely used actions fold away rather than stack up)
    for (const bar of panel.querySelectorAll('[role=toolbar]')) {
      const mids = [...bar.querySelectorAll('button, select, input, label')].map((c) => c.getBoundingClientRect()).filter((r) => r.width > 0).map((r) => (r.top + r.bottom) / 2).sort((a, b) => a - b);
      const rows = mids.filter((m, i) => i === 0 || m - mids[i - 1] > 12).length;
      if (rows > 2) out.push(`toolbar "${bar.getAttribute('aria-label')}" runs to ${rows} rows`);
    }
    return out;
  });
}

for (const size of SIZES) {
  test.describe(`${size.width}×${size.height}`, () => {
    test.use({ viewport: size });
    test(`every pane's toolbars fit inside the pane for every tab and example`, async ({ page }, testInfo) => {
      test.setTimeout(600_000);
      const found: Record<string, string[]> = {};
      for (const id of EXAMPLES) {
        await page.goto(`/?example=${id}`);
        await expect(page.locator('.react-flow__node-variable').first()).toBeVisible();
        const tabs = await page.getByRole('tab').allTextContents();
        expect(tabs.length).toBeGreaterThanOrEqual(9);
        for (const [i] of tabs.entries()) {
          const tab = page.getByRole('tab').nth(i);
          await tab.click();
          const name = (await tab.getAttribute('aria-label')) ?? (await tab.textContent()) ?? String(i);
          if (name === 'Timescales') await expect(page.locator('.lf-timescale-bar').first()).toBeVisible({ timeout: 60_000 });
          await page.waitForTimeout(700);
          let bad = await overflowing(page);
          // the timescale view's export row, unfolded, fits too
          const exportToggle = page.locator('.lf-timescale-bar [aria-expanded]');
          if (name === 'Timescales' && (await exportToggle.count()) > 0) {
            await exportToggle.click();
            await expect(page.getByRole('group', { name: 'Export the figure' })).toBeVisible();
            bad = [...bad, ...(await overflowing(page))];
            if (id === 'sleep-stress') await page.screenshot({ path: testInfo.outputPath(`toolbar-${size.width}-timescales-export.png`) });
            await exportToggle.click();
          }
          if (bad.length) {
            found[`${id} · ${name}`] = bad;
            await page.screenshot({ path: testInfo.outputPath(`toolbar-${size.width}-${id}-${name}.png`) });
          }
        }
      }
      expect(found).toEqual({});
    });
  });
}

test.describe('the side pane\'s tab row at 1024×768', () => {
  test.use({ viewport: { width: 1024, height: 768 } });
  test('keeps one row, names every tab legibly (whole name as its accessible name) and steps by keyboard', async ({ page }, testInfo) => {
    test.setTimeout(120_000);
    await page.goto('/?example=sleep-stress');
    await expect(page.locator('.react-flow__node-variable').first()).toBeVisible();
    const names = ['Edit', 'Equations', 'Timescales', 'Intervene', 'Numbers', 'Pictures', 'Steps', 'Study', 'Data'];
    for (const open of ['Edit', 'Timescales']) { // the narrow pane (430 px) and the wide one
      await page.getByRole('tab', { name: open, exact: true }).click();
      await page.waitForTimeout(400);
      const m = await page.getByRole('tablist', { name: 'Side pane view' }).evaluate((list) => {
        const tabs = [...list.querySelectorAll('[role=tab]')] as HTMLElement[];
        const lr = list.getBoundingClientRect();
        return {
          height: lr.height,
          rowWidth: list.clientWidth,
          used: tabs.reduce((s, t) => s + t.scrollWidth, 0),
          scrolls: list.scrollWidth > list.clientWidth + 1,
          tops: tabs.map((t) => Math.round(t.getBoundingClientRect().top)),
          inside: tabs.every((t) => t.getBoundingClientRect().right <= lr.right + 0.5 && t.getBoundingClientRect().left >= lr.left - 0.5),
          clipped: tabs.filter((t) => t.scrollWidth > t.clientWidth + 1).map((t) => t.textContent),
          fonts: tabs.map((t) => parseFloat(getComputedStyle(t).fontSize)),
          shown: tabs.map((t) => (t.querySelector('[aria-hidden=true]')?.textContent ?? t.textContent ?? '').trim()),
          titles: tabs.map((t) => t.title),
        };
      });
      console.log(`${open}: row ${m.rowWidth}px, tabs use ${m.used}px, shown ${m.shown.join(' · ')}`);
      expect(new Set(m.tops).size, `${open}: tabs on one row`).toBe(1);
      expect(m.height, `${open}: tab row height`).toBeLessThan(40);
      expect(m.scrolls, `${open}: tab row scrolls`).toBe(false);
      expect(m.inside, `${open}: every tab inside the row`).toBe(true);
      expect(m.clipped, `${open}: tab text cut`).toEqual([]);
      expect(Math.min(...m.fonts)).toBeGreaterThanOrEqual(12);
      expect(m.shown.every((s) => s.length >= 4), `${open}: short names of at least four letters: ${m.shown.join(', ')}`).toBe(true);
      // every tab keeps its whole name for assistive technology (and as a tooltip where the name is short)
      for (const [i, n] of names.entries()) {
        await expect(page.getByRole('tab').nth(i)).toHaveAccessibleName(n);
        if (m.shown[i] !== n) expect(m.titles[i]).toBe(n);
      }
    }
    await page.screenshot({ path: testInfo.outputPath('tabs-1024.png') });
    // keyboard: arrows, Home and End move the choice and the focus
    await page.getByRole('tab', { name: 'Edit', exact: true }).click();
    await page.getByRole('tab', { name: 'Edit', exact: true }).focus();
    await page.keyboard.press('ArrowRight');
    await expect(page.getByRole('tab', { name: 'Equations' })).toBeFocused();
    await expect(page.getByRole('tab', { name: 'Equations' })).toHaveAttribute('aria-selected', 'true');
    await page.keyboard.press('End');
    await expect(page.getByRole('tab').last()).toBeFocused();
    await page.keyboard.press('ArrowRight');
    await expect(page.getByRole('tab', { name: 'Edit', exact: true })).toBeFocused();
    await page.keyboard.press('ArrowLeft');
    await expect(page.getByRole('tab').last()).toHaveAttribute('aria-selected', 'true');
    await page.keyboard.press('Home');
    await expect(page.getByRole('tab', { name: 'Edit', exact: true })).toHaveAttribute('aria-selected', 'true');
  });
});
