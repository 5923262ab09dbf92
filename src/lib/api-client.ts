/**
 * The one way the client talks to the API: same-origin fetch with the session cookie, JSON in
 * and out, and every failure turned into an {@link ApiError} read from the server's envelope
 * `{ error: { code, message, issues? } }` (shared/schemas/api-error.schema.ts).
 */
import type { z } from 'zod';
import { apiErrorSchema, type ApiIssue } from '../../shared/schemas/api-error.schema';

export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly issues: ApiIssue[];

  constructor(status: number, code: string, message: string, issues: ApiIssue[] = []) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.issues = issues;
  }
}

/** Status 0: the request never got an answer (server down, network lost). */
export const NETWORK_ERROR_CODE = 'NETWORK_ERROR';

export interface RequestOptions<T> {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  body?: unknown;
  /** Parses (and types) the response body; without it the body is returned as unknown. */
  schema?: z.ZodType<T>;
  signal?: AbortSignal;
  headers?: Record<string, string>;
}

async function readBody(response: Response): Promise<unknown> {
  const text = await response.text();
  if (text === '') return null;
  try {
    return JSON.parse(text);
  } catch {
    return text;
  }
}

function toApiError(status: number, statusText: string, body: unknown): ApiError {
  const parsed = apiErrorSchema.safeParse(body);
  if (parsed.success) {
    const { code, message, issues } = parsed.data.error;
    return new ApiError(status, code, message, issues ?? []);
  }
  const fallback = status >= 500 ? 'The server could not complete the request. Try again in a moment.' : statusText || `Request failed (${status})`;
  return new ApiError(status, `HTTP_${status}`, fallback);
}

export async function apiRequest<T = unknown>(path: string, options: RequestOptions<T> = {}): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json', ...options.headers };
  let body: BodyInit | undefined;
  if (options.body !== undefined) {
    headers['Content-Type'] = 'application/json';
    body = JSON.stringify(options.body);
  }
  let response: Response;
  try {
    response = await fetch(path, {
      method: options.method ?? 'GET',
      credentials: 'include',
      headers,
      body,
      signal: options.signal,
    });
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    throw new ApiError(0, NETWORK_ERROR_CODE, 'The server could not be reached. Check the connection and try again.');
  }
  const data = await readBody(response);
  if (!response.ok) throw toApiError(response.status, response.statusText, data);
  return options.schema ? options.schema.parse(data) : (data as T);
}

export const api = {
  get: <T>(path: string, options?: Omit<RequestOptions<T>, 'method' | 'body'>) => apiRequest<T>(path, { ...options, method: 'GET' }),
  post: <T>(path: string, body?: unknown, options?: Omit<RequestOptions<T>, 'method' | 'body'>) => apiRequest<T>(path, { ...options, method: 'POST', body }),
  put: <T>(path: string, body?: unknown, options?: Omit<RequestOptions<T>, 'method' | 'body'>) => apiRequest<T>(path, { ...options, method: 'PUT', body }),
  patch: <T>(path: string, body?: unknown, options?: Omit<RequestOptions<T>, 'method' | 'body'>) => apiRequest<T>(path, { ...options, method: 'PATCH', body }),
  delete: <T>(path: string, options?: Omit<RequestOptions<T>, 'method' | 'body'>) => apiRequest<T>(path, { ...options, method: 'DELETE' }),
};
