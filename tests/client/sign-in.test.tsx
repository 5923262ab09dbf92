import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import { json, meFor, mockFetch, renderApp, unauthorized } from './render-app';

async function openSignIn() {
  renderApp('/sign-in');
  return screen.findByRole('heading', { level: 1, name: 'Sign in' });
}

describe('sign-in page', () => {
  it('labels both fields', async () => {
    mockFetch({});
    await openSignIn();
    expect(screen.getByLabelText('E-mail address').getAttribute('type')).toBe('email');
    expect(screen.getByLabelText('Password').getAttribute('type')).toBe('password');
  });

  it('when submitted empty, then says what is missing next to each field', async () => {
    const fetch = mockFetch({});
    await openSignIn();
    await userEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByText('Enter your e-mail address.')).toBeTruthy();
    expect(screen.getByText('Enter your password.')).toBeTruthy();
    const email = screen.getByLabelText('E-mail address');
    expect(email.getAttribute('aria-invalid')).toBe('true');
    expect(email.getAttribute('aria-describedby')).toContain('error');
    const urls = fetch.mock.calls.map(([input]) => String(input instanceof Request ? input.url : input));
    expect(urls.some((u) => u.includes('/api/auth/sign-in'))).toBe(false);
  });

  it('when the e-mail address is malformed, then asks for a real one', async () => {
    mockFetch({});
    await openSignIn();
    await userEvent.type(screen.getByLabelText('E-mail address'), 'not-an-address');
    await userEvent.type(screen.getByLabelText('Password'), 'secret');
    await userEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByText('Enter an e-mail address such as name@example.org.')).toBeTruthy();
  });

  it('when the server refuses the credentials, then shows a clear alert and stays on the page', async () => {
    mockFetch({
      'POST /api/auth/sign-in/email': () => json(401, { code: 'INVALID_EMAIL_OR_PASSWORD', message: 'Invalid email or password' }),
    });
    await openSignIn();
    await userEvent.type(screen.getByLabelText('E-mail address'), 'ada@example.test');
    await userEvent.type(screen.getByLabelText('Password'), 'wrong');
    await userEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    const alert = await screen.findByRole('alert');
    expect(alert.textContent).toContain('Not signed in');
    expect(alert.textContent).toContain('That e-mail address and password do not match an account');
    expect(screen.getByRole('heading', { level: 1, name: 'Sign in' })).toBeTruthy();
  });

  it('when the server cannot be reached, then says so', async () => {
    mockFetch({ 'POST /api/auth/sign-in/email': () => Promise.reject(new TypeError('Failed to fetch')) });
    await openSignIn();
    await userEvent.type(screen.getByLabelText('E-mail address'), 'ada@example.test');
    await userEvent.type(screen.getByLabelText('Password'), 'pw');
    await userEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    expect((await screen.findByRole('alert')).textContent).toMatch(/could not be reached|failed on the server/);
  });

  it('when the credentials are right, then opens the role’s start page', async () => {
    let signedIn = false;
    mockFetch({
      'POST /api/auth/sign-in/email': (_url, init) => {
        const body = JSON.parse(String(init?.body));
        expect(body).toMatchObject({ email: 'ada@example.test', password: 'correct horse' });
        signedIn = true;
        return json(200, { redirect: false, token: 't', user: { id: 'u1', email: 'ada@example.test', name: 'Ada Demo' } });
      },
      'GET /api/me': () => (signedIn ? json(200, meFor('signatory')) : unauthorized()),
    });
    const { router } = renderApp('/sign-in');
    await screen.findByRole('heading', { level: 1, name: 'Sign in' });
    await userEvent.type(screen.getByLabelText('E-mail address'), 'ada@example.test');
    await userEvent.type(screen.getByLabelText('Password'), 'correct horse');
    await userEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByRole('heading', { level: 1, name: 'Awaiting review' })).toBeTruthy();
    expect(router.state.location.pathname).toBe('/app/review');
  });

  it('returns to the page asked for when the role may open it', async () => {
    let signedIn = false;
    mockFetch({
      'POST /api/auth/sign-in/email': () => {
        signedIn = true;
        return json(200, { redirect: false, token: 't', user: { id: 'u1' } });
      },
      'GET /api/me': () => (signedIn ? json(200, meFor('analyst')) : unauthorized()),
    });
    const { router } = renderApp('/app/customers');
    await waitFor(() => expect(router.state.location.pathname).toBe('/sign-in'));
    await userEvent.type(await screen.findByLabelText('E-mail address'), 'ada@example.test');
    await userEvent.type(screen.getByLabelText('Password'), 'pw');
    await userEvent.click(screen.getByRole('button', { name: 'Sign in' }));
    await waitFor(() => expect(router.state.location.pathname).toBe('/app/customers'));
  });
});
