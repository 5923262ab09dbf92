/** Renders the real route table in a memory router with a mocked fetch. */
import { QueryClientProvider } from '@tanstack/react-query';
import { render } from '@testing-library/react';
import { createMemoryRouter, RouterProvider, type RouteObject } from 'react-router';
import { vi } from 'vitest';
import { createRoutes } from '../../src/app/router';
import { createQueryClient } from '../../src/lib/query-client';
import type { Me } from '../../shared/schemas/me.schema';
import type { Role } from '../../shared/schemas/roles';

/**
 * The router loads each page's module when the page is first opened (src/app/router.tsx, lazy
 * routes). Importing a page with the engine, KaTeX or recharts takes a second or more in this
 * environment, longer than a findBy waits, so every page is loaded here once, when a test file
 * imports this helper, as the static imports used to do; the router still takes each page through
 * its lazy route, which then resolves at once.
 */
async function loadPages(routes: RouteObject[]): Promise<void> {
  const loads: Array<Promise<unknown>> = [];
  const visit = (list: RouteObject[]) => {
    for (const route of list) {
      const lazy = route.lazy;
      if (lazy && typeof lazy === 'object') for (const load of Object.values(lazy)) if (typeof load === 'function') loads.push((load as () => Promise<unknown>)());
      if (route.children) visit(route.children);
    }
  };
  visit(routes);
  await Promise.all(loads);
}
await loadPages(createRoutes(createQueryClient()));

export const DEMO_LAB = { name: 'Harrowgate Radiometry Laboratory (demo)', address: '12 Kiln Lane, Demo Town', accreditationNumber: 'DEMO-0421' };

export function meFor(role: Role | null): Me {
  return {
    user: { id: 'u1', name: 'Ada Demo', email: 'ada@example.test', role, customerId: role === 'customer' ? 'c1' : null },
    lab: DEMO_LAB,
  };
}

export const json = (status: number, body: unknown) =>
  new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });

export const unauthorized = () => json(401, { error: { code: 'UNAUTHORIZED', message: 'Sign in first.' } });

type Handler = (url: URL, init: RequestInit | undefined) => Response | Promise<Response>;

/** Stubs global fetch; unknown URLs answer 404 in the envelope. Returns the spy. */
export function mockFetch(routes: Record<string, Handler>) {
  const spy = vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const raw = typeof input === 'string' ? input : input instanceof URL ? input.href : input.url;
    const url = new URL(raw, 'http://localhost:3000');
    const method = (init?.method ?? (input instanceof Request ? input.method : 'GET')).toUpperCase();
    const handler = routes[`${method} ${url.pathname}`] ?? routes[url.pathname];
    if (handler) return handler(url, init);
    return json(404, { error: { code: 'NOT_FOUND', message: `No mock for ${method} ${url.pathname}` } });
  });
  vi.stubGlobal('fetch', spy);
  return spy;
}

export function renderApp(path: string) {
  const queryClient = createQueryClient();
  queryClient.setDefaultOptions({ queries: { retry: false, staleTime: Infinity } });
  const router = createMemoryRouter(createRoutes(queryClient), { initialEntries: [path] });
  const utils = render(
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  return { ...utils, router, queryClient };
}
