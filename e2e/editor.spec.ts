import { expect, test, type Page } from '@playwright/test';

/** Centre of an element on the page. */
async function centre(page: Page, selector: string): Promise<{ x: number; y: number }> {
  const box = await page.locator(selector).boundingBox();
  if (!box) throw new Error(`${selector} is not on the page`);
  return { x: box.x + box.width / 2, y: box.y + box.height / 2 };
}

/** Draw a link with the mouse: from the connector on the right of one variable to the body of another. */
async function dragLink(page: Page, from: string, to: string): Promise<void> {
  const node = `.react-flow__node[data-id="${from}"]`;
  await page.locator(node).hover();
  const a = await centre(page, `${node} .lf-handle-out`);
  const b = await centre(page, `.react-flow__node[data-id="${to}"]`);
  await page.mouse.move(a.x, a.y);
  await page.mouse.down();
  await page.mouse.move((a.x + b.x) / 2, (a.y + b.y) / 2, { steps: 6 });
  await page.mouse.move(b.x, b.y, { steps: 6 });
  await page.mouse.up();
}

/** Wait until the document has been kept in IndexedDB. */
async function waitForAutosave(page: Page): Promise<void> {
  await expect(page.locator('.lf-status')).toContainText('kept in this browser');
}

async function shot(page: Page, path: string): Promise<void> {
  await page.waitForTimeout(150);
  await page.screenshot({ path });
}

test.describe('editing a model on the canvas', () => {
  test('a new user builds a four-variable model with mouse and keyboard, fixes a formula, undoes, redoes and reloads', async ({ page }, testInfo) => {
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    await page.goto('/');
    await expect(page.getByText('An empty canvas.')).toBeVisible();
    await shot(page, testInfo.outputPath('01-empty.png'));

    const pane = await centre(page, '.react-flow__pane');
    const inspector = page.locator('.lf-inspector');

    // 1. double-click the empty canvas: a variable appears, selected, in the inspector
    await page.mouse.dblclick(pane.x - 330, pane.y - 120);
    await expect(page.locator('.react-flow__node-variable')).toHaveCount(1);
    await inspector.getByLabel('Label', { exact: true }).fill('Irrigation');
    await inspector.getByRole('radio', { name: /Input/ }).check();

    // 2. second variable, a state with a timescale
    await page.mouse.dblclick(pane.x - 60, pane.y - 120);
    await inspector.getByLabel('Label', { exact: true }).fill('Soil water');
    await inspector.getByRole('radio', { name: /State/ }).check();
    await inspector.getByLabel('Timescale τ').fill('2 days');
    await inspector.getByLabel('Timescale τ').press('Enter');
    await expect(inspector.getByText('= 2 days (48 h)')).toBeVisible();

    // 3. third variable with the keyboard shortcut N (focus on the canvas, not in a field)
    await page.mouse.click(pane.x + 250, pane.y + 160);
    await page.keyboard.press('n');
    await expect(page.locator('.react-flow__node-variable')).toHaveCount(3);
    await inspector.getByLabel('Label', { exact: true }).fill('Leaf wetness');
    await inspector.getByLabel('Label', { exact: true }).press('Tab');

    // 4. fourth variable from the toolbar, moved by dragging it
    await page.getByRole('button', { name: '+ Variable' }).click();
    await expect(page.locator('.react-flow__node-variable')).toHaveCount(4);
    await inspector.getByLabel('Label', { exact: true }).fill('Fungal risk');
    await inspector.getByLabel('Label', { exact: true }).press('Tab');
    // a new variable takes its name in formulas from its label
    await expect(inspector.getByLabel('Name in formulas')).toHaveValue('fungalRisk');
    const v4 = await centre(page, '.react-flow__node[data-id="fungalRisk"]');
    await page.mouse.move(v4.x, v4.y);
    await page.mouse.down();
    await page.mouse.move(pane.x + 260, pane.y - 10, { steps: 8 });
    await page.mouse.up();
    await shot(page, testInfo.outputPath('02-four-variables.png'));

    // 5. links: three drawn with the mouse, one added from the inspector with the keyboard
    await dragLink(page, 'irrigation', 'soilWater');
    await expect(page.locator('.lf-link')).toHaveCount(1);
    await expect(inspector.getByRole('heading', { name: 'Link' })).toBeVisible();
    // a link into a state integrates
    await expect(inspector.getByRole('radio', { name: /Integrating/ })).toBeChecked();
    await dragLink(page, 'soilWater', 'leafWetness');
    await dragLink(page, 'leafWetness', 'fungalRisk');
    await expect(page.locator('.lf-link')).toHaveCount(3);
    await page.locator('.react-flow__node[data-id="soilWater"]').click();
    await inspector.getByLabel('New link to').selectOption({ label: 'Fungal risk' });
    await inspector.getByRole('button', { name: 'Add link' }).click();
    await expect(page.locator('.lf-link')).toHaveCount(4);
    await inspector.getByRole('radio', { name: /decreases/ }).check();
    await expect(page.locator('.lf-sign.is-minus')).toHaveCount(1);

    // 6. a formula with a syntax error: the message says where; then an unknown name; then fixed
    await page.locator('.react-flow__node[data-id="fungalRisk"]').click();
    const formula = inspector.getByLabel('Formula', { exact: true });
    await formula.fill('leafWetness * (0.5 + ');
    await formula.press('Enter'); // stored as written; the Checks and the badge report it
    await expect(inspector.getByRole('alert')).toContainText('syntax error');
    await expect(inspector.locator('.lf-caret')).toBeVisible();
    await expect(page.locator('.react-flow__node[data-id="fungalRisk"] .lf-badge.is-error')).toBeVisible();
    await shot(page, testInfo.outputPath('03-formula-error.png'));
    await formula.fill('leafWetness * (0.5 + humidity)');
    await expect(inspector.getByRole('alert')).toContainText('unknown name: humidity');
    await formula.fill('leafWetness * (0.5 + soilWater)');
    await expect(inspector.getByRole('alert')).toHaveCount(0);
    await expect(inspector.getByRole('button', { name: 'Soil water', exact: true })).toBeVisible(); // symbols used, as links
    await formula.blur();
    await expect(page.locator('.react-flow__node[data-id="fungalRisk"] .lf-badge.is-error')).toHaveCount(0);
    await shot(page, testInfo.outputPath('04-formula-fixed.png'));

    // 7. undo and redo from the keyboard: typing the formula was one step
    await page.mouse.click(pane.x + 300, pane.y + 200);
    await page.keyboard.press('Control+z');
    await page.locator('.react-flow__node[data-id="fungalRisk"]').click();
    await expect(inspector.getByLabel('Formula', { exact: true })).toHaveValue('');
    await page.mouse.click(pane.x + 300, pane.y + 200);
    await page.keyboard.press('Control+z'); // the sign of the last link
    await expect(page.locator('.lf-sign.is-minus')).toHaveCount(0);
    await page.keyboard.press('Control+Shift+z');
    await expect(page.locator('.lf-sign.is-minus')).toHaveCount(1);
    await page.keyboard.press('Control+y');
    await page.locator('.react-flow__node[data-id="fungalRisk"]').click();
    await expect(inspector.getByLabel('Formula', { exact: true })).toHaveValue('leafWetness * (0.5 + soilWater)');
    await shot(page, testInfo.outputPath('05-after-redo.png'));

    // 8. reload: the model is restored from the browser's storage
    await waitForAutosave(page);
    const before = await page.evaluate(() => window.__loopfold!.model());
    await page.reload();
    await expect(page.locator('.react-flow__node-variable')).toHaveCount(4);
    await expect(page.locator('.lf-link')).toHaveCount(4);
    expect(await page.evaluate(() => window.__loopfold!.model())).toEqual(before);
    await expect(page.locator('[aria-label="Fungal risk: derived variable"]')).toHaveCount(1);
    await shot(page, testInfo.outputPath('06-after-reload.png'));
    expect(errors).toEqual([]);
  });

  test('a variable whose incoming links are of mixed kind is flagged with how to fix it; clicking the check selects it', async ({ page }, testInfo) => {
    await page.goto('/?example=sleep-stress');
    await expect(page.locator('.react-flow__node-variable')).toHaveCount(7);
    // make one of the two instantaneous links into the derived "rumination" integrating: its incoming links are now mixed
    const inspector = page.locator('.lf-inspector');
    await page.locator('.react-flow__node[data-id="rumination"]').click();
    await inspector.getByRole('button', { name: 'from Stress' }).click();
    await expect(inspector.getByRole('heading', { name: 'Link' })).toBeVisible();
    await inspector.getByRole('radio', { name: /Integrating/ }).check();
    const check = page.locator('.lf-diag', { hasText: 'mixed kind' });
    await expect(check).toBeVisible();
    await expect(check).toContainText('make rumination a state, or mark the links instantaneous');
    await expect(page.locator('.react-flow__node[data-id="rumination"] .lf-badge')).toBeVisible();
    await page.mouse.click(5, 400); // nothing selected
    await check.getByRole('button').click();
    await expect(page.locator('.react-flow__node[data-id="rumination"]')).toHaveClass(/selected/);
    await shot(page, testInfo.outputPath('mixed-links.png'));
  });

  test('copy, paste, select all, delete and the legend work from the keyboard', async ({ page }, testInfo) => {
    await page.goto('/?example=sleep-stress');
    await expect(page.locator('.react-flow__node-variable')).toHaveCount(7);
    // a mouse drag of many small moves is one undo step
    const pos = () => page.evaluate(() => window.__loopfold!.model().variables.find((v) => v.id === 'coping')!.position!);
    const start = await pos();
    const c = await centre(page, '.react-flow__node[data-id="coping"]');
    await page.mouse.move(c.x, c.y);
    await page.mouse.down();
    for (let i = 1; i <= 10; i++) await page.mouse.move(c.x + 12 * i, c.y - 5 * i);
    await page.mouse.up();
    await expect.poll(pos).not.toEqual(start);
    await page.keyboard.press('Control+z');
    await expect.poll(pos).toEqual(start);
    await page.locator('.react-flow__node[data-id="stress"]').click();
    await page.locator('.react-flow__node[data-id="cortisol"]').click({ modifiers: ['Shift'] });
    await page.keyboard.press('Control+c');
    await page.keyboard.press('Control+v');
    await expect(page.locator('.react-flow__node-variable')).toHaveCount(9);
    // the copied link between the two comes along
    await expect(page.locator('.lf-link')).toHaveCount(12);
    await page.keyboard.press('Delete');
    await expect(page.locator('.react-flow__node-variable')).toHaveCount(7);
    await page.keyboard.press('Control+z');
    await expect(page.locator('.react-flow__node-variable')).toHaveCount(9);
    const toggle = page.getByRole('button', { name: /Notation/ });
    await expect(page.locator('.lf-legend-items')).toContainText('integrating accumulates over time');
    await toggle.click();
    await expect(toggle).toHaveAttribute('aria-expanded', 'false');
    await expect(page.locator('.lf-legend-items')).toHaveCount(0);
    await toggle.click();
    await expect(page.locator('.lf-legend-items')).toBeVisible();
    await page.keyboard.press('f');
    await shot(page, testInfo.outputPath('pasted.png'));
  });

  test('a relation joins its variables on the canvas and appears in the equations view with the matching', async ({ page }, testInfo) => {
    await page.goto('/?example=sleep-stress');
    await expect(page.locator('.react-flow__node-variable')).toHaveCount(7);
    await page.getByRole('button', { name: '+ Relation' }).click();
    const inspector = page.locator('.lf-inspector');
    const eq = inspector.getByLabel('Equation', { exact: true });
    await eq.fill('rumination * 2 = mood +');
    await expect(inspector.getByRole('alert')).toContainText('syntax error');
    await eq.fill('rumination * 2 = mood + coping');
    await eq.press('Enter');
    await expect(inspector.getByRole('alert')).toHaveCount(0);
    // one dotted member line per variable of the relation
    await expect(page.locator('.lf-member')).toHaveCount(3);
    await page.getByRole('tab', { name: 'Equations' }).click();
    const grid = page.locator('.lf-grid');
    await expect(grid).toBeVisible();
    await expect(grid.getByRole('button', { name: 'rel1' })).toBeVisible();
    await expect(grid.getByRole('button', { name: 'rate(stress)' })).toBeVisible();
    // the grid marks each matched pair once: never more rings than equations or unknowns
    const rings = await grid.locator('td.is-match').count();
    const rows = await grid.locator('tbody tr').count();
    expect(rings).toBeGreaterThan(0);
    expect(rings).toBeLessThanOrEqual(rows);
    await shot(page, testInfo.outputPath('equations.png'));
    await grid.getByRole('button', { name: 'rel1' }).click();
    await expect(page.locator('.react-flow__node[data-id="rel1"]')).toHaveClass(/selected/);
  });

  test('a variable can be reached, moved and deleted with the keyboard alone', async ({ page }, testInfo) => {
    await page.goto('/?example=sleep-stress');
    await expect(page.locator('.react-flow__node-variable')).toHaveCount(7);
    const before = await page.evaluate(() => window.__loopfold!.model().variables.find((v) => v.id === 'workload')!.position!);
    const node = page.locator('.react-flow__node[data-id="workload"]');
    await node.focus();
    await page.keyboard.press('Enter'); // select the focused variable
    await expect(node).toHaveClass(/selected/);
    await expect(page.locator('.lf-inspector h2')).toHaveText('Variable: Workload');
    for (let i = 0; i < 3; i++) await page.keyboard.press('ArrowRight');
    await expect.poll(() => page.evaluate(() => window.__loopfold!.model().variables.find((v) => v.id === 'workload')!.position!.x)).toBeGreaterThan(before.x);
    await page.keyboard.press('Control+z'); // the three steps are one move
    await expect.poll(() => page.evaluate(() => window.__loopfold!.model().variables.find((v) => v.id === 'workload')!.position!.x)).toBe(before.x);
    await node.focus();
    await page.keyboard.press('Enter');
    await page.keyboard.press('Delete');
    await expect(page.locator('.react-flow__node-variable')).toHaveCount(6);
    await expect(page.locator('.lf-link')).toHaveCount(10);
    await shot(page, testInfo.outputPath('keyboard-delete.png'));
  });

  test('a link is picked with a click or the keyboard, and deleted and restored like a variable', async ({ page }, testInfo) => {
    await page.goto('/?example=sleep-stress');
    await expect(page.locator('.lf-link')).toHaveCount(11);
    const links = page.locator('.lf-link');
    // a point on the middle of the drawn curve, in page pixels
    const onCurve = (i: number) =>
      links.nth(i).evaluate((g) => {
        const p = g.querySelector('.lf-link-line') as SVGPathElement;
        const q = p.getPointAtLength(p.getTotalLength() / 2);
        const m = p.getScreenCTM()!;
        return { x: q.x * m.a + q.y * m.c + m.e, y: q.x * m.b + q.y * m.d + m.f, id: g.getAttribute('data-link')! };
      });
    const first = await onCurve(0);
    await page.mouse.click(first.x, first.y);
    await expect(page.locator('.lf-inspector h2')).toHaveText('Link');
    await expect(links.nth(0)).toHaveAttribute('aria-pressed', 'true');
    await expect(page.locator('.lf-link.is-selected')).toHaveCount(1);
    // Shift-click adds a second link; a click on a variable then picks the variable alone
    const second = await onCurve(3);
    await page.keyboard.down('Shift');
    await page.mouse.click(second.x, second.y);
    await page.keyboard.up('Shift');
    await expect(page.locator('.lf-inspector h2')).toHaveText('2 items selected');
    await page.locator('.react-flow__node[data-id="workload"]').click();
    await expect(page.locator('.lf-inspector h2')).toHaveText('Variable: Workload');
    await expect(page.locator('.lf-link.is-selected')).toHaveCount(0);
    // the keyboard: focus a link, Enter picks it, Delete removes it, Ctrl+Z brings it back
    await links.nth(2).focus();
    await page.keyboard.press('Enter');
    await expect(page.locator('.lf-inspector h2')).toHaveText('Link');
    await shot(page, testInfo.outputPath('link-picked.png'));
    const picked = await links.nth(2).getAttribute('data-link');
    await page.keyboard.press('Delete');
    await expect(page.locator('.lf-link')).toHaveCount(10);
    await expect(page.locator(`.lf-link[data-link="${picked}"]`)).toHaveCount(0);
    await expect(page.locator('.react-flow__node-variable')).toHaveCount(7);
    await page.keyboard.press('Control+z');
    await expect(page.locator('.lf-link')).toHaveCount(11);
    // a click on empty canvas clears the pick
    await links.nth(0).focus();
    await page.keyboard.press('Enter');
    await expect(page.locator('.lf-link.is-selected')).toHaveCount(1);
    const box = (await page.locator('.lf-canvas').boundingBox())!;
    await page.mouse.click(box.x + 12, box.y + box.height / 2);
    await expect(page.locator('.lf-link.is-selected')).toHaveCount(0);
    await expect(page.locator('.lf-inspector h2')).toHaveText('Model');
  });

  test('zoomed far out the drawing leaves out names and signs, and shows them again when zoomed in', async ({ page }) => {
    await page.goto('/?example=sleep-stress');
    await expect(page.locator('.react-flow__node-variable')).toHaveCount(7);
    const names = page.locator('.lf-vars-drawn text');
    await expect(names).toHaveCount(14); // a name and a kind per variable
    await expect(page.locator('.lf-sign')).not.toHaveCount(0);
    const zoom = () => page.evaluate(() => Number(/scale\(([\d.]+)\)/.exec(document.querySelector<HTMLElement>('.react-flow__viewport')!.style.transform)?.[1]));
    const out = page.getByRole('button', { name: /zoom out/i });
    for (let i = 0; i < 20 && (await zoom()) >= 0.3; i++) { await out.click(); await page.waitForTimeout(250); }
    expect(await zoom()).toBeLessThan(0.3);
    await expect(names).toHaveCount(0);
    await expect(page.locator('.lf-sign')).toHaveCount(0);
    // the variables and links are still drawn, and still picked by the keyboard
    await expect(page.locator('.lf-var-drawn')).toHaveCount(7);
    await expect(page.locator('.lf-link')).toHaveCount(11);
    for (let i = 0; i < 20 && (await zoom()) < 0.3; i++) { await page.getByRole('button', { name: /zoom in/i }).click(); await page.waitForTimeout(250); }
    await expect(names).toHaveCount(14);
  });
});
