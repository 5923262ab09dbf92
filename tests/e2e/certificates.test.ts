/**
 * The certificate workflow in a real browser (issue 6): the signatory approves the submitted demo
 * job with the password; the local mailbox receives the signed PDF for the customer's contact; the
 * customer signs in and downloads the same bytes; the public verification page confirms the file.
 * Screenshots under test-results/screenshots/cert-*.png.
 */
import { createHash } from 'node:crypto';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD, isLocal, openBrowser, screenshotPath, signIn, startServer, type Browser, type RunningServer } from './harness';

const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex');

async function download(page: Page, linkName: RegExp): Promise<Buffer> {
  const [d] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: linkName }).first().click()]);
  const path = await d.path();
  return readFileSync(path);
}

describe('approve, e-mail, portal and verification in a real browser', () => {
  let server: RunningServer;
  let browser: Browser;
  let number = '';
  let mailed: Buffer;
  const failed: string[] = [];

  beforeAll(async () => {
    // The demo seed (jobs with Monte Carlo results, a signed certificate) takes a while on a busy machine.
    server = await startServer({ startTimeoutMs: 240_000 });
    browser = await openBrowser();
    browser.page.on('response', (r) => {
      if (r.status() >= 400) failed.push(`${r.status()} ${r.url()}`);
    });
  }, 300_000);

  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });

  it('the signatory opens the submitted demo job, reads the preview and approves with the password', async () => {
    const { page } = browser;
    await signIn(browser, server.url, 'signatory@emberline-demo.test');
    await page.goto(`${server.url}/app/review`);
    const link = page.getByRole('table', { name: /awaiting review/i }).getByRole('link').first();
    await link.waitFor({ timeout: 20_000 });
    await page.screenshot({ path: screenshotPath('cert-01-review-queue'), fullPage: true });
    await link.click();
    await page.getByRole('heading', { name: /what the certificate will say/i }).waitFor({ timeout: 20_000 });
    await expect.poll(() => page.getByText(/valid only after an authorised signatory/i).count()).toBeGreaterThan(0);
    await page.screenshot({ path: screenshotPath('cert-02-review-page'), fullPage: true });

    await page.getByLabel(/your password/i).fill('wrong-password');
    await page.getByRole('button', { name: /approve and issue/i }).click();
    await page.getByText(/password is not correct/i).waitFor({ timeout: 20_000 });
    await page.screenshot({ path: screenshotPath('cert-03-wrong-password'), fullPage: false });

    await page.getByLabel(/your password/i).fill(DEMO_PASSWORD);
    await page.getByRole('button', { name: /approve and issue/i }).click();
    const issued = page.getByText(/^Certificate EMB-C-\d{4}-\d{4} issued$/);
    await issued.waitFor({ timeout: 90_000 });
    number = /EMB-C-\d{4}-\d{4}/.exec((await issued.textContent()) ?? '')![0];
    // The approval form is at the foot of the page and the answer at its top: the answer is brought into view.
    expect(await issued.evaluate((el) => { const r = el.getBoundingClientRect(); return r.top >= 0 && r.bottom <= window.innerHeight; })).toBe(true);
    await page.screenshot({ path: screenshotPath('cert-04-issued'), fullPage: false });
  }, 180_000);

  it('the local mailbox receives the signed PDF for the customer’s contact', async () => {
    const { page } = browser;
    await signIn(browser, server.url, 'admin@emberline-demo.test');
    await page.goto(`${server.url}/app/mail/mailbox`);
    const message = page.getByRole('listitem', { name: new RegExp(`m\\.holloway@brightwater-glass\\.example\\.com: Calibration certificate ${number}`) });
    try {
      // The mailbox page refreshes itself every 5 s; reloading it and counting at once raced its first fetch.
      await message.first().waitFor({ timeout: 180_000 });
    } catch (err) {
      // Say what the page, the mailbox and the outbox held, so a failure in CI explains itself.
      const state = async (path: string) => { const r = await page.request.get(`${server.url}${path}`); return `${r.status()} ${(await r.text()).slice(0, 1500)}`; };
      throw new Error(`no mail for ${number} in the local mailbox after 180 s; page at ${page.url()}\nmailbox: ${await state('/api/mail/mailbox')}\noutbox: ${await state('/api/mail/outbox')}\nserver log:\n${server.output().slice(-3000)}`, { cause: err });
    }
    await page.screenshot({ path: screenshotPath('cert-05-mailbox'), fullPage: false });
    const [d] = await Promise.all([page.waitForEvent('download'), message.getByRole('link', { name: new RegExp(`${number}\\.pdf`) }).click()]);
    mailed = readFileSync(await d.path());
    expect(mailed.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    await page.goto(`${server.url}/app/mail`);
    await page.getByRole('table', { name: /e-mail log/i }).waitFor();
    await page.screenshot({ path: screenshotPath('cert-06-mail-log'), fullPage: true });
  }, 240_000);

  it('the customer signs in and downloads the same bytes', async () => {
    const { page } = browser;
    await signIn(browser, server.url, 'customer@emberline-demo.test');
    await page.goto(`${server.url}/app/my-certificates`);
    await page.getByRole('link', { name: new RegExp(`Download ${number}\\.pdf`) }).waitFor({ timeout: 20_000 });
    await page.screenshot({ path: screenshotPath('cert-07-portal'), fullPage: true });
    const bytes = await download(page, new RegExp(`Download ${number}\\.pdf`));
    expect(sha256(bytes)).toBe(sha256(mailed));
  }, 60_000);

  it('the public verification page confirms the file without signing in', async () => {
    const { page, context } = browser;
    await context.clearCookies();
    await page.goto(`${server.url}/verify`);
    const file = join(server.dataDir, `${number}.pdf`);
    writeFileSync(file, mailed);
    await page.getByLabel(/certificate pdf file/i).setInputFiles(file);
    await page.getByText(/^Authentic: this is the file the laboratory issued$/).waitFor({ timeout: 20_000 });
    await expect.poll(() => page.getByTestId('verify-status').first().textContent()).toBe('Current');
    await page.screenshot({ path: screenshotPath('cert-08-verify'), fullPage: true });
  }, 60_000);

  it('made no request outside localhost and logged no console errors other than the refused password', () => {
    expect(browser.requests.filter((u) => !isLocal(u))).toEqual([]);
    // Expected refusals: 401 from the session probe on the sign-in page after signing out, 403 for the wrong password.
    expect(failed.filter((f) => !/^401 .*\/api\/(me|auth\/get-session)/.test(f) && !/^403 .*\/approve$/.test(f))).toEqual([]);
    expect(browser.errors.filter((e) => !/status of 40[13]/.test(e))).toEqual([]);
  });
});
