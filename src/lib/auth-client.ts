/**
 * better-auth's browser client. The server mounts better-auth at /api/auth/* on the same origin,
 * so the base URL is the page's own origin and the session cookie travels with every request.
 */
import { createAuthClient } from 'better-auth/react';

export const authClient = createAuthClient({
  baseURL: typeof window === 'undefined' ? 'http://localhost:3000' : window.location.origin,
  basePath: '/api/auth',
  // Resolve fetch at call time (better-auth otherwise keeps the one present at start-up), so
  // tests can stub it and every request goes through the same global fetch as the API client.
  fetchOptions: { customFetchImpl: (input, init) => globalThis.fetch(input, init) },
});
