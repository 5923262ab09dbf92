/**
 * Browser test (issue 7): a quality manager adds a reference standard with its certificate PDF,
 * sees it "due soon", and sees it flagged overdue once the server's injected clock
 * (EMBERLINE_CLOCK_OFFSET_DAYS) passes its due date. ISO/IEC 17025:2017 §6.4.13 (equipment
 * records with due dates); the 30-day warning window is common practice, no source.
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD, isLocal, openBrowser, screenshotPath, startServer, type Browser, type RunningServer } from './harness';

/**
 * Migrates and seeds a fresh DATA_DIR by starting the built server once and stopping it, so the
 * later start with the shifted clock only reopens it.
 */
async function preparedDataDir(): Promise<string> {
  const dataDir = mkdtempSync(join(tmpdir(), 'emberline-e2e-standards-'));
  const first = await startServer({ dataDir });
  await first.stop();
  return dataDir;
}

const day = (offset: number) => new Date(Date.now() + offset * 86_400_000).toISOString().slice(0, 10);

/** A minimal PDF (ISO 32000-1 §7.5 structure) for the upload. */
const PDF = Buffer.from('%PDF-1.4\n1 0 obj << /Type /Catalog /Pages 2 0 R >> endobj\n2 0 obj << /Type /Pages /Kids [] /Count 0 >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n', 'latin1');

describe('reference standards in a real browser', () => {
  let server: RunningServer;
  let browser: Browser;
  /** Every answer with status ≥ 400 the page received. */
  const failed: string[] = [];

  beforeAll(async () => {
    server = await startServer({ dataDir: await preparedDataDir() });
    browser = await openBrowser();
    browser.page.on('response', (r) => {
      if (r.status() >= 400) failed.push(`${r.status()} ${new URL(r.url()).pathname}`);
    });
  });
  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });

  it('a quality manager adds a standard with its PDF; it is due soon', async () => {
    const { page } = browser;
    await page.goto(`${server.url}/sign-in`);
    await page.getByLabel(/e-mail/i).fill('quality@emberline-demo.test');
    await page.getByLabel(/password/i).fill(DEMO_PASSWORD);
    await page.getByRole('button', { name: /sign in/i }).click();
    await page.getByRole('navigation', { name: /sections/i }).getByRole('link', { name: 'Reference standards' }).click();
    await expect.poll(() => page.getByText('Reference thermometer PRT-B (demo)').count(), { timeout: 15_000 }).toBeGreaterThan(0);
    await expect.poll(() => page.getByText(/Overdue by/).count()).toBeGreaterThan(0);
    await page.screenshot({ path: screenshotPath('standards-01-register'), fullPage: true });

    await page.getByRole('link', { name: 'Add a standard' }).click();
    await page.getByLabel('Name', { exact: true }).fill('Checking blackbody CB-2 (browser test)');
    await page.getByLabel('Kind').selectOption('blackbody_source');
    await page.getByLabel('Serial number').fill('CB2-7781');
    await page.getByLabel('Certificate number').fill('E2E-CERT-0001');
    await page.getByLabel('Issuing laboratory').fill('Fenwick Cross Calibration Services (demo)');
    await page.getByLabel('Calibration date').fill(day(-345));
    await page.getByLabel('Due date').fill(day(20));
    await page.getByRole('button', { name: 'Add a certified value' }).click();
    await page.getByLabel('Quantity, row 1').fill('Effective emissivity');
    await page.getByLabel('Value, row 1').fill('0.9975');
    await page.getByLabel('Expanded uncertainty U, row 1').fill('0.0015');
    await page.getByLabel('Coverage factor k, row 1').fill('2');
    await page.getByRole('button', { name: 'Add the standard' }).click();

    await expect.poll(() => page.getByRole('heading', { name: 'Checking blackbody CB-2 (browser test)' }).count(), { timeout: 15_000 }).toBe(1);
    await expect.poll(() => page.getByTestId('due-state').innerText()).toMatch(/Due soon: in 20 days/);
    await page.getByLabel(/Choose the PDF/).setInputFiles({ name: 'CB-2 certificate.pdf', mimeType: 'application/pdf', buffer: PDF });
    await page.getByRole('button', { name: 'Upload', exact: true }).click();
    await expect.poll(() => page.getByRole('link', { name: 'CB-2 certificate.pdf' }).count(), { timeout: 15_000 }).toBe(1);
    await expect.poll(() => page.getByText(/SHA-256 [0-9a-f]{64}/).count()).toBe(1);
    await page.screenshot({ path: screenshotPath('standards-02-added-with-pdf'), fullPage: true });
  });

  it('a text file offered as the certificate is refused with a clear message', async () => {
    const { page } = browser;
    await page.getByLabel(/Replace with another PDF/).setInputFiles({ name: 'not-a-pdf.pdf', mimeType: 'application/pdf', buffer: Buffer.from('plain text') });
    await page.getByRole('button', { name: 'Upload', exact: true }).click();
    await expect.poll(() => page.getByRole('alert').innerText(), { timeout: 15_000 }).toMatch(/must be a PDF file.*Nothing was stored/s);
    expect(await page.getByRole('link', { name: 'CB-2 certificate.pdf' }).count()).toBe(1);
    await page.screenshot({ path: screenshotPath('standards-03-upload-refused'), fullPage: true });
  });

  it('once the server clock passes the due date, the standard is flagged overdue', async () => {
    const dataDir = server.dataDir;
    await server.stop();
    server = await startServer({ dataDir, env: { EMBERLINE_CLOCK_OFFSET_DAYS: '25' } });
    const { page, context } = browser;
    await context.clearCookies();
    await page.goto(`${server.url}/sign-in`);
    await page.getByLabel(/e-mail/i).fill('quality@emberline-demo.test');
    await page.getByLabel(/password/i).fill(DEMO_PASSWORD);
    await page.getByRole('button', { name: /sign in/i }).click();
    await page.getByRole('navigation', { name: /sections/i }).getByRole('link', { name: 'Reference standards' }).click();
    const row = page.getByRole('row', { name: /Checking blackbody CB-2/ });
    await expect.poll(() => row.innerText(), { timeout: 15_000 }).toMatch(/Overdue by 5 days/);
    expect(await row.innerText()).toMatch(/PDF on file/);
    await page.screenshot({ path: screenshotPath('standards-04-overdue-after-clock'), fullPage: true });
    await row.getByRole('link', { name: /Checking blackbody CB-2/ }).click();
    await expect.poll(() => page.getByTestId('due-state').innerText(), { timeout: 15_000 }).toMatch(/Overdue by 5 days/);
  });

  it('made no request outside localhost; the only failed answers are the expected ones', () => {
    expect(browser.requests.filter((u) => !isLocal(u))).toEqual([]);
    // 401: /api/me asked before signing in; 415: the refused upload. Nothing else failed.
    const unexpected = failed.filter((f) => !/^401 \/api\/me$/.test(f) && !/^415 \/api\/standards\/[^/]+\/certificate$/.test(f));
    expect(unexpected).toEqual([]);
    // Failed loads are checked by URL just above; every other console error or page error counts.
    expect(browser.errors.filter((e) => !/^Failed to load resource: the server responded with a status of/.test(e))).toEqual([]);
  });
});
