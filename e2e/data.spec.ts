import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { expect, test, type Page } from '@playwright/test';

const AXE = readFileSync('node_modules/axe-core/axe.min.js', 'utf8');
type AxeResult = { violations: { id: string; impact: string; help: string; nodes: { target: string[] }[] }[] };

/** WCAG 2.1 A and AA rules of axe-core over the page as it is now (as in trust.spec.ts). */
async function axeViolations(page: Page): Promise<string[]> {
  if (!(await page.evaluate(() => 'axe' in window))) await page.addScriptTag({ content: AXE });
  const r = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run(ctx: unknown, opts: unknown): Promise<unknown> } }).axe;
    return axe.run(document, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] }, resultTypes: ['violations'] });
  }) as AxeResult;
  return r.violations.map((v) => `${v.id} (${v.impact}): ${v.help} — ${v.nodes.slice(0, 3).map((n) => n.target.join(' ')).join(' | ')}`);
}

/**
 * Words in the Data pane's table cells that the layout broke across lines:
 * a word whose text range has more than one line box. Cells of class
 * lf-data-raw (text from the file: column names, values, row lists) may break.
 */
async function brokenWords(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const out: string[] = [];
    for (const cell of document.querySelectorAll('.lf-data .lf-data-table th, .lf-data .lf-data-table td')) {
      if (cell.closest('.lf-data-raw')) continue;
      const walker = document.createTreeWalker(cell, NodeFilter.SHOW_TEXT);
      for (let n = walker.nextNode(); n; n = walker.nextNode()) {
        const text = n.textContent ?? '';
        for (const m of text.matchAll(/\S+/g)) {
          const r = document.createRange();
          r.setStart(n, m.index);
          r.setEnd(n, m.index + m[0].length);
          const tops = new Set(Array.from(r.getClientRects()).filter((b) => b.width > 0).map((b) => Math.round(b.top)));
          if (tops.size > 1) out.push(m[0]);
        }
      }
    }
    return out;
  });
}

test('Data tab: the demo diary mapped, imported, summarised, kept in the browser; the VAR against the sketch as the command line gives it', async ({ page }, testInfo) => {
  test.setTimeout(90_000);
  const cli = JSON.parse(execFileSync('npm', ['run', '-s', 'loopfold', '--', 'fit', 'src/examples/sleep-stress.json', '--data', 'public/demo/sleep-stress-diary.csv', '--method', 'var', '--json'], { encoding: 'utf8' })) as { comparison: { from: string; to: string; verdict: string }[]; n: { persons: number; pairs: number } };
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  await page.goto('/?example=sleep-stress');
  await page.getByRole('tab', { name: 'Data' }).click();
  await expect(page.getByTestId('data-privacy')).toContainText('The data stay on this machine');
  await page.getByRole('button', { name: 'Demo diary' }).click();

  const mapper = page.getByTestId('column-mapper');
  // The first question starts the data worker (the dev server compiles it on first use).
  await expect(mapper).toContainText('Columns of sleep-stress-diary.csv', { timeout: 30_000 });
  await expect(mapper.getByLabel('Person', { exact: true })).toHaveValue('participant');
  await expect(mapper.getByLabel('Time', { exact: true })).toHaveValue('answered');
  await expect(mapper.getByLabel('Variable measured by column sleep_debt')).toHaveValue('sleepDebt');
  await expect(mapper).toContainText('Not measured (latent in the fits): Cortisol');
  await mapper.getByRole('button', { name: 'Import' }).click();

  const summary = page.getByTestId('import-summary');
  await expect(page.getByTestId('import-counts')).toContainText('1901 rows read');
  await expect(page.getByTestId('import-counts')).toContainText('30 persons');
  await expect(page.getByTestId('data-overview').locator('svg[data-chart="interval-histogram"]')).toBeVisible();
  await page.screenshot({ path: testInfo.outputPath('data-imported-1440.png'), fullPage: false });
  await page.getByTestId('data-overview').locator('svg[data-chart="person-series"]').scrollIntoViewIfNeeded();
  await page.screenshot({ path: testInfo.outputPath('data-overview-1440.png') });

  await page.getByRole('button', { name: 'Fit the VAR' }).click();
  const result = page.getByTestId('var-result');
  await expect(result).toBeVisible({ timeout: 30_000 });
  await expect(result).toContainText(`${cli.n.persons} persons, ${cli.n.pairs} pairs`);
  for (const c of cli.comparison) await expect(result.locator(`tr[data-link="${c.from}>${c.to}"]`)).toHaveAttribute('data-verdict', c.verdict);
  await expect(page.locator('svg[data-chart="lag-curve"]')).toBeVisible();
  // The sketch's ordering at the data's interval: every measured state changes from occasion to occasion at about 3 h.
  await expect(page.getByTestId('data-roles').locator('tr[data-state="mood"]')).toContainText('changes from occasion to occasion');
  await page.getByTestId('data-roles').scrollIntoViewIfNeeded();
  await page.screenshot({ path: testInfo.outputPath('data-roles-1440.png') });
  await page.locator('svg[data-chart="lag-curve"]').scrollIntoViewIfNeeded();
  await page.screenshot({ path: testInfo.outputPath('data-lag-1440.png') });

  // The continuous-time fit is slow on 30 persons: it shows progress and stops on Cancel.
  await page.getByRole('button', { name: 'Fit the continuous-time model (slow)' }).click();
  await expect(page.getByRole('progressbar', { name: 'Progress of the fit' })).toBeVisible();
  await page.getByTestId('data-fits').getByRole('button', { name: 'Cancel' }).click();
  await expect(page.getByText('The continuous-time fit was stopped.')).toBeVisible();
  await expect(page.getByRole('button', { name: 'Fit the VAR' })).toBeEnabled();
  await result.scrollIntoViewIfNeeded();
  await page.screenshot({ path: testInfo.outputPath('data-var-1440.png') });
  expect(await brokenWords(page)).toEqual([]);
  expect(await axeViolations(page)).toEqual([]);

  await page.setViewportSize({ width: 1024, height: 768 });
  await page.getByTestId('import-summary').scrollIntoViewIfNeeded();
  await page.screenshot({ path: testInfo.outputPath('data-summary-1024.png') });
  await result.scrollIntoViewIfNeeded();
  await page.screenshot({ path: testInfo.outputPath('data-var-1024.png') });
  // Verdicts and labels keep their words whole in the narrow pane, and the table fits it.
  expect(await brokenWords(page)).toEqual([]);
  const fits = await result.locator('table').evaluate((t) => t.getBoundingClientRect().right <= (t.closest('.lf-data') as HTMLElement).getBoundingClientRect().right + 1);
  expect(fits).toBe(true);
  expect(await axeViolations(page)).toEqual([]);

  // Kept in this browser: after a reload the summary is back without opening the file.
  await page.reload();
  await page.getByRole('tab', { name: 'Data' }).click();
  await expect(summary).toContainText('sleep-stress-diary.csv');
  await expect(page.getByTestId('import-counts')).toContainText('30 persons');
  expect(errors).toEqual([]);
});
