import { screen, within } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { CAUTIONS } from '../../src/components/ui/cautions';
import { json, meFor, mockFetch, renderApp, unauthorized } from './render-app';

describe('public pages', () => {
  it('the landing page says what the product does and shows the three cautions', async () => {
    mockFetch({});
    renderApp('/');
    const h1 = await screen.findByRole('heading', { level: 1 });
    expect(h1.textContent).toMatch(/signed calibration certificate/);
    const main = screen.getByRole('main');
    expect(main.textContent).toMatch(/GUM \(JCGM 100\)/);
    expect(main.textContent).toMatch(/Monte Carlo propagation \(JCGM 101\)/);
    expect(main.textContent).toMatch(/authorised signatory/);
    const cautions = screen.getByRole('region', { name: 'Please note' });
    for (const c of CAUTIONS) expect(cautions.textContent).toContain(c);
    expect(within(screen.getByRole('navigation', { name: 'Public pages' })).getByRole('link', { name: 'Sign in' })).toBeTruthy();
  });

  it('the verification page explains the check', async () => {
    mockFetch({});
    renderApp('/verify');
    expect(await screen.findByRole('heading', { level: 1, name: 'Check a calibration certificate' })).toBeTruthy();
  });
});

describe('not-found page', () => {
  it('answers an unknown public address with a 404 page and a way back', async () => {
    mockFetch({});
    renderApp('/no/such/page');
    expect(await screen.findByRole('heading', { level: 1, name: 'Page not found' })).toBeTruthy();
    expect(screen.getByText('/no/such/page')).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Go to the start page' }).getAttribute('href')).toBe('/');
  });

  it('inside /app keeps the shell around the 404', async () => {
    mockFetch({ 'GET /api/me': () => json(200, meFor('analyst')) });
    renderApp('/app/nothing-here');
    expect(await screen.findByRole('heading', { level: 1, name: 'Page not found' })).toBeTruthy();
    expect(screen.getByRole('navigation', { name: 'Sections' })).toBeTruthy();
  });
});

describe('error boundary', () => {
  it('when /api/me fails on the server, then shows what went wrong with a way out', async () => {
    mockFetch({ 'GET /api/me': () => json(500, { error: { code: 'INTERNAL', message: 'Database unavailable.' } }) });
    renderApp('/app/jobs');
    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain('The server reported a problem');
    expect(alert.textContent).toContain('Database unavailable.');
    expect(screen.getByRole('button', { name: 'Reload the page' })).toBeTruthy();
  });
});

describe('page titles', () => {
  it('each page names itself in the document title', async () => {
    mockFetch({ 'GET /api/me': () => json(200, meFor('signatory')) });
    renderApp('/app/certificates');
    await screen.findByRole('heading', { level: 1, name: 'Issued certificates' });
    expect(document.title).toBe('Issued certificates · Emberline');
  });
});

describe('sign-in page when already signed in', () => {
  it('goes straight to the role’s start page', async () => {
    mockFetch({
      'GET /api/auth/get-session': () => json(200, { session: { id: 's1' }, user: { id: 'u1' } }),
      'GET /api/me': () => json(200, meFor('customer')),
    });
    const { router } = renderApp('/sign-in');
    expect(await screen.findByRole('heading', { level: 1, name: 'My certificates' })).toBeTruthy();
    expect(router.state.location.pathname).toBe('/app/my-certificates');
  });
});

describe('sign-in page when signed out', () => {
  it('asks the public session check only, so no refused request shows in the browser console', async () => {
    const spy = mockFetch({ 'GET /api/auth/get-session': () => json(200, null), 'GET /api/me': () => unauthorized() });
    renderApp('/sign-in');
    expect(await screen.findByRole('button', { name: /sign in/i })).toBeTruthy();
    const asked = spy.mock.calls.map(([input]) => new URL(typeof input === 'string' ? input : input instanceof URL ? input.href : input.url, 'http://localhost:3000').pathname);
    expect(asked).toContain('/api/auth/get-session');
    expect(asked).not.toContain('/api/me');
  });
});

describe('first load', () => {
  it('while the first page’s loaders run, says it is loading instead of a blank page (and React Router does not warn)', async () => {
    const warn = vi.spyOn(console, 'warn');
    let answer: (r: Response) => void = () => {};
    mockFetch({ 'GET /api/me': () => new Promise<Response>((resolve) => { answer = resolve; }) });
    renderApp('/app/certificates');
    expect((await screen.findByRole('status')).textContent).toBe('Loading Emberline…');
    answer(json(200, meFor('signatory')));
    expect(await screen.findByRole('heading', { level: 1, name: 'Issued certificates' })).toBeTruthy();
    expect(warn.mock.calls.flat().join(' ')).not.toMatch(/HydrateFallback/);
    warn.mockRestore();
  });
});
