/**
 * Calls one listed route with placeholder parameters (a well-formed uuid that names no record,
 * or a harmless value for the few non-id parameters) and an empty JSON body, so that the answer
 * shows what the route's guard decided: 401, 403, or anything else (the request got past it —
 * 404, 400, 422 and 2xx all count as "let through").
 */
import type request from 'supertest';
import type { ListedRoute } from './routes';

export const DUMMY_ID = '00000000-0000-4000-8000-000000000000';
const DUMMY_PARAM: Record<string, string> = { token: 'no-such-token', symbol: 'T_ind', number: 'NO-SUCH-0001', index: '0', any: 'no-such-endpoint' };

export function concretePath(path: string): string {
  return path.replace(/\{\*(\w+)\}/g, (_m, name: string) => DUMMY_PARAM[name] ?? 'x').replace(/:(\w+)/g, (_m, name: string) => DUMMY_PARAM[name] ?? DUMMY_ID);
}

type Agent = InstanceType<typeof request.agent> | ReturnType<typeof request>;

export function callRoute(agent: Agent, route: ListedRoute): Promise<request.Response> {
  const url = concretePath(route.path);
  const method = route.method === 'ALL' ? 'get' : (route.method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete');
  const req = (agent as unknown as Record<string, (u: string) => request.Test>)[method](url);
  return method === 'get' || method === 'delete' ? req : req.set('Content-Type', 'application/json').send('{}');
}
