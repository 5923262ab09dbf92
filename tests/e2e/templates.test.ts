/**
 * Browser test of issue 4: a quality manager creates a measurement model, sees a parse error
 * marked at the right character, fixes it, releases the model (ISO/IEC 17025:2017 §7.2.2: release
 * runs the validation) and makes a new version from it. Screenshots of the editor go to
 * test-results/screenshots/templates-*.png.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { isLocal, openBrowser, screenshotPath, signIn, startServer, type Browser, type RunningServer } from './harness';

describe('measurement-model templates in a real browser', () => {
  let server: RunningServer;
  let browser: Browser;

  const failedAssets: string[] = [];

  beforeAll(async () => {
    server = await startServer();
    browser = await openBrowser();
    const { page } = browser;
    // KaTeX's fonts are bundled by Vite and must load from this server.
    page.on('response', (r) => {
      if (r.status() >= 400 && /^\/assets\/KaTeX_/.test(new URL(r.url()).pathname)) failedAssets.push(`${r.status()} ${r.url()}`);
    });
    await signIn(browser, server.url, 'quality@emberline-demo.test');
    await page.waitForURL(/\/app\/templates/);
  });

  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });

  it('lists the shipped models as released version 1', async () => {
    const { page } = browser;
    const table = page.getByRole('table', { name: 'Measurement models' });
    await expect.poll(() => table.getByRole('row').count(), { timeout: 15_000 }).toBeGreaterThanOrEqual(6);
    await expect.poll(() => table.getByText('Released', { exact: true }).count()).toBeGreaterThanOrEqual(5);
    await page.screenshot({ path: screenshotPath('templates-01-list'), fullPage: true });
  });

  it('shows a shipped released model read-only, typeset, with its budget preview', async () => {
    const { page } = browser;
    await page.getByRole('link', { name: 'Infrared thermometer against a reference blackbody' }).click();
    await expect.poll(() => page.getByText('Released: this version is frozen').count(), { timeout: 15_000 }).toBe(1);
    await expect.poll(() => page.getByTestId('equation-1-math').locator('.katex').count()).toBe(1);
    await expect.poll(() => page.getByRole('table', { name: /GUM uncertainty budget/ }).getByRole('row').count()).toBeGreaterThan(5);
    expect(await page.getByLabel('Equation 1', { exact: true }).isDisabled()).toBe(true);
    await page.screenshot({ path: screenshotPath('templates-02-released-view'), fullPage: true });
    await page.locator('section[aria-labelledby="sec-equations"]').screenshot({ path: screenshotPath('templates-02a-equations') });
    await page.locator('section[aria-labelledby="sec-preview"]').screenshot({ path: screenshotPath('templates-02b-preview') });
    await page.locator('section[aria-labelledby="sec-inputs"]').screenshot({ path: screenshotPath('templates-02c-inputs') });
    await page.getByRole('link', { name: 'Measurement models' }).first().click();
  });

  it('creates a model, sees the parse error at its position, fixes it, releases it and makes a new version', async () => {
    const { page } = browser;
    await page.getByLabel('New model').fill('Contact thermometer comparison (e2e)');
    await page.getByRole('button', { name: 'Create draft' }).click();
    await page.waitForURL(/\/app\/templates\/versions\//);
    await expect.poll(() => page.getByText('Version 1', { exact: true }).count(), { timeout: 15_000 }).toBe(1);

    await page.getByLabel('Symbol', { exact: true }).fill('E');
    await page.getByLabel('Description', { exact: true }).fill('error of indication (e2e)');

    await page.getByLabel('Input 1: symbol').fill('T_ind');
    await page.getByLabel('T_ind: meaning').fill('indicated temperature');
    await page.getByLabel('T_ind: centre').fill('300.3');
    await page.getByLabel('T_ind: sd').fill('0.03');

    await page.getByRole('button', { name: 'Add an input quantity' }).click();
    await page.getByLabel('Input 2: symbol').fill('T_ref');
    await page.getByLabel('T_ref: unit', { exact: true }).fill('K');
    await page.getByLabel('T_ref: meaning').fill('reference thermometer reading, corrected');
    await page.getByLabel('T_ref: value comes from').selectOption('reference');
    await page.getByLabel('T_ref: centre').fill('300');
    await page.getByLabel('T_ref: sd').fill('0.04');

    // A stray closing parenthesis at character 18 (0-based position 17).
    const equation = page.getByLabel('Equation 1', { exact: true });
    await equation.fill('E = T_ind - T_ref)');
    const caret = page.getByTestId('equation-0-caret');
    await expect.poll(() => caret.count(), { timeout: 10_000 }).toBe(1);
    expect(await caret.textContent()).toBe(`${' '.repeat(17)}^`);
    expect(await page.locator('#equation-0-error').textContent()).toMatch(/At character 18: .*Unexpected operator \)/);
    expect(await equation.getAttribute('aria-invalid')).toBe('true');
    await equation.scrollIntoViewIfNeeded();
    await page.screenshot({ path: screenshotPath('templates-03-parse-error'), fullPage: true });
    await page.locator('section[aria-labelledby="sec-equations"]').screenshot({ path: screenshotPath('templates-03a-parse-error-detail') });

    await equation.fill('E = T_ind - T_ref');
    await expect.poll(() => caret.count()).toBe(0);
    await expect.poll(() => page.getByTestId('equation-0-math').locator('.katex').count()).toBe(1);
    const preview = page.getByRole('table', { name: /GUM uncertainty budget/ });
    await expect.poll(() => preview.getByRole('row').count()).toBe(3);

    await page.getByRole('button', { name: 'Add a reference case' }).click();
    await page.getByLabel('Where the expected values come from').fill('worked by hand: y = 300.3 K − 300 K = 0.3 K; u = √(0.03² + 0.04²) K = 0.05 K');
    await page.getByLabel('Expected y', { exact: true }).fill('0.3');
    await page.getByLabel('Expected u(y)', { exact: true }).fill('0.05');
    await page.getByLabel('Tolerance on y (absolute)', { exact: true }).fill('1e-9');
    await page.getByLabel('Tolerance on u (relative)', { exact: true }).fill('1e-6');

    await page.getByLabel('Method statement').fill('Comparison in a stirred bath with a calibrated reference thermometer (e2e).');
    await page.getByRole('button', { name: 'Save draft' }).first().click();
    await expect.poll(() => page.getByText('All changes saved').count(), { timeout: 15_000 }).toBe(1);
    await page.screenshot({ path: screenshotPath('templates-04-draft-saved'), fullPage: true });

    await page.getByRole('button', { name: 'Release…' }).click();
    const dialog = page.getByRole('dialog', { name: /Release version 1/ });
    await expect.poll(() => dialog.isVisible()).toBe(true);
    expect(await dialog.textContent()).toMatch(/frozen/);
    await page.screenshot({ path: screenshotPath('templates-05-release-confirm') });
    await dialog.getByRole('button', { name: 'Release and freeze' }).click();
    await expect.poll(() => page.getByText('Released: this version is frozen').count(), { timeout: 15_000 }).toBe(1);
    await expect.poll(() => page.getByText('Release validation passed').count()).toBe(1);
    await page.screenshot({ path: screenshotPath('templates-06-released'), fullPage: true });

    await page.getByRole('button', { name: 'New version' }).click();
    await expect.poll(() => page.getByText('Version 2', { exact: true }).count(), { timeout: 15_000 }).toBe(1);
    expect(await page.getByLabel('Equation 1', { exact: true }).inputValue()).toBe('E = T_ind - T_ref');
    expect(await page.getByLabel('Equation 1', { exact: true }).isEditable()).toBe(true);
    await page.screenshot({ path: screenshotPath('templates-07-new-version'), fullPage: true });
  });

  it('made no request outside localhost, loaded the KaTeX fonts and logged no script errors', () => {
    expect(browser.requests.filter((u) => !isLocal(u))).toEqual([]);
    expect(browser.requests.some((u) => /KaTeX_.*\.woff2$/.test(u))).toBe(true);
    expect(failedAssets).toEqual([]);
    expect(browser.errors).toEqual([]);
  });
});
