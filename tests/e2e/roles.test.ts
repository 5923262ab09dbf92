/**
 * Browser smoke test (issue 2): each demo role signs in through the real sign-in page of the
 * built app and sees its own navigation; no request leaves this machine.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { isLocal, openBrowser, screenshotPath, signIn, startServer, type Browser, type RunningServer } from './harness';

const ROLES = [
  { role: 'admin', email: 'admin@emberline-demo.test', nav: ['Users and roles', 'Laboratory details'] },
  { role: 'quality_manager', email: 'quality@emberline-demo.test', nav: ['Measurement models', 'Reference standards'] },
  { role: 'analyst', email: 'analyst@emberline-demo.test', nav: ['Calibration jobs'] },
  { role: 'signatory', email: 'signatory@emberline-demo.test', nav: ['Awaiting review'] },
  { role: 'customer', email: 'customer@emberline-demo.test', nav: ['My certificates'] },
] as const;

describe('sign-in and role navigation in a real browser', () => {
  let server: RunningServer;
  let browser: Browser;

  beforeAll(async () => {
    server = await startServer();
    browser = await openBrowser();
  });

  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });

  it('shows the public landing page with the cautions', async () => {
    const { page } = browser;
    await page.goto(server.url);
    await expect.poll(() => page.getByText(/authorised signatory/i).count()).toBeGreaterThan(0);
    await page.screenshot({ path: screenshotPath('00-landing'), fullPage: true });
  });

  for (const { role, email, nav } of ROLES) {
    it(`signs in as ${role} and sees that role's navigation`, async () => {
      const { page } = browser;
      await signIn(browser, server.url, email);
      const navigation = page.getByRole('navigation', { name: /sections/i });
      for (const label of nav) {
        await expect.poll(() => navigation.getByRole('link', { name: label }).count(), { timeout: 15_000 }).toBeGreaterThan(0);
      }
      await page.screenshot({ path: screenshotPath(`01-shell-${role}`), fullPage: true });
    });
  }

  it('made no request outside localhost and logged no console errors', () => {
    expect(browser.requests.filter((u) => !isLocal(u))).toEqual([]);
    // Signed out, the sign-in page asks only the public session check (200, null): nothing is refused.
    expect(browser.errors).toEqual([]);
  });
});
