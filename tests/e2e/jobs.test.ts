/**
 * Browser test of the analyst's job (issue 5): open a job from a shipped template, upload a CSV of
 * readings, watch the budget change as a value changes, run 10^6 Monte Carlo trials with a
 * visible progress bar, see the histogram, and submit for review. Demo data are invented.
 */
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fillNewJob, isLocal, openBrowser, screenshotPath, signIn, startServer, type Browser, type RunningServer } from './harness';

const CSV = path.resolve('tests/fixtures/readings/e2e-ir-80C.csv');

describe('an analyst carries a job from a template to submission', () => {
  let server: RunningServer;
  let browser: Browser;
  const failed: string[] = [];

  beforeAll(async () => {
    // Under a loaded machine the first start (migrations, demo seed with template validation) can be slow.
    server = await startServer({ startTimeoutMs: 300_000 });
    browser = await openBrowser();
  }, 360_000);

  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });

  it('creates the job, fills the budget, runs Monte Carlo and submits', async () => {
    const { page } = browser;
    page.setDefaultTimeout(30_000);
    page.on('response', (r) => {
      if (r.status() >= 400) failed.push(`${r.status()} ${r.request().method()} ${new URL(r.url()).pathname}`);
    });
    await signIn(browser, server.url, 'analyst@emberline-demo.test');
    await page.getByRole('heading', { name: 'Calibration jobs' }).waitFor();
    await page.screenshot({ path: screenshotPath('10-jobs-list'), fullPage: true });

    await page.getByRole('link', { name: 'New job' }).click();
    await fillNewJob(page, { model: 'Infrared thermometer against a reference blackbody — version 1' });
    await page.screenshot({ path: screenshotPath('11-new-job'), fullPage: true });
    await page.getByRole('button', { name: 'Open the job' }).click();
    await page.getByRole('heading', { name: /EMB-\d{4}-\d{4}/ }).waitFor();

    await page.getByLabel(/Nominal value/).fill('80');
    await page.getByRole('button', { name: 'Add point' }).click();
    await page.getByRole('tab', { name: /Point 1/ }).waitFor();

    // The checks name each input as the budget table typesets it (ε_bb, not the identifier eps_bb).
    const toFix = page.getByRole('list', { name: 'What to fix before submitting' });
    await toFix.getByText('✕ Point 1: ε_bb has no value yet: take it from a reference standard.', { exact: true }).waitFor();
    expect(await toFix.textContent()).not.toContain('eps_bb');
    await page.screenshot({ path: screenshotPath('11-checks-new-point'), fullPage: true });

    // Readings of the instrument from a CSV file.
    await page.locator('tr[data-input="T_ind"]').getByRole('button', { name: /upload readings/i }).click();
    await page.getByLabel('Readings file').setInputFiles(CSV);
    await page.getByRole('button', { name: 'Upload readings', exact: true }).click();
    await page.getByTestId('typea-T_ind').waitFor();
    await expect.poll(() => page.getByTestId('typea-T_ind').textContent()).toMatch(/n = 10, mean = 80\.36.*ν = 9/);

    // Values from the reference standards' certificates.
    await page.locator('tr[data-input="T_ref"]').getByRole('button', { name: /reference standard/i }).click();
    await page.getByRole('group', { name: /Reference standard for T_ref/ }).locator('li', { hasText: 'PRT-A' }).first().getByRole('button', { name: 'Use', exact: true }).click();
    await page.locator('tr[data-input="T_ref"]').getByText(/due \d{4}-\d{2}-\d{2}/).waitFor();
    await page.locator('tr[data-input="eps_bb"]').getByRole('button', { name: /reference standard/i }).click();
    await page.getByRole('group', { name: /Reference standard for eps_bb/ }).locator('li', { hasText: 'RB-900' }).filter({ hasText: 'emissivity' }).first().getByRole('button', { name: 'Use', exact: true }).click();
    await page.locator('tr[data-input="eps_bb"]').getByText(/RB-900/).waitFor();

    // The live budget changes as a value changes.
    const table = page.getByRole('table', { name: 'Uncertainty budget' });
    await table.waitFor().catch(async (err) => {
      await page.screenshot({ path: screenshotPath('12-budget-missing'), fullPage: true });
      throw err;
    });
    const sseRow = table.locator('tr[data-symbol="dT_sse"]');
    const before = await sseRow.textContent();
    await page.screenshot({ path: screenshotPath('12-budget-filled'), fullPage: true });
    const halfWidth = page.getByLabel('half-width a of dT_sse');
    await halfWidth.fill('0.4');
    await expect.poll(() => sseRow.textContent()).not.toBe(before);
    await page.screenshot({ path: screenshotPath('13-budget-changed'), fullPage: true });
    await page.getByRole('button', { name: 'Save and calculate' }).click();
    await page.getByText(/Saved and calculated/).waitFor();

    // Monte Carlo, 10^6 trials, with progress.
    await page.getByRole('combobox', { name: /^Trials/ }).selectOption('1000000');
    await page.getByRole('button', { name: 'Run Monte Carlo' }).click();
    const bar = page.getByRole('progressbar', { name: 'Monte Carlo progress' });
    await bar.waitFor();
    await expect.poll(() => page.getByTestId('mc-progress').textContent()).toMatch(/of 1\u202f000\u202f000 trials/);
    await page.screenshot({ path: screenshotPath('14-monte-carlo-running'), fullPage: true });
    await page.getByText(/Monte Carlo finished/).waitFor({ timeout: 120_000 });
    await page.getByRole('figure', { name: /Monte Carlo histogram/ }).locator('svg').first().waitFor();
    await page.screenshot({ path: screenshotPath('15-monte-carlo-histogram'), fullPage: true });

    // Submit.
    await expect.poll(() => page.getByText('✓ Every check passes.').count(), { timeout: 20_000 }).toBe(1);
    await page.getByRole('button', { name: 'Submit for review' }).click();
    await page.getByText(/Submitted for review\./).waitFor();
    await expect.poll(() => page.getByText('Submitted for review', { exact: true }).count()).toBeGreaterThan(0);
    await page.screenshot({ path: screenshotPath('16-submitted'), fullPage: true });
  }, 300_000);

  it('made no request outside localhost, no request was refused, and nothing was logged as an error', () => {
    expect(browser.requests.filter((u) => !isLocal(u))).toEqual([]);
    expect(failed).toEqual([]);
    expect(browser.errors).toEqual([]);
  });
});
