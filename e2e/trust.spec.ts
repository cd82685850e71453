import { expect, test, type Page } from '@playwright/test';
import { readFileSync } from 'node:fs';

const AXE = readFileSync('node_modules/axe-core/axe.min.js', 'utf8');

type AxeResult = { violations: { id: string; impact: string; help: string; nodes: { target: string[] }[] }[] };

/** WCAG 2.1 A and AA rules of axe-core 4.14 over the page as it is now. */
async function axeViolations(page: Page): Promise<string[]> {
  if (!(await page.evaluate(() => 'axe' in window))) await page.addScriptTag({ content: AXE });
  const r = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run(ctx: unknown, opts: unknown): Promise<unknown> } }).axe;
    return axe.run(document, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] }, resultTypes: ['violations'] });
  }) as AxeResult;
  return r.violations.map((v) => `${v.id} (${v.impact}): ${v.help} — ${v.nodes.slice(0, 3).map((n) => n.target.join(' ')).join(' | ')}`);
}

async function shot(page: Page, path: string): Promise<void> {
  await page.waitForTimeout(200);
  await page.screenshot({ path });
}

test.describe('fields, selection and checks a modeller can trust', () => {
  test('a timescale is stored on Enter, never per keystroke; bad text stays with its message until Escape', async ({ page }, testInfo) => {
    await page.goto('/?example=sleep-stress');
    await page.locator('.react-flow__node[data-id="mood"]').click();
    const inspector = page.locator('.lf-inspector');
    const tau = inspector.getByLabel('Timescale τ');
    await expect(tau).toHaveValue('3 days');
    await tau.fill('');
    await tau.pressSequentially('5 fortnights');
    // nothing stored on the way: "5" would be 5 h
    expect(await page.evaluate(() => window.__loopfold!.model().variables.find((v) => v.id === 'mood')!.timescale)).toBe('3 days');
    await tau.press('Enter');
    await expect(inspector.getByRole('alert')).toContainText('"fortnights" in "5 fortnights" is not a time unit');
    await expect(tau).toHaveValue('5 fortnights');
    await tau.blur();
    await expect(tau).toHaveValue('5 fortnights'); // kept, not silently reverted
    expect(await page.evaluate(() => window.__loopfold!.model().variables.find((v) => v.id === 'mood')!.timescale)).toBe('3 days');
    await shot(page, testInfo.outputPath('field-invalid-kept.png'));
    await tau.focus();
    await tau.press('Escape');
    await expect(tau).toHaveValue('3 days');
    await tau.fill('0.5 s');
    await tau.press('Enter');
    expect(await page.evaluate(() => window.__loopfold!.model().variables.find((v) => v.id === 'mood')!.timescale)).toBe('0.5 s');
    // under a second reads in milliseconds, never "0 s"
    await expect(inspector.getByText('= 500 ms')).toBeVisible();
  });

  test('after undoing an added variable and an added relation, a click selects exactly what was clicked', async ({ page }, testInfo) => {
    await page.goto('/?example=sleep-stress');
    await expect(page.locator('.react-flow__node-variable')).toHaveCount(7);
    await page.getByRole('button', { name: '+ Variable' }).click();
    await expect(page.locator('.react-flow__node-variable')).toHaveCount(8);
    await page.getByRole('button', { name: 'Undo' }).click();
    await expect(page.locator('.react-flow__node-variable')).toHaveCount(7);
    await page.getByRole('button', { name: '+ Relation' }).click();
    await page.getByRole('button', { name: 'Undo' }).click();
    await page.locator('.react-flow__node[data-id="stress"]').click();
    const inspector = page.locator('.lf-inspector');
    await expect(inspector.getByRole('heading', { level: 2 })).toHaveText('Variable: Stress');
    await page.locator('.react-flow__node[data-id="mood"]').click();
    await expect(inspector.getByRole('heading', { level: 2 })).toHaveText('Variable: Mood');
    await shot(page, testInfo.outputPath('selection-after-undo.png'));
  });

  test('+ Relation with nothing selected adds an empty relation that asks for its equation, not a made-up one', async ({ page }) => {
    await page.goto('/?example=lake');
    const before = await page.evaluate(() => window.__loopfold!.model());
    await page.getByRole('button', { name: '+ Relation' }).click();
    const after = await page.evaluate(() => window.__loopfold!.model());
    expect(after.relations!.length).toBe((before.relations ?? []).length + 1);
    expect(after.relations![after.relations!.length - 1].equation).toBe('');
    const eq = page.locator('.lf-inspector').getByLabel('Equation', { exact: true });
    await expect(eq).toBeFocused();
    await page.getByRole('tab', { name: 'Edit' }).click();
    await expect(page.locator('.lf-diagnostics')).toContainText('no equation yet');
    await expect(page.locator('.lf-diagnostics')).not.toContainText('over-determined');
  });

  test('a sketch with a growing mode is a finding in the Checks, the timescale view and the Numbers', async ({ page }, testInfo) => {
    test.setTimeout(240_000);
    await page.goto('/');
    await page.waitForFunction(() => window.__loopfold !== undefined);
    await page.evaluate(() => window.__loopfold!.load({
      format: 'loopfold-model', version: 1, name: 'Household budget', timeUnit: 'week',
      variables: [
        { id: 'savings', label: 'Savings', kind: 'state', timescale: 4, position: { x: 0, y: 0 } },
        { id: 'confidence', label: 'Spending confidence', kind: 'state', timescale: 1, position: { x: 260, y: 0 } },
      ],
      links: [
        { from: 'confidence', to: 'savings', kind: 'integrating', sign: '+', weight: 1.2 },
        { from: 'savings', to: 'confidence', kind: 'integrating', sign: '+', weight: 1 },
      ],
    }));
    const checks = page.locator('.lf-diagnostics');
    await expect(checks).toContainText('growing mode', { timeout: 60_000 });
    await expect(checks).toContainText('Savings');
    await expect(checks).not.toContainText('no problems found');
    await page.getByRole('tab', { name: 'Timescales' }).click();
    await expect(page.locator('.lf-explain .lf-growth-notice')).toContainText('Not at rest');
    await page.getByRole('tab', { name: 'Numbers' }).click();
    await expect(page.locator('[data-section="equilibrium"] .lf-growth-notice')).toBeVisible();
    await expect(page.locator('[data-section="equilibrium"]')).not.toContainText('Where every state comes to rest');
    await shot(page, testInfo.outputPath('growing-numbers.png'));
  });
});

/** The ordering figure in the Timescales pane once its tuned layout is on screen: where it is, its box and the pane. */
async function fittedFigure(page: Page) {
  const host = page.locator('.lf-view-ordering .lf-view-canvas');
  await expect(host).toHaveAttribute('data-pending', 'false', { timeout: 60_000 });
  await page.waitForTimeout(500); // the move to the tuned layout (320 ms)
  return host.evaluate((h) => {
    const view = h.closest('.lf-view') as HTMLElement;
    const svg = h.querySelector('svg')!.getBoundingClientRect();
    const box = view.getBoundingClientRect();
    const pane = h.closest('.lf-panel')!.getBoundingClientRect();
    return {
      scale: Number(h.getAttribute('data-scale')), fit: h.getAttribute('data-fit'),
      svgBottom: svg.bottom, svgWidth: svg.width, boxBottom: box.bottom, boxInner: view.clientWidth,
      scrollsDown: view.scrollHeight > view.clientHeight + 1, paneBottom: pane.bottom,
      pageWider: document.documentElement.scrollWidth > window.innerWidth,
    };
  });
}

for (const size of [{ width: 1440, height: 900 }, { width: 1024, height: 768 }]) {
  test.describe(`Fit at ${size.width}×${size.height}`, () => {
    test.use({ viewport: size });
    test('the ordering figure fits its pane in width and height, and the three instants open fitted', async ({ page }, testInfo) => {
      test.setTimeout(300_000);
      for (const id of ['sleep-stress', 'lake', 'greenhouse', 'warehouse']) {
        await page.goto(`/?example=${id}`);
        await expect(page.locator('.react-flow__node-variable').first()).toBeVisible();
        await page.getByRole('tab', { name: 'Timescales' }).click();
        const f = await fittedFigure(page);
        expect(f.fit, id).toBe('true');
        expect(f.pageWider, `${id}: the side pane stays inside the window`).toBe(false);
        // the last row is inside the box, the box inside the pane: nothing to scroll down to
        expect(f.scrollsDown, `${id}: figure cut at the bottom`).toBe(false);
        expect(f.svgBottom, id).toBeLessThanOrEqual(f.boxBottom + 1);
        // the box inside the pane, unless the figure is held at the legible floor (then the pane scrolls)
        if (f.scale > 0.6005) expect(f.boxBottom, `${id}: box below the pane`).toBeLessThanOrEqual(f.paneBottom + 1);
        // as wide as the box unless held at the legible floor (0.6, then the box scrolls sideways)
        if (f.scale > 0.6005) expect(f.svgWidth, `${id}: wider than its box at scale ${f.scale}`).toBeLessThanOrEqual(f.boxInner + 1);
        await shot(page, testInfo.outputPath(`fit-${size.width}-${id}.png`));
      }
      // zoomed in on the ordering, the three instants still open fitted
      await page.locator('.lf-view-ordering').getByRole('button', { name: 'Zoom in' }).click();
      await expect(page.locator('.lf-view-ordering .lf-view-canvas')).toHaveAttribute('data-fit', 'false');
      await page.getByRole('button', { name: 'Three instants' }).click();
      await expect(page.locator('.lf-view-ordering .lf-view-canvas')).toHaveAttribute('data-fit', 'true');
      const u = await fittedFigure(page);
      expect(u.scrollsDown, 'three instants cut at the bottom').toBe(false);
      if (u.scale > 0.3005) expect(u.svgWidth).toBeLessThanOrEqual(u.boxInner + 1);
      await shot(page, testInfo.outputPath(`fit-${size.width}-three-instants.png`));
    });
  });
}

test.describe('a projector at 1024×768', () => {
  test.use({ viewport: { width: 1024, height: 768 } });
  test('the toolbar keeps one row and the model name is whole for every example', async ({ page }, testInfo) => {
    test.setTimeout(300_000);
    for (const id of ['sleep-stress', 'lake', 'greenhouse', 'warehouse']) {
      await page.goto(`/?example=${id}`);
      await expect(page.locator('.react-flow__node-variable').first()).toBeVisible();
      await page.waitForTimeout(400);
      const bar = await page.locator('.lf-topbar').boundingBox();
      const buttons = await page.locator('.lf-toolbar button').evaluateAll((bs) => bs.map((b) => b.getBoundingClientRect().top));
      expect(Math.max(...buttons) - Math.min(...buttons), `${id}: toolbar in one row`).toBeLessThan(4);
      expect(bar!.height, `${id}: top bar height`).toBeLessThan(56);
      const name = page.locator('.lf-docname');
      const cut = await name.evaluate((el) => el.scrollWidth > el.clientWidth + 1);
      expect(cut, `${id}: model name cut off`).toBe(false);
      await shot(page, testInfo.outputPath(`1024-${id}.png`));
    }
  });

  // Fit stops at the zoom that keeps the smallest canvas text (the kind line, 11 px) at 11 px on screen; a
  // drawing too big for the pane at that zoom is panned instead of shrunk
  test('every example\'s canvas text is at least 11 px after Fit', async ({ page }, testInfo) => {
    test.setTimeout(180_000);
    for (const id of ['sleep-stress', 'lake', 'greenhouse', 'warehouse']) {
      await page.goto(`/?example=${id}`);
      await expect(page.locator('.react-flow__node-variable').first()).toBeVisible();
      await page.waitForTimeout(400);
      // text drawn on the canvas, measured on screen after the view is fitted
      const sizes = await page.locator('.react-flow__renderer text').evaluateAll((ts) => ts.filter((t) => (t as SVGTextElement).getBBox().width > 0).map((t) => t.getBoundingClientRect().height));
      expect(sizes.length, id).toBeGreaterThan(0);
      const fontPx = await page.locator('.react-flow__renderer text').evaluateAll((ts) => {
        const scale = (el: Element) => {
          const vp = el.closest('.react-flow__viewport') as HTMLElement | null;
          const m = vp ? new DOMMatrix(getComputedStyle(vp).transform) : new DOMMatrix();
          return m.a;
        };
        return ts.filter((t) => (t as SVGTextElement).getBBox().width > 0).map((t) => parseFloat(getComputedStyle(t).fontSize) * scale(t));
      });
      expect(Math.min(...fontPx), `${id}: smallest canvas text after Fit`).toBeGreaterThanOrEqual(11);
      // the F key and the fit button fit the same way
      await page.locator('.react-flow__pane').click({ position: { x: 5, y: 200 } });
      await page.keyboard.press('f');
      await page.waitForTimeout(400);
      const zoomF = await page.locator('.react-flow__viewport').evaluate((vp) => new DOMMatrix(getComputedStyle(vp).transform).a);
      expect(zoomF * 11, `${id}: kind line after the F key`).toBeGreaterThanOrEqual(11 - 1e-6);
      await page.locator('.react-flow__controls-fitview').click();
      await page.waitForTimeout(400);
      const zoomB = await page.locator('.react-flow__viewport').evaluate((vp) => new DOMMatrix(getComputedStyle(vp).transform).a);
      expect(zoomB * 11, `${id}: kind line after the fit button`).toBeGreaterThanOrEqual(11 - 1e-6);
      await shot(page, testInfo.outputPath(`1024-fit-text-${id}.png`));
    }
  });
});

test.describe('accessibility (axe-core, WCAG 2.1 AA)', () => {
  test('every tab and dialog with an example open has no violations', async ({ page }, testInfo) => {
    test.setTimeout(360_000);
    await page.goto('/?example=sleep-stress');
    await expect(page.locator('.react-flow__node-variable')).toHaveCount(7);
    await page.waitForTimeout(500);
    const found: Record<string, string[]> = {};
    for (const tab of ['Edit', 'Equations', 'Timescales', 'Intervene', 'Numbers']) {
      await page.getByRole('tab', { name: tab }).click();
      if (tab === 'Numbers') await expect(page.locator('.lf-net-edge').first()).toBeVisible({ timeout: 90_000 });
      await page.waitForTimeout(600);
      found[tab] = await axeViolations(page);
      await shot(page, testInfo.outputPath(`axe-${tab}.png`));
    }
    await page.getByRole('tab', { name: 'Edit' }).click();
    await page.getByRole('button', { name: 'Examples' }).click();
    await expect(page.locator('dialog.lf-dialog[open]')).toBeVisible();
    found.gallery = await axeViolations(page);
    await page.keyboard.press('Escape');
    await page.locator('.react-flow__node[data-id="stress"]').click();
    found['variable inspector'] = await axeViolations(page);
    expect(found).toEqual({ Edit: [], Equations: [], Timescales: [], Intervene: [], Numbers: [], gallery: [], 'variable inspector': [] });
  });
});

test.describe('accessibility of the other tabs and of the modal layers (axe-core, WCAG 2.1 AA)', () => {
  test('Pictures, Steps, Study, Data, Rehearse, the side-by-side pictures, Compare designs, the print options and the presentation have no violations', async ({ page }, testInfo) => {
    test.setTimeout(420_000);
    await page.goto('/?example=sleep-stress');
    await expect(page.locator('.react-flow__node-variable')).toHaveCount(7);
    const found: Record<string, string[]> = {};
    for (const tab of ['Pictures', 'Steps', 'Study', 'Data', 'Rehearse']) {
      await page.getByRole('tab', { name: tab }).click();
      if (tab === 'Pictures') await expect(page.getByRole('button', { name: 'Side by side, full width' })).toBeEnabled({ timeout: 120_000 });
      await page.waitForTimeout(800);
      found[tab] = await axeViolations(page);
      await shot(page, testInfo.outputPath(`axe-${tab}.png`));
    }
    await page.getByRole('tab', { name: 'Pictures' }).click();
    await page.getByRole('button', { name: 'Side by side, full width' }).click();
    await expect(page.getByRole('dialog', { name: 'The three pictures side by side' })).toBeVisible();
    found['side by side'] = await axeViolations(page);
    await page.keyboard.press('Escape');
    await page.getByRole('tab', { name: 'Study' }).click();
    await page.getByRole('button', { name: 'Compare designs…' }).click();
    const compare = page.getByRole('dialog', { name: 'Compare designs' });
    await expect(compare.locator('.lf-compare-estimated[data-status="done"]')).toHaveCount(3, { timeout: 120_000 });
    found['compare designs'] = await axeViolations(page);
    await shot(page, testInfo.outputPath('axe-compare.png'));
    await page.keyboard.press('Escape');
    await page.getByRole('tab', { name: 'Timescales' }).click();
    await page.locator('.lf-timescale-bar [aria-expanded]').click();
    await page.getByRole('button', { name: 'Print options…' }).click();
    await expect(page.getByRole('dialog', { name: /for print/ })).toBeVisible();
    found['print options'] = await axeViolations(page);
    await page.keyboard.press('Escape');
    await page.getByRole('button', { name: 'Present' }).click();
    await expect(page.getByRole('dialog', { name: 'Presentation' }).locator('.lf-view-canvas')).toHaveAttribute('data-pending', 'false', { timeout: 60_000 });
    found.presentation = await axeViolations(page);
    await page.keyboard.press('Escape');
    expect(found).toEqual({ Pictures: [], Steps: [], Study: [], Data: [], Rehearse: [], 'side by side': [], 'compare designs': [], 'print options': [], presentation: [] });
  });
});

test.describe('keyboard access to the canvas', () => {
  test('select a variable, move it with the arrows, add a link from the inspector and pick a link, all from the keyboard', async ({ page }, testInfo) => {
    test.setTimeout(180_000);
    await page.goto('/?example=sleep-stress');
    await expect(page.locator('.react-flow__node-variable')).toHaveCount(7);
    const model = () => page.evaluate(() => window.__loopfold!.model());
    const before = await model();
    // a variable is in the Tab order (tabindex 0); Enter picks it
    const mood = page.locator('.react-flow__node[data-id="mood"]');
    await expect(mood).toHaveAttribute('tabindex', '0');
    await mood.focus();
    await page.keyboard.press('Enter');
    const inspector = page.locator('.lf-inspector');
    await expect(inspector.getByRole('heading', { level: 2 })).toHaveText('Variable: Mood');
    // the arrows move it; the document stores the new place
    const x0 = before.variables.find((v) => v.id === 'mood')!.position!.x;
    for (let i = 0; i < 4; i++) await page.keyboard.press('ArrowRight');
    await expect.poll(async () => (await model()).variables.find((v) => v.id === 'mood')!.position!.x).toBeGreaterThan(x0);
    // Tab on into the inspector, to its "New link to" list: a new link from Mood to Workload
    const target = inspector.getByLabel('New link to');
    for (let i = 0; i < 80 && !(await target.evaluate((e) => e === document.activeElement)); i++) await page.keyboard.press('Tab');
    await expect(target).toBeFocused();
    const workload = await target.locator('option', { hasText: 'Workload' }).getAttribute('value');
    await page.keyboard.type('Workload'); // a closed list picks the option typed
    await expect(target).toHaveValue(workload!);
    await page.keyboard.press('Tab');
    await expect(inspector.getByRole('button', { name: 'Add link' })).toBeFocused();
    await page.keyboard.press('Enter');
    await expect.poll(async () => (await model()).links.filter((l) => l.from === 'mood' && l.to === 'workload').length).toBe(1);
    expect((await model()).links.length).toBe(before.links.length + 1);
    // a link is in the Tab order too; Enter picks it
    const link = page.locator('.lf-link[tabindex="0"]').first();
    await link.focus();
    await page.keyboard.press('Enter');
    await expect(inspector.getByRole('heading', { level: 2 })).toHaveText('Link');
    await shot(page, testInfo.outputPath('keyboard-canvas.png'));
  });
});
