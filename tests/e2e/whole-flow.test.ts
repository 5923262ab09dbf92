/**
 * The whole job in a real browser, as each of its users (issue 10), on the demo data (all invented):
 * the quality manager releases a new version of the shipped infrared-thermometer model; an analyst
 * opens a job with three points (readings from CSV files, reference standards, one point edited with
 * the keyboard alone), runs Monte Carlo (JCGM 101) and submits; the signatory sends it back once,
 * the analyst corrects and resubmits, the signatory approves with the password (ISO/IEC 17025:2017
 * §7.8); the contact's mailbox holds the signed PDF, the customer downloads the same bytes from the
 * portal, the public verification page confirms them; an amendment (ISO/IEC 17025:2017 §7.8.8),
 * named on the original job's page while it is prepared and after, supersedes the certificate in
 * the portal and on the verification page.
 * Screenshots: test-results/screenshots/flow-*.png.
 */
import { createHash } from 'node:crypto';
import { readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD, fillNewJob, isLocal, openBrowser, screenshotPath, signIn as signInAs, startServer, type Browser, type RunningServer } from './harness';

const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex');
const MODEL = 'Infrared thermometer against a reference blackbody';
const CONTACT = 'm.holloway@brightwater-glass.example.com';
const POINTS = [
  { nominal: '80', csv: 'whole-flow-80C.csv' },
  { nominal: '150', csv: 'whole-flow-150C.csv' },
  { nominal: '300', csv: 'whole-flow-300C.csv' },
];

async function focusWhenEnabled(page: Page, name: string) {
  const button = page.getByRole('button', { name, exact: true });
  await expect.poll(() => button.isEnabled(), { timeout: 30_000 }).toBe(true);
  await button.focus();
  await expect.poll(() => page.evaluate(() => document.activeElement?.textContent ?? ''), { timeout: 10_000 }).toBe(name);
}

describe('the whole job, end to end, as each of its users', () => {
  let server: RunningServer;
  let browser: Browser;
  let step = 0;
  let jobUrl = '';
  let jobNumber = '';
  let number = '';
  let mailed: Buffer;
  const failed: string[] = [];

  const shot = async (name: string, fullPage = true) => {
    step += 1;
    await browser.page.screenshot({ path: screenshotPath(`flow-${String(step).padStart(2, '0')}-${name}`), fullPage });
  };

  const signIn = (email: string) => signInAs(browser, server.url, email);

  /** Selects point n's tab and waits for its budget. */
  async function openPoint(page: Page, n: number) {
    await page.getByRole('tab', { name: new RegExp(`^Point ${n}:`) }).click();
    await expect.poll(() => page.getByRole('tab', { name: new RegExp(`^Point ${n}:`) }).getAttribute('aria-selected'), { timeout: 60_000 }).toBe('true');
    await page.getByRole('table', { name: 'Uncertainty budget' }).waitFor();
  }

  async function runMonteCarlo(page: Page) {
    await page.getByRole('combobox', { name: /^Trials/ }).selectOption('100000');
    await page.getByRole('button', { name: 'Run Monte Carlo' }).click();
    await page.getByText(/Monte Carlo finished/).waitFor({ timeout: 180_000 });
    await page.getByRole('figure', { name: /Monte Carlo histogram/ }).locator('svg').first().waitFor();
  }

  async function readingsFromCsv(page: Page, csv: string) {
    await page.locator('tr[data-input="T_ind"]').getByRole('button', { name: /readings/i }).click();
    await page.getByLabel('Readings file').setInputFiles(path.resolve('tests/fixtures/readings', csv));
    await page.getByRole('button', { name: 'Upload readings', exact: true }).click();
    await expect.poll(() => page.getByTestId('typea-T_ind').textContent(), { timeout: 30_000 }).toMatch(/n = 10, .*ν = 9/);
  }

  async function standards(page: Page) {
    await page.locator('tr[data-input="T_ref"]').getByRole('button', { name: /reference standard|other standard/i }).click();
    await page.getByRole('group', { name: /Reference standard for T_ref/ }).locator('li', { hasText: 'PRT-A' }).first().getByRole('button', { name: 'Use', exact: true }).click();
    await page.locator('tr[data-input="T_ref"]').getByText(/PRT-A.*due \d{4}-\d{2}-\d{2}/).waitFor();
    await page.locator('tr[data-input="eps_bb"]').getByRole('button', { name: /reference standard|other standard/i }).click();
    await page.getByRole('group', { name: /Reference standard for eps_bb/ }).locator('li', { hasText: 'RB-900' }).filter({ hasText: 'emissivity' }).first().getByRole('button', { name: 'Use', exact: true }).click();
    await page.locator('tr[data-input="eps_bb"]').getByText(/RB-900/).waitFor();
  }

  async function saveAndCalculate(page: Page) {
    await page.getByRole('button', { name: 'Save and calculate' }).click();
    await page.getByText(/Saved and calculated/).waitFor();
  }

  beforeAll(async () => {
    server = await startServer({ startTimeoutMs: 300_000 });
    browser = await openBrowser();
    browser.page.setDefaultTimeout(30_000);
    browser.page.on('response', (r) => {
      if (r.status() >= 400) failed.push(`${r.status()} ${r.request().method()} ${new URL(r.url()).pathname}`);
    });
  }, 360_000);

  // The steps build on each other: after a failed one, the rest are reported as not run rather than
  // failing on the missing state; the failed step leaves a screenshot of the page it stopped on.
  let broken = false;
  beforeEach((ctx) => {
    if (broken) ctx.skip();
  });
  afterEach(async (ctx) => {
    if (ctx.task.result?.state === 'fail') {
      broken = true;
      await browser?.page.screenshot({ path: screenshotPath(`flow-failed-${ctx.task.name.slice(0, 2).replace(/\W/g, '')}`), fullPage: true }).catch(() => undefined);
      // What the browser could not reach and what the server said, so a failure in CI explains itself.
      console.log(`[whole flow] failed at "${ctx.task.name}" on ${browser?.page.url()}\nrequests without an answer:\n${browser?.failedRequests.join('\n') || '(none)'}\nserver log (end):\n${server?.output().slice(-2500)}`);
    }
  });

  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });

  it('1. the quality manager makes a new version of the shipped model and releases it', async () => {
    const { page } = browser;
    await signIn('quality@emberline-demo.test');
    await page.goto(`${server.url}/app/templates`);
    await page.getByRole('link', { name: MODEL }).click();
    await expect.poll(() => page.getByText('Released: this version is frozen').count(), { timeout: 60_000 }).toBe(1);
    await shot('qm-shipped-model');
    await page.getByRole('button', { name: 'New version' }).click();
    await expect.poll(() => page.getByText('Version 2', { exact: true }).count(), { timeout: 60_000 }).toBe(1);
    const method = page.getByLabel('Method statement');
    await method.fill(`${await method.inputValue()} Revised for the whole-flow test: the cavity is viewed at normal incidence.`);
    await page.getByRole('button', { name: 'Save draft' }).first().click();
    await expect.poll(() => page.getByText('All changes saved').count(), { timeout: 60_000 }).toBe(1);
    await shot('qm-new-version-saved');
    await page.getByRole('button', { name: 'Release…' }).click();
    const dialog = page.getByRole('dialog', { name: /Release version 2/ });
    await dialog.waitFor();
    expect(await dialog.textContent()).toMatch(/frozen/);
    await shot('qm-release-confirm', false);
    await dialog.getByRole('button', { name: 'Release and freeze' }).click();
    await expect.poll(() => page.getByText('Released: this version is frozen').count(), { timeout: 30_000 }).toBe(1);
    await shot('qm-released');
  }, 180_000);

  it('2. the analyst opens a job with three points, fills the budgets, runs Monte Carlo and submits', async () => {
    const { page } = browser;
    await signIn('analyst@emberline-demo.test');
    await page.goto(`${server.url}/app/jobs`);
    await page.getByRole('link', { name: 'New job' }).click();
    await fillNewJob(page, { item: 'Handheld infrared thermometer, Tallowmere Instruments (demo), HT-8, s/n TM8-20417', model: `${MODEL} — version 2` });
    await shot('analyst-new-job');
    await page.getByRole('button', { name: 'Open the job' }).click();
    const heading = page.getByRole('heading', { name: /EMB-\d{4}-\d{4}/ });
    await heading.waitFor();
    jobNumber = /EMB-\d{4}-\d{4}/.exec((await heading.textContent()) ?? '')![0];
    jobUrl = page.url().replace(/\?.*$/, '');
    await expect.poll(() => page.getByText(`${MODEL}, version 2`).count(), { timeout: 60_000 }).toBe(1);

    // Point 1, with the mouse.
    await page.getByLabel(/Nominal value/).fill(POINTS[0]!.nominal);
    await page.getByRole('button', { name: 'Add point' }).click();
    await page.getByRole('tab', { name: /^Point 1:/ }).waitFor();
    await readingsFromCsv(page, POINTS[0]!.csv);
    await standards(page);
    await page.getByLabel('mean of T_ref').fill('80');
    await saveAndCalculate(page);
    await shot('analyst-point-1-budget');
    await runMonteCarlo(page);
    await shot('analyst-point-1-histogram');

    // Point 2, with the keyboard alone: each control is reached by Tab or Enter from the one before
    // (focus() only puts the cursor where a user would start), values typed, buttons pressed.
    const nominal = page.getByLabel(/Nominal value/);
    await nominal.focus();
    await page.keyboard.type(POINTS[1]!.nominal);
    await page.keyboard.press('Enter');
    await page.getByRole('tab', { name: /^Point 2:/ }).waitFor();
    await expect.poll(() => page.getByRole('tab', { name: /^Point 2:/ }).getAttribute('aria-selected'), { timeout: 60_000 }).toBe('true');
    await page.locator('tr[data-input="T_ind"]').getByRole('button', { name: /readings/i }).focus();
    await page.keyboard.press('Enter');
    await page.getByLabel('Readings file').setInputFiles(path.resolve('tests/fixtures/readings', POINTS[1]!.csv));
    await page.getByRole('button', { name: 'Upload readings', exact: true }).focus();
    await page.keyboard.press('Enter');
    await expect.poll(() => page.getByTestId('typea-T_ind').textContent(), { timeout: 30_000 }).toMatch(/n = 10, mean = 150\.34.*ν = 9/);
    await page.locator('tr[data-input="T_ref"]').getByRole('button', { name: /reference standard/i }).focus();
    await page.keyboard.press('Enter');
    const prtUse = page.getByRole('group', { name: /Reference standard for T_ref/ }).locator('li', { hasText: 'PRT-A' }).first().getByRole('button', { name: 'Use', exact: true });
    await prtUse.focus();
    await page.keyboard.press('Enter');
    await page.locator('tr[data-input="T_ref"]').getByText(/PRT-A.*due/).waitFor();
    await page.locator('tr[data-input="eps_bb"]').getByRole('button', { name: /reference standard/i }).focus();
    await page.keyboard.press('Enter');
    await page.getByRole('group', { name: /Reference standard for eps_bb/ }).locator('li', { hasText: 'RB-900' }).filter({ hasText: 'emissivity' }).first().getByRole('button', { name: 'Use', exact: true }).focus();
    await page.keyboard.press('Enter');
    await page.locator('tr[data-input="eps_bb"]').getByText(/RB-900/).waitFor();
    // Spreadsheet keys in the budget: type the reference reading, Enter to the next row, Tab along it.
    const focused = () => page.evaluate(() => document.activeElement?.getAttribute('aria-label') ?? '');
    await page.getByLabel('mean of T_ref').focus();
    await page.keyboard.press('ControlOrMeta+A');
    await page.keyboard.type('150');
    await page.keyboard.press('Enter');
    await expect.poll(focused, { timeout: 60_000 }).toBe('centre of dT_unif');
    await page.keyboard.press('Tab');
    await expect.poll(focused, { timeout: 60_000 }).toBe('half-width a of dT_unif');
    await page.keyboard.press('ControlOrMeta+A');
    // Above 100 °C the cavity's uniformity is the larger term (invented demo figure), so U stays at or above the CMC.
    await page.keyboard.type('0.8');
    await page.keyboard.press('Enter');
    await expect.poll(focused, { timeout: 60_000 }).toMatch(/ of dT_stab$/);
    await shot('analyst-point-2-keyboard');
    // A button is reached only once the live budget has caught up with the typing (it is disabled
    // while the debounced recomputation is pending), as a user sees it enabled before pressing it.
    await focusWhenEnabled(page, 'Save and calculate');
    await page.keyboard.press('Enter');
    await page.getByText(/Saved and calculated/).waitFor();
    await focusWhenEnabled(page, 'Run Monte Carlo');
    await page.keyboard.press('Enter');
    await page.getByText(/Monte Carlo finished/).waitFor({ timeout: 180_000 });
    await page.getByRole('figure', { name: /Monte Carlo histogram/ }).locator('svg').first().waitFor();
    await shot('analyst-point-2-histogram');

    // Point 3, with the mouse.
    await page.getByLabel(/Nominal value/).fill(POINTS[2]!.nominal);
    await page.getByRole('button', { name: 'Add point' }).click();
    await page.getByRole('tab', { name: /^Point 3:/ }).waitFor();
    await expect.poll(() => page.getByRole('tab', { name: /^Point 3:/ }).getAttribute('aria-selected'), { timeout: 60_000 }).toBe('true');
    await readingsFromCsv(page, POINTS[2]!.csv);
    await standards(page);
    await page.getByLabel('mean of T_ref').fill('300');
    await page.getByLabel('half-width a of dT_unif').fill('0.8');
    await saveAndCalculate(page);
    await runMonteCarlo(page);
    await shot('analyst-point-3-histogram');

    await expect.poll(() => page.getByText('✓ Every check passes.').count(), { timeout: 30_000 }).toBe(1);
    await page.getByRole('button', { name: 'Submit for review' }).click();
    await page.getByText(/Submitted for review\./).waitFor();
    await shot('analyst-submitted');
  }, 600_000);

  it('3. the signatory sends it back with a comment; the analyst corrects and resubmits; the signatory approves', async () => {
    const { page } = browser;
    const comment = 'Point 3: the size-of-source half-width must be 0.3 K, as characterised for this cavity.';
    await signIn('signatory@emberline-demo.test');
    await page.goto(`${server.url}/app/review`);
    await page.getByRole('table', { name: /awaiting review/i }).getByRole('link', { name: jobNumber }).click();
    await page.getByRole('heading', { name: /what the certificate will say/i }).waitFor();
    await shot('signatory-review');
    await page.getByLabel('Comment for the analyst').fill(comment);
    await page.getByRole('button', { name: 'Send back with this comment' }).click();
    await page.getByText('Sent back to the analyst').waitFor();
    await shot('signatory-sent-back');

    await signIn('analyst@emberline-demo.test');
    await page.goto(jobUrl);
    await page.getByText(comment).waitFor();
    await openPoint(page, 3);
    await shot('analyst-sees-comment');
    const sse = page.locator('tr[data-symbol="dT_sse"]');
    const before = await sse.textContent();
    await page.getByLabel('half-width a of dT_sse').fill('0.3');
    await expect.poll(() => sse.textContent(), { timeout: 60_000 }).not.toBe(before);
    await saveAndCalculate(page);
    await runMonteCarlo(page);
    await expect.poll(() => page.getByText('✓ Every check passes.').count(), { timeout: 30_000 }).toBe(1);
    await page.getByRole('button', { name: 'Submit for review' }).click();
    await page.getByText(/Submitted for review\./).waitFor();
    await shot('analyst-resubmitted');

    await signIn('signatory@emberline-demo.test');
    await page.goto(`${server.url}/app/review`);
    await page.getByRole('table', { name: /awaiting review/i }).getByRole('link', { name: jobNumber }).click();
    await page.getByRole('heading', { name: /what the certificate will say/i }).waitFor();
    await page.getByLabel(/your password/i).fill(DEMO_PASSWORD);
    await shot('signatory-approve');
    await page.getByRole('button', { name: /approve and issue/i }).click();
    const issued = page.getByText(/^Certificate EMB-C-\d{4}-\d{4} issued$/);
    await issued.waitFor({ timeout: 120_000 });
    number = /EMB-C-\d{4}-\d{4}/.exec((await issued.textContent()) ?? '')![0];
    await shot('signatory-issued', false);
  }, 600_000);

  it('4. the contact’s mailbox holds the signed PDF; the customer downloads the same bytes from the portal', async () => {
    const { page } = browser;
    await signIn('admin@emberline-demo.test');
    await page.goto(`${server.url}/app/mail/mailbox`);
    const message = page.getByRole('listitem', { name: new RegExp(`${CONTACT.replace(/\./g, '\\.')}: Calibration certificate ${number}`) });
    // The mailbox page refreshes itself every 5 s; reloading it and counting at once raced its first fetch.
    await message.first().waitFor({ timeout: 90_000 });
    await shot('admin-mailbox', false);
    const [d] = await Promise.all([page.waitForEvent('download'), message.getByRole('link', { name: new RegExp(`${number}\\.pdf`) }).click()]);
    mailed = readFileSync(await d.path());
    expect(mailed.subarray(0, 5).toString('latin1')).toBe('%PDF-');

    await signIn('customer@emberline-demo.test');
    await page.goto(`${server.url}/app/my-certificates`);
    const link = page.getByRole('link', { name: `Download ${number}.pdf` });
    await link.waitFor();
    await shot('customer-portal');
    const [p] = await Promise.all([page.waitForEvent('download'), link.click()]);
    expect(sha256(readFileSync(await p.path()))).toBe(sha256(mailed));
  }, 180_000);

  it('5. the public verification page confirms the PDF', async () => {
    const { page, context } = browser;
    await context.clearCookies();
    await page.goto(`${server.url}/verify`);
    const file = path.join(server.dataDir, `${number}.pdf`);
    writeFileSync(file, mailed);
    await page.getByLabel(/certificate pdf file/i).setInputFiles(file);
    await page.getByText(/^Authentic: this is the file the laboratory issued$/).waitFor();
    await expect.poll(() => page.getByTestId('verify-status').first().textContent(), { timeout: 60_000 }).toBe('Current');
    await shot('public-verify-current');
  }, 60_000);

  it('6. an amendment, once reviewed and approved, supersedes the certificate in the portal and on the verification page', async () => {
    const { page } = browser;
    await signIn('quality@emberline-demo.test');
    await page.goto(`${server.url}/app/certificates`);
    const row = page.locator('tr', { has: page.getByRole('link', { name: `Download ${number}.pdf` }) });
    await row.getByRole('button', { name: 'Amend…' }).click();
    await row.getByLabel(/Reason for the amendment/).fill('The item’s serial number was printed without its suffix; corrected.');
    await shot('qm-amend');
    await row.getByRole('button', { name: 'Open the amendment' }).click();
    const opened = page.getByRole('status').getByText(/job (EMB-\d{4}-\d{4}(?:\S*)?) is a new draft revision/);
    await opened.waitFor();
    const revision = /job (\S+) is a new draft/.exec((await opened.textContent()) ?? '')![1]!;
    await shot('qm-amendment-opened');

    await signIn('analyst@emberline-demo.test');
    await page.goto(`${server.url}/app/jobs`);
    // The jobs list and the job page say which certificate the draft amends and why (§7.8.8).
    const revisionRow = page.locator('tr', { has: page.getByRole('link', { name: revision }) });
    await revisionRow.getByText(`Amends ${number}`).waitFor();
    // …and the original job's row names the draft that amends its certificate.
    await page.locator('tr', { has: page.getByRole('link', { name: jobNumber, exact: true }) }).getByText(`Being amended in ${revision}`).waitFor();
    await shot('analyst-jobs-amendment');
    // Searching for the draft's number also finds the job it amends, marked as such.
    await page.getByRole('searchbox', { name: 'Search' }).fill(revision);
    await expect.poll(() => page.getByRole('table', { name: 'Calibration jobs' }).locator('tbody tr').count(), { timeout: 30_000 }).toBe(2);
    await page.locator('tr', { has: page.getByRole('link', { name: jobNumber, exact: true }) }).getByText(`Being amended in ${revision}`).waitFor();
    await shot('analyst-jobs-search-amendment');
    // The original job's page names the draft that amends its certificate, with its status, and links to it.
    await page.goto(jobUrl);
    await page.getByRole('heading', { name: jobNumber }).waitFor();
    const amendedBy = page.locator('div', { has: page.getByText(`Certificate ${number} is being amended`, { exact: true }) }).last();
    await amendedBy.waitFor();
    await expect.poll(() => amendedBy.textContent()).toContain(`The amendment is prepared in job ${revision} Draft. Reason: The item’s serial number was printed without its suffix; corrected.`);
    // The issued job is closed: one line says so; its budgets and results stay, its controls go.
    await page.getByTestId('job-closed').getByText(/its points can no longer be changed/).waitFor();
    await page.getByRole('heading', { name: 'Stored result' }).waitFor();
    expect(await page.getByRole('heading', { name: 'Checks before review' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: /Run Monte Carlo|Save and calculate|Save budget/ }).count()).toBe(0);
    // …and its inputs and scope read as text, not as fields that cannot be used.
    const inputs = page.getByRole('region', { name: 'Input quantities' });
    await expect.poll(() => inputs.locator('tr[data-input="T_ref"] [data-parameter="expanded"]').textContent(), { timeout: 30_000 }).toMatch(/^U = \d+(\.\d+)?\u00a0°C$/);
    expect(await inputs.locator('input, select, textarea').count()).toBe(0);
    await page.getByTestId('scope-record').waitFor();
    await shot('analyst-original-being-amended');
    await amendedBy.getByRole('link', { name: revision }).click();
    await page.getByRole('heading', { name: revision }).waitFor();
    await page.getByText(`Amendment of certificate ${number}`).waitFor();
    await page.getByText(/Reason: The item’s serial number was printed without its suffix; corrected\./).waitFor();
    // The draft's notice links back to the job the amended certificate was issued from.
    expect(await page.getByRole('link', { name: jobNumber, exact: true }).getAttribute('href')).toBe(new URL(jobUrl).pathname);
    await expect.poll(() => page.getByText('✓ Every check passes.').count(), { timeout: 30_000 }).toBe(1);
    await shot('analyst-revision');
    await page.getByRole('button', { name: 'Submit for review' }).click();
    await page.getByText(/Submitted for review\./).waitFor();

    await signIn('signatory@emberline-demo.test');
    await page.goto(`${server.url}/app/review`);
    await page.getByRole('table', { name: /awaiting review/i }).getByRole('link', { name: revision }).click();
    await page.getByText(`Amendment of certificate ${number}`).waitFor();
    // The review names the job the amended certificate was issued from, with a link to it.
    expect(await page.getByRole('link', { name: jobNumber, exact: true }).getAttribute('href')).toBe(new URL(jobUrl).pathname);
    await shot('signatory-amendment-review-top', false);
    await page.getByLabel(/your password/i).fill(DEMO_PASSWORD);
    await shot('signatory-amendment-review');
    await page.getByRole('button', { name: /approve and issue/i }).click();
    const issued = page.getByText(/^Certificate EMB-C-\d{4}-\d{4} issued$/);
    await issued.waitFor({ timeout: 120_000 });
    const newNumber = /EMB-C-\d{4}-\d{4}/.exec((await issued.textContent()) ?? '')![0];
    expect(newNumber).not.toBe(number);
    // The original job now says its certificate was replaced, and by which.
    await page.goto(jobUrl);
    await page.getByRole('heading', { name: jobNumber }).waitFor();
    const amended = page.locator('div', { has: page.getByText(`Certificate ${number} was amended`, { exact: true }) }).last();
    await amended.getByText(`Certificate ${newNumber}, issued from that job, replaced ${number}, which is now marked superseded.`).waitFor();
    await shot('signatory-original-amended');

    await signIn('customer@emberline-demo.test');
    await page.goto(`${server.url}/app/my-certificates`);
    const oldRow = page.locator('tr', { has: page.getByRole('link', { name: `Download ${number}.pdf` }) });
    await expect.poll(() => oldRow.getByTestId('certificate-status').textContent(), { timeout: 60_000 }).toMatch(new RegExp(`^Superseded by ${newNumber}`));
    await expect.poll(() => page.locator('tr', { has: page.getByRole('link', { name: `Download ${newNumber}.pdf` }) }).getByTestId('certificate-status').textContent(), { timeout: 60_000 }).toBe('Current');
    await shot('customer-portal-superseded');

    await browser.context.clearCookies();
    await page.goto(`${server.url}/verify`);
    await page.getByLabel(/certificate pdf file/i).setInputFiles(path.join(server.dataDir, `${number}.pdf`));
    await page.getByText(/^Authentic: this is the file the laboratory issued$/).waitFor();
    await expect.poll(() => page.getByTestId('verify-status').first().textContent(), { timeout: 60_000 }).toBe(`Superseded by ${newNumber}`);
    await page.getByText(`use ${newNumber} instead`, { exact: false }).waitFor();
    await shot('public-verify-superseded');
  }, 600_000);

  it('made no request outside localhost, no request was refused, and nothing was logged as an error', () => {
    expect(browser.requests.filter((u) => !isLocal(u))).toEqual([]);
    // Signed out, the sign-in page asks only the public session check (200, null), never /api/me.
    expect(failed).toEqual([]);
    expect(browser.errors).toEqual([]);
  });
});
