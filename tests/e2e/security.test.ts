/**
 * The strict Content-Security-Policy in a real browser (issue 8, "Web"): every page of every role
 * is visited, including the budget editor with its charts, the model editor with its typeset
 * equations (KaTeX fonts) and the local mailbox, and the browser reports no policy violation —
 * neither a `securitypolicyviolation` event nor a "Refused to …" console message.
 * The header itself is checked in tests/server/security/web.test.ts.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { isLocal, openBrowser, screenshotPath, signIn as signInAs, startServer, type Browser, type RunningServer } from './harness';

describe('the Content-Security-Policy holds on every page in a real browser', () => {
  let server: RunningServer;
  let browser: Browser;
  const violations: string[] = [];

  beforeAll(async () => {
    server = await startServer({ startTimeoutMs: 240_000 });
    browser = await openBrowser();
    await browser.context.exposeBinding('__reportCsp', (_source, v: string) => { violations.push(v); });
    await browser.context.addInitScript(() => {
      document.addEventListener('securitypolicyviolation', (e) => {
        (window as unknown as { __reportCsp: (v: string) => void }).__reportCsp(`${location.pathname}: ${e.violatedDirective} blocked ${e.blockedURI || '(inline)'}`);
      });
    });
  }, 300_000);

  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });

  const signIn = (email: string) => signInAs(browser, server.url, email);

  /** Lets a page finish its requests and paint (fonts, charts) before the next one. */
  async function settle() {
    await browser.page.waitForLoadState('networkidle', { timeout: 20_000 }).catch(() => undefined);
  }

  it('public pages: landing, verification, sign-in', async () => {
    const { page } = browser;
    for (const path of ['/', '/verify', '/sign-in']) {
      await page.goto(`${server.url}${path}`);
      await settle();
    }
    expect(violations).toEqual([]);
  });

  it('analyst: job list and a job with its budget editor and charts', async () => {
    const { page } = browser;
    await signIn('analyst@emberline-demo.test');
    await page.goto(`${server.url}/app/jobs`);
    const first = page.getByRole('table', { name: 'Calibration jobs' }).getByRole('link').first();
    await first.waitFor({ timeout: 20_000 });
    await first.click();
    await page.getByRole('heading', { name: 'Input quantities' }).waitFor({ timeout: 30_000 });
    await settle();
    await page.screenshot({ path: screenshotPath('csp-analyst-job'), fullPage: false });
    expect(violations).toEqual([]);
  }, 120_000);

  it('quality manager: models and the model editor with typeset equations', async () => {
    const { page } = browser;
    await signIn('quality@emberline-demo.test');
    await page.getByRole('navigation', { name: /sections/i }).getByRole('link', { name: 'Measurement models' }).click();
    await page.getByRole('link', { name: 'Infrared thermometer against a reference blackbody' }).first().click();
    await page.locator('.katex').first().waitFor({ timeout: 30_000 });
    await settle();
    for (const name of ['Reference standards', 'Customers', 'Audit log']) {
      await page.getByRole('navigation', { name: /sections/i }).getByRole('link', { name }).click();
      await settle();
    }
    expect(violations).toEqual([]);
  }, 120_000);

  it('signatory: review queue and a review page', async () => {
    const { page } = browser;
    await signIn('signatory@emberline-demo.test');
    await page.goto(`${server.url}/app/review`);
    const link = page.getByRole('table', { name: /awaiting review/i }).getByRole('link').first();
    await link.waitFor({ timeout: 20_000 });
    await link.click();
    await page.getByRole('heading', { name: /what the certificate will say/i }).waitFor({ timeout: 30_000 });
    await settle();
    expect(violations).toEqual([]);
  }, 120_000);

  it('admin: users, laboratory, e-mail log and the local mailbox', async () => {
    const { page } = browser;
    await signIn('admin@emberline-demo.test');
    for (const name of ['Users and roles', 'Laboratory details', 'E-mail log']) {
      await page.getByRole('navigation', { name: /sections/i }).getByRole('link', { name }).click();
      await settle();
    }
    await page.goto(`${server.url}/app/mail/mailbox`);
    await settle();
    expect(violations).toEqual([]);
  }, 120_000);

  it('customer: the portal', async () => {
    const { page } = browser;
    await signIn('customer@emberline-demo.test');
    await page.goto(`${server.url}/app/my-certificates`);
    await page.getByRole('link', { name: /^Download EMB-C-/ }).first().waitFor({ timeout: 20_000 });
    expect(violations).toEqual([]);
  }, 60_000);

  it('no violation reached the console either, and nothing left this machine', () => {
    expect(browser.errors.filter((e) => /Content Security Policy|Refused to/i.test(e))).toEqual([]);
    expect(browser.requests.filter((u) => !isLocal(u))).toEqual([]);
  });
});
