import { QueryCache, QueryClient } from '@tanstack/react-query';
import { ApiError } from './api-client';

/** Client errors (4xx) are answers, not hiccups: retrying them only delays the message. */
function shouldRetry(failureCount: number, error: unknown): boolean {
  if (error instanceof ApiError && error.status >= 400 && error.status < 500) return false;
  return failureCount < 2;
}

export interface QueryClientHooks {
  /** A query answered 401: the session has ended (expired, or signed out in another tab). */
  onUnauthorized?: () => void;
}

export function createQueryClient(hooks: QueryClientHooks = {}): QueryClient {
  return new QueryClient({
    queryCache: new QueryCache({
      onError: (error) => {
        if (error instanceof ApiError && error.status === 401) hooks.onUnauthorized?.();
      },
    }),
    defaultOptions: {
      queries: { staleTime: 30_000, retry: shouldRetry, refetchOnWindowFocus: false },
      mutations: { retry: false },
    },
  });
}
