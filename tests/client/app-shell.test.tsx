import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import type { Role } from '../../shared/schemas/roles';
import { DEMO_LAB, json, meFor, mockFetch, renderApp, unauthorized } from './render-app';

const EXPECTED: Record<Role, { home: string; heading: string; links: string[] }> = {
  admin: { home: '/app/users', heading: 'Users and roles', links: ['Users and roles', 'Laboratory details', 'Audit log', 'E-mail log'] },
  quality_manager: {
    home: '/app/templates',
    heading: 'Measurement models',
    links: ['Measurement models', 'Reference standards', 'Customers', 'Issued certificates', 'Audit log', 'E-mail log'],
  },
  analyst: { home: '/app/jobs', heading: 'Calibration jobs', links: ['Calibration jobs', 'Reference standards, view only', 'Customers, view only'] },
  signatory: { home: '/app/review', heading: 'Awaiting review', links: ['Awaiting review', 'Issued certificates'] },
  customer: { home: '/app/my-certificates', heading: 'My certificates', links: ['My certificates'] },
};

const navLinks = () =>
  within(screen.getByRole('navigation', { name: 'Sections' }))
    .getAllByRole('link')
    .map((a) => a.textContent?.replace(/\s+/g, ' ').trim());

describe('app shell', () => {
  for (const role of Object.keys(EXPECTED) as Role[]) {
    it(`shows the ${role} navigation and lands on its start page`, async () => {
      mockFetch({ 'GET /api/me': () => json(200, meFor(role)) });
      const { router } = renderApp('/app');
      const expected = EXPECTED[role];
      expect(await screen.findByRole('heading', { level: 1, name: expected.heading })).toBeTruthy();
      expect(router.state.location.pathname).toBe(expected.home);
      expect(navLinks()).toEqual(expected.links);
      const current = within(screen.getByRole('navigation', { name: 'Sections' })).getAllByRole('link').find((a) => a.getAttribute('aria-current') === 'page');
      expect(current?.textContent).toContain(expected.heading);
      expect(screen.getByText(DEMO_LAB.name)).toBeTruthy();
      expect(screen.getByRole('main')).toBeTruthy();
      expect(screen.getByRole('banner')).toBeTruthy();
    });
  }

  it('when signed out, then /app sends the visitor to sign in', async () => {
    mockFetch({ 'GET /api/me': unauthorized });
    const { router } = renderApp('/app/jobs');
    await waitFor(() => expect(router.state.location.pathname).toBe('/sign-in'));
    expect(router.state.location.search).toBe(`?next=${encodeURIComponent('/app/jobs')}`);
    expect(await screen.findByRole('heading', { level: 1, name: 'Sign in' })).toBeTruthy();
  });

  it('when a role opens another role’s section, then says it is not available', async () => {
    mockFetch({ 'GET /api/me': () => json(200, meFor('customer')) });
    renderApp('/app/users');
    expect(await screen.findByRole('heading', { level: 1, name: 'Not available to your role' })).toBeTruthy();
  });

  it('shows an empty state that says what the section will list', async () => {
    mockFetch({
      'GET /api/me': () => json(200, meFor('analyst')),
      'GET /api/jobs': () => json(200, { jobs: [], total: 0, page: 1, pageSize: 25 }),
      'GET /api/customers': () => json(200, { customers: [] }),
    });
    renderApp('/app/jobs');
    const empty = await screen.findByRole('region', { name: 'No calibration jobs listed' });
    expect(empty.textContent).toMatch(/customer, item, model version/);
  });

  it('an analyst moves between the jobs list and the customers page both ways (they share one customer list)', async () => {
    const customer = { id: 'c1', organisation: 'Fernhill Optics (demo)', address: '', contactCount: 1, itemCount: 2 };
    mockFetch({
      'GET /api/me': () => json(200, meFor('analyst')),
      'GET /api/jobs': () => json(200, { jobs: [], total: 0, page: 1, pageSize: 25 }),
      'GET /api/customers': () => json(200, { customers: [customer] }),
    });
    renderApp('/app/jobs');
    await screen.findByRole('heading', { level: 1, name: 'Calibration jobs' });
    expect(await screen.findByRole('option', { name: customer.organisation })).toBeTruthy();
    const nav = within(screen.getByRole('navigation', { name: 'Sections' }));
    await userEvent.click(nav.getByRole('link', { name: /^Customers/ }));
    await screen.findByRole('heading', { level: 1, name: 'Customers' });
    expect(await screen.findByRole('link', { name: customer.organisation })).toBeTruthy();
    await userEvent.click(nav.getByRole('link', { name: 'Calibration jobs' }));
    await screen.findByRole('heading', { level: 1, name: 'Calibration jobs' });
    expect(await screen.findByRole('option', { name: customer.organisation })).toBeTruthy();
  });

  it('shows the laboratory details to the admin', async () => {
    mockFetch({ 'GET /api/me': () => json(200, meFor('admin')) });
    renderApp('/app/lab');
    const section = await screen.findByRole('region', { name: 'As printed on certificates' });
    expect(section.textContent).toContain(DEMO_LAB.accreditationNumber);
  });

  it('an account without a role sees why there is nothing to open', async () => {
    mockFetch({ 'GET /api/me': () => json(200, meFor(null)) });
    renderApp('/app');
    expect(await screen.findByRole('heading', { level: 1, name: 'Your account has no role yet' })).toBeTruthy();
  });

  it('the user menu shows the person and signs out', async () => {
    let signedIn = true;
    const fetch = mockFetch({
      'GET /api/me': () => (signedIn ? json(200, meFor('quality_manager')) : unauthorized()),
      'POST /api/auth/sign-out': () => {
        signedIn = false;
        return json(200, { success: true });
      },
    });
    const { router } = renderApp('/app/templates');
    const button = await screen.findByRole('button', { name: /Ada Demo/ });
    expect(button.getAttribute('aria-expanded')).toBe('false');
    await userEvent.click(button);
    expect(button.getAttribute('aria-expanded')).toBe('true');
    expect(screen.getByText('Role: Quality manager')).toBeTruthy();
    await userEvent.keyboard('{Escape}');
    expect(button.getAttribute('aria-expanded')).toBe('false');
    await userEvent.click(button);
    await userEvent.click(screen.getByRole('button', { name: 'Sign out' }));
    await waitFor(() => expect(router.state.location.pathname).toBe('/sign-in'));
    expect(fetch.mock.calls.some(([input]) => String(input instanceof Request ? input.url : input).includes('/api/auth/sign-out'))).toBe(true);
  });
});
