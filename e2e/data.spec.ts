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

/** One person's VAR(1) with a constant by statsmodels OLS, equation by equation, on consecutive occasions both complete. */
const PERSON_OLS = `
import csv, json, sys
import numpy as np
import statsmodels.api as sm
rows = [r for r in csv.DictReader(open(sys.argv[1])) if r['participant'] == sys.argv[2]]
rows.sort(key=lambda r: r['answered'])
cols = ['stress', 'sleep_debt', 'mood']
v = [[float(r[c]) if r[c] != '' else None for c in cols] for r in rows]
pairs = [(v[k - 1], v[k]) for k in range(1, len(v)) if None not in v[k - 1] and None not in v[k]]
X = sm.add_constant(np.array([p[0] for p in pairs]), has_constant='add')
Y = np.array([p[1] for p in pairs])
fits = [sm.OLS(Y[:, i], X).fit() for i in range(3)]
print(json.dumps({'pairs': len(pairs), 'phi': [list(f.params[1:]) for f in fits], 'se': [list(f.bse[1:]) for f in fits]}))
`;

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
  test.setTimeout(240_000);
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

  // One person at a time: P02's own VAR(1) with a constant equals statsmodels' OLS (Debian's python3-statsmodels),
  // equation by equation, on P02's pairs of consecutive occasions with no missing cell.
  const sm = JSON.parse(execFileSync('/usr/bin/python3', ['-c', PERSON_OLS, 'public/demo/sleep-stress-diary.csv', 'P02'], { encoding: 'utf8' })) as { phi: number[][]; se: number[][]; pairs: number };
  const person = page.getByTestId('person-var');
  await person.getByLabel('Person for an N = 1 fit').selectOption('P02');
  await expect(person.getByTestId('person-var-table')).toHaveAttribute('data-person', 'P02');
  await expect(person).toContainText(`${sm.pairs} pairs.`);
  const vars = ['stress', 'sleepDebt', 'mood'];
  for (let i = 0; i < 3; i++)
    for (let j = 0; j < 3; j++) {
      const cells = person.locator(`tr[data-link="${vars[j]}>${vars[i]}"] td`);
      for (const [k, want, what] of [[0, sm.phi[i][j], 'φ'], [1, sm.se[i][j], 'SE']] as const) {
        const got = Number(await cells.nth(k).getAttribute('data-value'));
        expect(Math.abs(got - want), `P02 ${what} ${vars[j]} → ${vars[i]}: app ${got}, statsmodels ${want}`).toBeLessThanOrEqual(1e-8 * Math.max(1, Math.abs(want)));
      }
    }
  await person.scrollIntoViewIfNeeded();
  await page.screenshot({ path: testInfo.outputPath('data-person-1440.png') });
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

type CointJson = {
  pooled: { tested: number; engleGranger: { rejected: number } };
  perPerson: {
    id: string;
    adf: { series: string; statistic: number; pValue: number }[];
    engleGranger: { statistic: number; pValue: number };
    johansen: { trace: number[]; maxEig: number[] };
    errorCorrection: { loadings: { series: string; alpha: number; se: number; pValue: number }[] } | null;
    sentence: string;
  }[];
};

/**
 * The app's number (an attribute holding it at full precision) equals the command line's to 1e-10
 * relative: the same core code, but Chromium's and Node's Math.exp/log may differ in the last bit.
 */
async function expectSame(cell: ReturnType<Page['locator']>, want: number, what: string, attribute = 'data-value') {
  const got = Number(await cell.getAttribute(attribute));
  expect(Math.abs(got - want), `${what}: app ${got}, command line ${want}`).toBeLessThanOrEqual(1e-10 * Math.max(1e-300, Math.abs(want)));
}

test('Data tab: unit roots and cointegration of the demo warehouse weeks equal loopfold coint --json, person by person', async ({ page }, testInfo) => {
  test.setTimeout(240_000);
  const cli = JSON.parse(execFileSync('npm', ['run', '-s', 'loopfold', '--', 'coint', 'public/demo/warehouse-weeks.csv', '--columns', 'stock,orders', '--person', 'warehouse', '--json'], { encoding: 'utf8' })) as CointJson;
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  await page.goto('/?example=warehouse');
  await page.getByRole('tab', { name: 'Data' }).click();
  await page.getByRole('button', { name: 'Demo warehouse weeks' }).click();
  const mapper = page.getByTestId('column-mapper');
  await expect(mapper).toContainText('Columns of warehouse-weeks.csv', { timeout: 30_000 });
  await mapper.getByLabel('Person', { exact: true }).selectOption('warehouse');
  await mapper.getByLabel('Time', { exact: true }).selectOption('week');
  await mapper.getByLabel('Time written as').selectOption('number');
  await mapper.getByLabel('Unit of the numbers').selectOption('week');
  await mapper.getByLabel('Variable measured by column stock').selectOption('inventory');
  await mapper.getByRole('button', { name: 'Import' }).click();
  await expect(page.getByTestId('import-counts')).toContainText('3 persons');

  const coint = page.getByTestId('data-coint');
  await expect(coint).toContainText('Every state of the sketch self-regulates');
  // On request: stock first (regressed on orders), as --columns stock,orders.
  await coint.getByRole('checkbox', { name: /^stock/ }).check();
  await coint.getByRole('checkbox', { name: /^orders/ }).check();
  await expect(coint.getByTestId('coint-order')).toHaveText('Order: stock, orders.');
  await coint.getByRole('button', { name: 'Test the series' }).click();
  await expect(coint.getByTestId('coint-pooled')).toContainText(`Tested ${cli.pooled.tested} of 3`, { timeout: 30_000 });
  await expect(coint.getByTestId('coint-pooled')).toContainText(`in ${cli.pooled.engleGranger.rejected} of ${cli.pooled.tested}`);

  for (const p of cli.perPerson) {
    const row = coint.locator(`[data-testid="coint-persons"] tr[data-person="${p.id}"]`);
    await expectSame(row.locator('td').nth(0), p.engleGranger.statistic, `${p.id} Engle–Granger τ in the table`);
    await coint.getByLabel('Show the tests of').selectOption(p.id);
    const report = coint.locator(`[data-testid="coint-report"][data-who="${p.id}"]`);
    await expect(report).toBeVisible();
    for (const a of p.adf) {
      const r = report.locator(`[data-testid="coint-adf"] tr[data-series="${a.series}"] td`);
      await expectSame(r.nth(0), a.statistic, `${p.id} ADF τ of ${a.series}`);
      await expectSame(r.nth(1), a.pValue, `${p.id} ADF p of ${a.series}`);
    }
    const eg = report.getByTestId('coint-eg');
    await expectSame(eg, p.engleGranger.statistic, `${p.id} Engle–Granger τ`, 'data-statistic');
    await expectSame(eg, p.engleGranger.pValue, `${p.id} Engle–Granger p`, 'data-p');
    for (let i = 0; i < p.johansen.trace.length; i++) {
      const r = report.locator(`[data-testid="coint-johansen"] tr[data-rank="${i}"] td`);
      await expectSame(r.nth(0), p.johansen.trace[i], `${p.id} Johansen trace r ≤ ${i}`);
      await expectSame(r.nth(2), p.johansen.maxEig[i], `${p.id} Johansen max-eig r ≤ ${i}`);
    }
    for (const l of p.errorCorrection?.loadings ?? []) {
      const r = report.locator(`[data-testid="coint-loadings"] tr[data-series="${l.series}"] td`);
      await expectSame(r.nth(0), l.alpha, `${p.id} loading of ${l.series}`);
      await expectSame(r.nth(1), l.se, `${p.id} SE of the loading of ${l.series}`);
    }
    await expect(report.getByTestId('coint-sentence')).toHaveText(p.sentence);
  }
  // The reading a modeller sees: stock tracks orders, and the ordering a long interval gives.
  await expect(coint.getByTestId('coint-ordering').first()).toContainText('orders → stock');
  await coint.getByTestId('coint-pooled').scrollIntoViewIfNeeded();
  await page.screenshot({ path: testInfo.outputPath('data-coint-1440.png') });
  await coint.getByTestId('coint-report').first().scrollIntoViewIfNeeded();
  await page.screenshot({ path: testInfo.outputPath('data-coint-report-1440.png') });
  expect(await brokenWords(page)).toEqual([]);
  expect(await axeViolations(page)).toEqual([]);
  await page.setViewportSize({ width: 1024, height: 768 });
  await coint.getByTestId('coint-report').first().scrollIntoViewIfNeeded();
  await page.screenshot({ path: testInfo.outputPath('data-coint-1024.png') });
  expect(await brokenWords(page)).toEqual([]);
  expect(await axeViolations(page)).toEqual([]);

  // A bad choice is named by its field, and nothing is lost.
  await coint.getByRole('checkbox', { name: /^orders/ }).uncheck();
  await coint.getByRole('button', { name: 'Test the series' }).click();
  await expect(coint.getByRole('alert')).toHaveText('Series to test: choose 2 to 6 columns (now 1).');
  expect(errors).toEqual([]);
});

test('Data tab: a wide lake survey — waves of each variable, typed times unequal years apart, bad input named by field, row and column', async ({ page }, testInfo) => {
  test.setTimeout(240_000);
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  await page.goto('/?example=lake');
  await page.getByRole('tab', { name: 'Data' }).click();
  await page.getByRole('button', { name: 'Demo lake survey' }).click();
  const mapper = page.getByTestId('column-mapper');
  await expect(mapper).toContainText('Columns of lake-survey-waves.csv', { timeout: 30_000 });
  await expect(mapper.getByLabel('Layout')).toHaveValue('wide');
  await expect(mapper.getByLabel('Person', { exact: true })).toHaveValue('lake');
  const waves = page.getByTestId('wave-mapper');
  await expect(waves.locator('tbody tr')).toHaveCount(4);
  await expect(waves.getByLabel('Column of Planktivorous fish in wave 3')).toHaveValue('fish_2019');
  await expect(waves.getByLabel('Column of Sediment phosphorus in wave 4')).toHaveValue('sediment_2020');

  // The visits were 2014, 2016, 2019, 2020: times from the names, in years.
  await waves.getByRole('button', { name: 'Times from the years in the column names (2014, 2016, 2019, 2020)' }).click();
  await expect(waves.getByLabel('Unit of the wave times')).toHaveValue('year');
  await expect(waves.getByTestId('wave-times')).toHaveText('Waves at 0, 2, 5, 6 years since the first (intervals 2, 3, 1: unequal).');
  // The same as intervals from the wave before; a typed interval that is not a number is named and blocks the import.
  await waves.getByLabel('Wave times given as').selectOption('intervals');
  await expect(waves.getByLabel('Interval from wave 2 to wave 3')).toHaveValue('3');
  await waves.getByLabel('Interval from wave 2 to wave 3').fill('three');
  await expect(waves.locator('tr[data-wave="3"]')).toContainText('“three” is not a number');
  await mapper.getByRole('button', { name: 'Import' }).click();
  await expect(page.getByRole('alert')).toHaveText('Wave 3: its time is not a number; type it as a number in year.');
  await page.setViewportSize({ width: 1024, height: 768 });
  await mapper.scrollIntoViewIfNeeded();
  await waves.scrollIntoViewIfNeeded();
  await page.screenshot({ path: testInfo.outputPath('data-waves-1024.png') });
  expect(await brokenWords(page)).toEqual([]);
  expect(await axeViolations(page)).toEqual([]);
  await page.setViewportSize({ width: 1440, height: 900 });
  await waves.getByLabel('Interval from wave 2 to wave 3').fill('3');
  await expect(waves.getByTestId('wave-times')).toHaveText('Waves at 0, 2, 5, 6 years since the first (intervals 2, 3, 1: unequal).');
  // A column chosen twice is named.
  await waves.getByLabel('Column of Sediment phosphorus in wave 2').selectOption('fish_2016');
  await mapper.getByRole('button', { name: 'Import' }).click();
  await expect(page.getByRole('alert')).toHaveText('Column “fish_2016” is chosen twice (Wave 2 fish and Wave 2 sediment); each cell of the file belongs to one wave and one variable.');
  await waves.getByLabel('Column of Sediment phosphorus in wave 2').selectOption('sediment_2016');
  await waves.scrollIntoViewIfNeeded();
  await page.screenshot({ path: testInfo.outputPath('data-waves-1440.png') });

  await mapper.getByRole('button', { name: 'Import' }).click();
  await expect(page.getByTestId('import-counts')).toContainText('40 persons');
  await expect(page.getByTestId('import-counts')).toContainText('160 occasions kept');
  // The VAR's interval is the median of the waves' intervals, 2 years = 730.5 days (a Julian year of 365.25 days, common practice), shown to 3 digits.
  await page.getByRole('button', { name: 'Fit the VAR' }).click();
  await expect(page.getByTestId('var-result')).toContainText('every 731 days', { timeout: 30_000 });
  expect(await axeViolations(page)).toEqual([]);

  // A bad cell of a wide file is named by row and column, the rest imported.
  const bad = (await (await page.request.get('/demo/lake-survey-waves.csv')).text()).split('\n');
  bad[3] = bad[3].replace(/^([^,]*),([^,]*),([^,]*),([^,]*)/, '$1,$2,$3,lots'); // row 4 (header = row 1), column fish_2016
  await page.getByLabel('Open a CSV or TSV file').setInputFiles({ name: 'lake-edited.csv', mimeType: 'text/csv', buffer: Buffer.from(bad.join('\n')) });
  await expect(mapper).toContainText('Columns of lake-edited.csv', { timeout: 30_000 });
  await waves.getByRole('button', { name: /Times from the years/ }).click();
  await mapper.getByRole('button', { name: 'Import' }).click();
  await expect(page.getByTestId('import-summary')).toContainText('lake-edited.csv');
  await page.getByTestId('import-summary').getByText(/Every issue by row and column/).click();
  await expect(page.getByTestId('import-summary')).toContainText('row 4, column fish_2016: "lots" is not a number: set missing');
  expect(errors).toEqual([]);
});
