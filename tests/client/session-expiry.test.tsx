import { render, screen } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { AppProvider } from '../../src/app/provider';
import { api, ApiError } from '../../src/lib/api-client';
import { createQueryClient } from '../../src/lib/query-client';
import { json, meFor, mockFetch, unauthorized } from './render-app';

describe('session expiry', () => {
  it('a query answered 401 reports the ended session once and is not retried', async () => {
    const fetch = mockFetch({ 'GET /api/jobs': unauthorized });
    const onUnauthorized = vi.fn();
    const client = createQueryClient({ onUnauthorized });
    const error = await client.fetchQuery({ queryKey: ['jobs'], queryFn: () => api.get('/api/jobs') }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect(onUnauthorized).toHaveBeenCalledTimes(1);
    expect(fetch).toHaveBeenCalledTimes(1);
  });

  it('other errors do not end the session', async () => {
    mockFetch({ 'GET /api/jobs': () => json(403, { error: { code: 'FORBIDDEN', message: 'No.' } }) });
    const onUnauthorized = vi.fn();
    const client = createQueryClient({ onUnauthorized });
    await client.fetchQuery({ queryKey: ['jobs'], queryFn: () => api.get('/api/jobs') }).catch(() => undefined);
    expect(onUnauthorized).not.toHaveBeenCalled();
  });

  it('the real provider (browser router) opens the signed-in shell at the current address', async () => {
    mockFetch({ 'GET /api/me': () => json(200, meFor('analyst')) });
    window.history.replaceState(null, '', '/app/customers');
    render(<AppProvider />);
    expect(await screen.findByRole('heading', { level: 1, name: 'Customers' })).toBeTruthy();
  });

  it('the real provider sends a signed-out visitor from /app to sign-in', async () => {
    mockFetch({ 'GET /api/me': unauthorized });
    window.history.replaceState(null, '', '/app/customers');
    render(<AppProvider />);
    expect(await screen.findByRole('heading', { level: 1, name: 'Sign in' })).toBeTruthy();
    expect(window.location.pathname).toBe('/sign-in');
    expect(window.location.search).toBe(`?next=${encodeURIComponent('/app/customers')}`);
  });
});
