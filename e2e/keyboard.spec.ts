/**
 * Keyboard audit: with the keyboard alone the modeller reaches every button of the top bar
 * and of the open pane (with a visible focus ring), and every dialog opens by keyboard,
 * keeps the focus inside while open, closes with Escape and gives the focus back to the
 * control that opened it.
 */
import { expect, test, type Locator, type Page } from '@playwright/test';

/** A short description of the focused element and whether its focus is drawn. */
async function focused(page: Page) {
  return page.evaluate(() => {
    const el = document.activeElement as HTMLElement | null;
    if (!el || el === document.body) return null;
    const s = getComputedStyle(el);
    const ring = (s.outlineStyle !== 'none' && parseFloat(s.outlineWidth) > 0) || s.boxShadow !== 'none';
    return { key: el.getAttribute('data-kb') ?? '', inDialog: !!el.closest('dialog[open], [role=dialog][aria-modal=true]'), ring, text: (el.getAttribute('aria-label') ?? el.textContent ?? '').trim().slice(0, 40) };
  });
}

/** Tag every visible, enabled control inside `root` (data-kb = index); returns how many. */
async function tag(root: Locator): Promise<number> {
  return root.evaluate((r) => {
    const cs = [...r.querySelectorAll('button, select, input:not([type=hidden]), textarea, a[href], summary, [role=tab][aria-selected=true], [role=slider]')] as HTMLElement[];
    // of a group of radio buttons the Tab key stops at the checked one (the arrows choose within it)
    const radio = (c: HTMLElement) => c instanceof HTMLInputElement && c.type === 'radio' && !!c.name;
    const stops = cs.filter((c) => !radio(c) || (c as HTMLInputElement).checked || !(r.querySelector(`input[type=radio][name="${(c as HTMLInputElement).name}"]:checked`) ?? null) && r.querySelector(`input[type=radio][name="${(c as HTMLInputElement).name}"]`) === c);
    const shown = stops.filter((c) => !(c as HTMLButtonElement).disabled && c.getClientRects().length > 0 && getComputedStyle(c).visibility !== 'hidden' && c.tabIndex >= 0 && !c.closest('[aria-hidden=true], [inert]'));
    shown.forEach((c, i) => c.setAttribute('data-kb', `${r.className.split(' ')[0]}-${i}`));
    return shown.length;
  });
}

/** Press Tab until every tagged control of the prefix has had the focus (or `limit` presses). */
async function tabThrough(page: Page, prefix: string, count: number, limit = 400): Promise<{ missed: string[]; noRing: string[] }> {
  const seen = new Set<string>();
  const noRing: string[] = [];
  for (let i = 0; i < limit && seen.size < count; i++) {
    await page.keyboard.press('Tab');
    const f = await focused(page);
    if (f?.key.startsWith(prefix)) {
      seen.add(f.key);
      if (!f.ring) noRing.push(f.text);
    }
  }
  const all = Array.from({ length: count }, (_, i) => `${prefix}-${i}`);
  const missed = await page.evaluate((keys) => keys.map((k) => { const el = document.querySelector(`[data-kb="${k}"]`); return el ? (el.getAttribute('aria-label') ?? el.textContent ?? k).trim().slice(0, 40) : k; }), all.filter((k) => !seen.has(k)));
  return { missed, noRing };
}

test('the Tab key reaches every button of the top bar and of every pane, each with a visible focus ring', async ({ page }) => {
  test.setTimeout(300_000);
  await page.goto('/?example=sleep-stress');
  await expect(page.locator('.react-flow__node-variable')).toHaveCount(7);
  const bar = page.locator('.lf-topbar');
  const n = await tag(bar);
  expect(n).toBeGreaterThanOrEqual(8); // New, Open…, Save, Save as…, Share link, + Variable, + Relation, Examples (Undo and Redo are disabled)
  await page.locator('body').focus();
  const top = await tabThrough(page, 'lf-topbar', n, 60);
  expect(top).toEqual({ missed: [], noRing: [] });

  const found: Record<string, { missed: string[]; noRing: string[] }> = {};
  const tabs = await page.getByRole('tab').count();
  for (let i = 0; i < tabs; i++) {
    const tab = page.getByRole('tab').nth(i);
    await tab.click();
    const name = (await tab.textContent())!;
    if (i === 2) await expect(page.locator('.lf-timescale-bar').first()).toBeVisible({ timeout: 60_000 });
    if (i === 2) await page.locator('.lf-timescale-bar [aria-expanded]').click(); // the export row too
    await page.waitForTimeout(900);
    const count = await tag(page.locator('.lf-panel'));
    await tab.focus();
    found[name] = await tabThrough(page, 'lf-panel', count);
  }
  for (const [name, r] of Object.entries(found)) expect(r, name).toEqual({ missed: [], noRing: [] });
});

/** Open a dialog with Enter on its opener; the focus stays inside for 40 presses of Tab and of Shift+Tab; Escape closes and gives the focus back. */
async function dialogRoundTrip(page: Page, opener: Locator, dialog: Locator): Promise<void> {
  await opener.focus();
  await page.keyboard.press('Enter');
  await expect(dialog).toBeVisible();
  await page.waitForTimeout(300);
  for (const key of ['Tab', 'Shift+Tab']) {
    for (let i = 0; i < 40; i++) {
      await page.keyboard.press(key);
      const f = await focused(page);
      expect(f?.inDialog, `after ${i + 1} × ${key}: focus on "${f?.text}" is outside the dialog`).toBe(true);
    }
  }
  await page.keyboard.press('Escape');
  await expect(dialog).toBeHidden();
  await expect(opener).toBeFocused();
}

test('every dialog opens by keyboard, keeps the focus inside, closes with Escape and returns the focus', async ({ page }) => {
  test.setTimeout(240_000);
  await page.goto('/?example=sleep-stress');
  await expect(page.locator('.react-flow__node-variable')).toHaveCount(7);
  // the examples
  await dialogRoundTrip(page, page.getByRole('button', { name: 'Examples' }), page.getByRole('dialog', { name: 'Examples' }));
  // a file that cannot be opened: the notice
  const open = page.getByRole('button', { name: 'Open…' });
  await open.focus();
  await page.getByTestId('open-file-input').setInputFiles({ name: 'broken.json', mimeType: 'application/json', buffer: Buffer.from('{ "variables": [') });
  const notice = page.locator('dialog.lf-notice[open]');
  await expect(notice).toBeVisible();
  await page.keyboard.press('Tab');
  expect((await focused(page))?.inDialog).toBe(true);
  await page.keyboard.press('Escape');
  await expect(notice).toBeHidden();
  await expect(open).toBeFocused();
  // the print options of the timescale view
  await page.getByRole('tab', { name: 'Timescales' }).click();
  const toggle = page.locator('.lf-timescale-bar [aria-expanded]');
  await toggle.focus();
  await page.keyboard.press('Enter');
  await expect(toggle).toHaveAttribute('aria-expanded', 'true');
  await dialogRoundTrip(page, page.getByRole('button', { name: 'Print options…' }), page.getByRole('dialog', { name: /for print/ }));
  // Escape in the export row folds it and gives the focus back to its toggle
  await page.keyboard.press('Escape');
  await expect(toggle).toHaveAttribute('aria-expanded', 'false');
  await expect(toggle).toBeFocused();
  // the presentation
  await dialogRoundTrip(page, page.getByRole('button', { name: 'Present' }), page.getByRole('dialog', { name: 'Presentation' }));
});

test('the side-by-side pictures and Compare designs keep the focus inside and give it back, on Escape and on Close', async ({ page }) => {
  test.setTimeout(300_000);
  await page.goto('/?example=sleep-stress');
  await expect(page.locator('.react-flow__node-variable')).toHaveCount(7);
  // the three pictures side by side
  await page.getByRole('tab', { name: 'Pictures' }).click();
  const wide = page.getByRole('button', { name: 'Side by side, full width' });
  await expect(wide).toBeEnabled({ timeout: 120_000 });
  const pictures = page.getByRole('dialog', { name: 'The three pictures side by side' });
  await dialogRoundTrip(page, wide, pictures);
  await wide.focus();
  await page.keyboard.press('Enter');
  await expect(pictures).toBeVisible();
  await expect(pictures.getByRole('button', { name: 'Close' })).toBeFocused();
  await page.keyboard.press('Enter');
  await expect(pictures).toBeHidden();
  await expect(wide).toBeFocused();
  // Compare designs
  await page.getByRole('tab', { name: 'Study' }).click();
  const compare = page.getByRole('button', { name: 'Compare designs…' });
  const dialog = page.getByRole('dialog', { name: 'Compare designs' });
  await dialogRoundTrip(page, compare, dialog);
  await compare.focus();
  await page.keyboard.press('Enter');
  await expect(dialog).toBeVisible();
  await dialog.getByRole('button', { name: 'Close', exact: true }).click();
  await expect(dialog).toBeHidden();
  await expect(compare).toBeFocused();
});
