import { execFileSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import { expect, test, type Page } from '@playwright/test';

function cli(args: string[]): { directed: [string, string][]; bidirected: [string, string][]; count?: number } {
  return JSON.parse(execFileSync('npm', ['run', '-s', 'loopfold', '--', ...args, '--json'], { encoding: 'utf8' }));
}

const graphFile = (x: unknown) => ({ name: 'graph.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(x)) });

test('Steps tab: the lake measured every u-th step, as the command line gives it; the search back, with cancel', async ({ page }, testInfo) => {
  // The command line runs beside the browser: on a shared machine both take their time.
  test.setTimeout(300_000);
  const want = cli(['undersample', 'src/examples/lake.json', '--rate', '3']);
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  await page.goto('/?example=lake');
  await page.getByRole('tab', { name: 'Steps' }).click();
  const pane = page.getByTestId('steps-pane');
  const figure = page.getByTestId('steps-figure');
  await expect(figure).toHaveAttribute('data-rate', '2');
  await expect(figure.locator('svg')).toBeVisible();
  await page.screenshot({ path: testInfo.outputPath('steps-lake-u2-1440.png') });

  // One step up with the + button: u = 3, the same edges as `loopfold undersample --rate 3`.
  await pane.getByRole('button', { name: 'Measure less often (u + 1)' }).click();
  await expect(figure).toHaveAttribute('data-rate', '3');
  const drawn = await figure.locator('[data-edge]').evaluateAll((els) => els.map((e) => e.getAttribute('data-edge')!));
  const names = (p: [string, string], arrow: string) => `${p[0]}${arrow}${p[1]}`;
  expect(drawn.sort()).toEqual([...want.directed.map((p) => names(p, '>')), ...want.bidirected.map((p) => names(p, '<>'))].sort());
  await expect(page.getByTestId('steps-reasons')).toContainText('appears at u = 3');
  // The slider takes the keyboard too.
  const slider = pane.getByRole('slider', { name: 'Measured every u-th step' });
  await slider.focus();
  await page.keyboard.press('ArrowLeft');
  await expect(figure).toHaveAttribute('data-rate', '2');

  // Any u ≤ 8 for the six lake variables runs the solver long enough to be stopped.
  await pane.getByLabel(/at any u ≤ 8/).check();
  await pane.getByRole('button', { name: 'Find causal graphs' }).click();
  await expect(page.getByTestId('steps-progress')).toBeVisible();
  await page.screenshot({ path: testInfo.outputPath('steps-searching-1440.png') });
  await pane.getByRole('button', { name: 'Cancel' }).click();
  await expect(pane.getByText('The search was stopped.')).toBeVisible();

  // A causal-step graph from a file: the chain 1 → 2 → 3 at u = 2; the search back finds as many graphs as the command line.
  await pane.locator('input[type=file]').setInputFiles(graphFile({ format: 'loopfold-graph', version: 1, name: 'Three-step chain', variables: 3, directed: [[1, 2], [2, 3]] }));
  await expect(pane).toContainText('a causal-step graph from a file');
  await expect(page.getByTestId('steps-summary')).toContainText('1 directed and 0 bidirected edges');
  await pane.getByLabel(/at u = 2/).check();
  await pane.getByRole('button', { name: 'Find causal graphs' }).click();
  const result = page.getByTestId('steps-result');
  // Each run starts a worker of its own: on a loaded machine the dev server may take a while to serve it.
  const t0 = Date.now();
  await expect(result).toBeVisible({ timeout: 60_000 });
  testInfo.annotations.push({ type: 'search after cancel', description: `${Date.now() - t0} ms` });
  await expect(result).toContainText(/gives? this measured graph/);
  const chainFile = testInfo.outputPath('chain.json');
  writeFileSync(chainFile, JSON.stringify({ format: 'loopfold-graph', version: 1, variables: 3, directed: [[1, 3]] }));
  await expect(result).toHaveAttribute('data-count', String(cli(['unsample', chainFile, '--rate', '2']).count));
  await expect(page.getByTestId('steps-cost')).toContainText('nodes');

  // A measured graph no causal graph gives: said so, with the nearest consistent graphs.
  await pane.locator('input[type=file]').setInputFiles(graphFile({ format: 'loopfold-graph', version: 1, variables: ['a', 'b', 'c'], directed: [['a', 'a']], bidirected: [['a', 'b'], ['b', 'c'], ['a', 'c']] }));
  await expect(pane).toContainText('a measured graph from a file');
  await pane.getByLabel(/at any u ≤ 8/).check();
  await pane.getByRole('button', { name: 'Find causal graphs' }).click();
  await expect(result).toContainText('No causal graph at any u ≤ 8 gives this measured graph.');
  await expect(result).toContainText('common case for graphs estimated from data');
  await expect(result.locator('li').first()).toContainText('+ a → b');
  await result.scrollIntoViewIfNeeded();
  await page.screenshot({ path: testInfo.outputPath('steps-no-graph-1440.png') });

  // A bad file loses nothing: the measured graph stays, the message names the field.
  await pane.locator('input[type=file]').setInputFiles(graphFile({ format: 'loopfold-graph', version: 1, variables: ['a'], directed: [['a', 'z']] }));
  await expect(pane.getByRole('alert')).toContainText('directed[0][1] no variable "z"');
  await expect(pane).toContainText('a measured graph from a file');

  await page.setViewportSize({ width: 1024, height: 768 });
  await pane.getByRole('button', { name: 'Use the sketch' }).click();
  await expect(figure).toHaveAttribute('data-rate', '2');
  await page.screenshot({ path: testInfo.outputPath('steps-lake-1024.png') });
  expect(errors).toEqual([]);
});

const AXE = readFileSync('node_modules/axe-core/axe.min.js', 'utf8');
/** WCAG 2.1 A and AA rules of axe-core over the page as it is now (as in trust.spec.ts). */
async function axeViolations(page: Page): Promise<string[]> {
  if (!(await page.evaluate(() => 'axe' in window))) await page.addScriptTag({ content: AXE });
  const r = (await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run(ctx: unknown, opts: unknown): Promise<unknown> } }).axe;
    return axe.run(document, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] }, resultTypes: ['violations'] });
  })) as { violations: { id: string; impact: string; help: string; nodes: { target: string[] }[] }[] };
  return r.violations.map((v) => `${v.id} (${v.impact}): ${v.help} — ${v.nodes.slice(0, 3).map((n) => n.target.join(' ')).join(' | ')}`);
}

test('Steps tab: a measured graph edited by hand, searched back as the command line does, with no accessibility violations', async ({ page }, testInfo) => {
  test.setTimeout(240_000);
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  await page.goto('/?example=lake');
  await page.getByRole('tab', { name: 'Steps' }).click();
  const pane = page.getByTestId('steps-pane');
  const figure = page.getByTestId('steps-figure');
  await expect(figure).toHaveAttribute('data-rate', '2');
  await page.waitForTimeout(400);
  expect(await axeViolations(page)).toEqual([]);

  // A three-variable measured graph from a file, then edited: a → b, b → c, a ↔ c with self-loops on a.
  await pane.locator('input[type=file]').setInputFiles(graphFile({ format: 'loopfold-graph', version: 1, name: 'Pond survey', variables: ['algae', 'snails', 'fish'], directed: [['algae', 'snails']], rate: 2 }));
  await expect(pane).toContainText('a measured graph from a file');
  const editor = page.getByTestId('steps-editor');
  const edges = page.getByTestId('steps-edges');
  await expect(edges).toContainText('algae → snails');
  await editor.getByLabel('From').selectOption({ label: 'snails' });
  await editor.getByLabel('To').selectOption({ label: 'fish' });
  await editor.getByRole('button', { name: 'Add edge' }).click();
  await editor.getByLabel('From').selectOption({ label: 'algae' });
  await editor.getByLabel('Edge').selectOption('bidirected');
  await editor.getByRole('button', { name: 'Add edge' }).click();
  await expect(edges).toContainText('algae ↔ fish');
  await expect(figure).toHaveAttribute('data-directed', '2');
  await expect(figure).toHaveAttribute('data-bidirected', '1');
  // A refusal names the edge, and the graph keeps every edge.
  await editor.getByLabel('To').selectOption({ label: 'algae' });
  await editor.getByRole('button', { name: 'Add edge' }).click();
  await expect(editor.getByRole('alert')).toHaveText('algae ↔ algae: a bidirected edge joins two different variables');
  await expect(figure).toHaveAttribute('data-directed', '2');
  // Remove one edge again.
  await editor.getByRole('button', { name: 'Remove algae ↔ fish' }).click();
  await expect(figure).toHaveAttribute('data-bidirected', '0');
  await editor.getByLabel('Edge').selectOption('directed');
  await editor.getByLabel('To').selectOption({ label: 'algae' });
  await editor.getByRole('button', { name: 'Add edge' }).click();
  await expect(edges).toContainText('algae → algae');

  // The saved file is the edited graph; the command line on it counts as many causal graphs as the app.
  const download = page.waitForEvent('download');
  await editor.getByRole('button', { name: 'Save graph file' }).click();
  const saved = testInfo.outputPath('pond.json');
  await (await download).saveAs(saved);
  const text = JSON.parse(readFileSync(saved, 'utf8'));
  expect(text.directed).toEqual([['algae', 'algae'], ['algae', 'snails'], ['snails', 'fish']]);
  await pane.getByLabel(/at u = 2/).check();
  await pane.getByRole('button', { name: 'Find causal graphs' }).click();
  const result = page.getByTestId('steps-result');
  await expect(result).toBeVisible({ timeout: 60_000 });
  await expect(result).toHaveAttribute('data-count', String(cli(['unsample', saved, '--rate', '2']).count));
  await page.waitForTimeout(300);
  await page.screenshot({ path: testInfo.outputPath('steps-edit-1440.png'), fullPage: true });
  expect(await axeViolations(page)).toEqual([]);

  await page.setViewportSize({ width: 1024, height: 768 });
  await page.waitForTimeout(300);
  await editor.scrollIntoViewIfNeeded();
  await page.screenshot({ path: testInfo.outputPath('steps-edit-1024.png') });
  expect(await axeViolations(page)).toEqual([]);
  expect(errors).toEqual([]);
});

test('the measured graph on the main canvas: u = 1 … U with its control, each edge explained, the same edges as `loopfold undersample`', async ({ page }, testInfo) => {
  test.setTimeout(300_000);
  const want = [1, 2, 3].map((u) => cli(['undersample', 'src/examples/lake.json', '--rate', String(u)]));
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  await page.goto('/?example=lake');
  const canvas = page.getByRole('region', { name: 'Mechanism canvas' });
  await expect(canvas.locator('.react-flow__node').first()).toBeVisible({ timeout: 60_000 });
  await canvas.getByRole('button', { name: /Integer steps: measured graph/ }).click();
  const panel = canvas.getByLabel('Measured graph control');
  const layer = canvas.locator('svg.lf-measured');
  const edgesAt = async (u: number) => {
    await expect(layer).toHaveAttribute('data-rate', String(u));
    return (await layer.locator('[data-edge]').evaluateAll((els) => els.map((e) => e.getAttribute('data-edge')!))).sort();
  };
  const cliEdges = (u: number) => [...want[u - 1].directed.map((p) => `${p[0]}>${p[1]}`), ...want[u - 1].bidirected.map((p) => `${p[0]}<>${p[1]}`)].sort();
  // The Steps tab's rate (2) is the canvas's too.
  expect(await edgesAt(2)).toEqual(cliEdges(2));
  expect(want[1].bidirected.length).toBeGreaterThan(0);
  await page.screenshot({ path: testInfo.outputPath('canvas-measured-u2-1440.png') });
  await panel.getByRole('button', { name: 'Measure less often (u + 1)' }).click();
  expect(await edgesAt(3)).toEqual(cliEdges(3));
  const slider = panel.getByRole('slider', { name: 'Measured every u-th step (canvas)' });
  await slider.focus();
  await page.keyboard.press('Home');
  expect(await edgesAt(1)).toEqual(cliEdges(1));
  await expect(layer.locator('[data-kind="bidirected"]')).toHaveCount(0);
  await page.keyboard.press('ArrowRight');
  expect(await edgesAt(2)).toEqual(cliEdges(2));
  // The words for an edge: a directed edge of two steps names the variable it passes through.
  const [a, b] = want[1].directed.find(([x, y]) => x !== y && !want[0].directed.some(([p, q]) => p === x && q === y))!;
  const edge = layer.locator(`[data-edge="${a}>${b}"]`);
  await edge.focus();
  await page.keyboard.press('Enter');
  await expect(panel.getByTestId('measured-why')).toContainText(new RegExp(`^${a} → ${b} appears at u = 2 through `));
  const [c, d] = want[1].bidirected[0];
  await layer.locator(`[data-edge="${c}<>${d}"]`).click({ force: true });
  await expect(panel.getByTestId('measured-why')).toContainText(`${c} ↔ ${d} appears at u = 2:`);
  await page.screenshot({ path: testInfo.outputPath('canvas-measured-why-1440.png') });
  // The mode keeps the page accessible (WCAG 2.1 A/AA, axe-core): the edges are named buttons, the control a named slider.
  expect(await axeViolations(page)).toEqual([]);
  // The Steps tab shows the same rate and its own figure, unchanged; the panel leads to its search back.
  await panel.getByRole('button', { name: /Which causal graphs give this/ }).click();
  await expect(page.getByRole('tab', { name: 'Steps' })).toHaveAttribute('aria-selected', 'true');
  await expect(page.getByTestId('steps-inverse')).toContainText('at u = 2');
  await expect(page.getByTestId('steps-figure')).toHaveAttribute('data-rate', '2');
  await page.setViewportSize({ width: 1024, height: 768 });
  await page.screenshot({ path: testInfo.outputPath('canvas-measured-1024.png') });
  // Back to the sketch: its links are drawn again and take the pointer.
  await panel.getByRole('button', { name: "Back to the sketch's links" }).click();
  await expect(layer).toHaveCount(0);
  await expect(canvas.getByRole('button', { name: /Integer steps: measured graph/ })).toBeVisible();
  expect(errors).toEqual([]);
});
