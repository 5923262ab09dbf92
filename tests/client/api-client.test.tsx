import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { api, ApiError } from '../../src/lib/api-client';
import { json, mockFetch } from './render-app';

describe('api client', () => {
  it('sends the session cookie and JSON, and parses the answer with a schema', async () => {
    const fetch = mockFetch({ 'POST /api/things': (_u, init) => json(201, { id: 7, echo: JSON.parse(String(init?.body)) }) });
    const out = await api.post('/api/things', { a: 1 }, { schema: z.object({ id: z.number(), echo: z.object({ a: z.number() }) }) });
    expect(out).toEqual({ id: 7, echo: { a: 1 } });
    const init = fetch.mock.calls[0][1] as RequestInit;
    expect(init.credentials).toBe('include');
    expect((init.headers as Record<string, string>)['Content-Type']).toBe('application/json');
  });

  it('turns the error envelope into an ApiError with status, code, message and issues', async () => {
    mockFetch({
      'PUT /api/lab': () =>
        json(400, { error: { code: 'VALIDATION_FAILED', message: 'Check the fields.', issues: [{ path: ['name'], message: 'Enter the laboratory name.' }] } }),
    });
    const error = await api.put('/api/lab', {}).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({ status: 400, code: 'VALIDATION_FAILED', message: 'Check the fields.', issues: [{ path: ['name'], message: 'Enter the laboratory name.' }] });
  });

  it('gives a readable ApiError when the body is not an envelope', async () => {
    mockFetch({ '/api/x': () => new Response('<html>Bad gateway</html>', { status: 502, statusText: 'Bad Gateway' }) });
    const error = (await api.get('/api/x').catch((e: unknown) => e)) as ApiError;
    expect(error.status).toBe(502);
    expect(error.code).toBe('HTTP_502');
    expect(error.message).toMatch(/server could not complete/);
  });

  it('reports a network failure as status 0', async () => {
    mockFetch({ '/api/x': () => Promise.reject(new TypeError('Failed to fetch')) });
    const error = (await api.get('/api/x').catch((e: unknown) => e)) as ApiError;
    expect(error.status).toBe(0);
    expect(error.code).toBe('NETWORK_ERROR');
  });
});
