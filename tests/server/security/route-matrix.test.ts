/**
 * Route × role matrix (issue 8). The routes are enumerated by walking createApp's Express router
 * (./routes.ts: Express 5 keeps each layer's registered path in `layer.rawPath`, endpoints in
 * `layer.route`, mounted routers in `layer.handle.stack`), so the table cannot fall behind:
 * a route missing from ROUTE_MATRIX or a row with no route fails this test. Every route is then
 * called anonymously and as every demo role with placeholder ids and an empty body; 401 / 403 /
 * "let through" (anything else: 404, 400, 422, 2xx) must be exactly what the table says.
 * Sources: OWASP ASVS 4.0 V4.1.1, V4.1.3, V4.1.5; ISO/IEC 17025:2017 §6.2.5/§6.2.6 (authorised
 * personnel for each function).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES, type Role } from '../../../shared/schemas/roles';
import { createTestApp, type TestApp } from '../../setup/test-app';
import { callRoute } from './route-call';
import { ROUTE_MATRIX, type Access } from './route-matrix';
import { listRoutes, routeKey } from './routes';

type Who = Role | 'anonymous';
const guarded = (status: number) => status === 401 || status === 403;

function expected(access: Access, who: Who): 'through' | 401 | 403 {
  if (access === 'public') return 'through';
  if (who === 'anonymous') return 401;
  if (access === 'signed-in') return 'through';
  return access.includes(who) ? 'through' : 403;
}

let t: TestApp;
const agents = {} as Record<Who, ReturnType<TestApp['agent']>>;
beforeAll(async () => {
  t = await createTestApp();
  agents.anonymous = t.agent();
  for (const role of ROLES) agents[role] = await t.signIn(role);
}, 240_000);
afterAll(() => t?.close());

describe('route × role matrix', () => {
  it('lists every route of the app, and no route that does not exist', () => {
    const keys = listRoutes(t.app).map(routeKey);
    const missing = keys.filter((k) => !(k in ROUTE_MATRIX));
    const stale = Object.keys(ROUTE_MATRIX).filter((k) => !keys.includes(k));
    expect(missing, `routes without a row in tests/server/security/route-matrix.ts — add one saying who may call each:\n${missing.join('\n')}`).toEqual([]);
    expect(stale, `rows in tests/server/security/route-matrix.ts with no such route — remove or correct them:\n${stale.join('\n')}`).toEqual([]);
  });

  it('every route answers anonymous callers and each role exactly as the table says', async () => {
    const wrong: string[] = [];
    for (const route of listRoutes(t.app)) {
      const access = ROUTE_MATRIX[routeKey(route)];
      if (!access) continue; // reported by the test above
      for (const who of ['anonymous', ...ROLES] as Who[]) {
        const res = await callRoute(agents[who], route);
        const want = expected(access, who);
        const ok = want === 'through' ? !guarded(res.status) : res.status === want;
        if (!ok) wrong.push(`${routeKey(route)} as ${who}: expected ${want === 'through' ? 'not 401/403' : want}, got ${res.status}`);
        if (res.status >= 500) wrong.push(`${routeKey(route)} as ${who}: ${res.status} ${res.text.slice(0, 200)}`);
      }
    }
    expect(wrong).toEqual([]);
  }, 300_000);

  it('no API route is public by accident: the public ones are the ones meant to be', () => {
    const pub = Object.entries(ROUTE_MATRIX).filter(([, a]) => a === 'public').map(([k]) => k).sort();
    expect(pub).toEqual(
      [
        'ALL /api/auth/{*any}',
        'POST /api/auth/sign-in/email',
        'GET /api/health',
        'GET /api/lab',
        'GET /api/invitations/:token',
        'POST /api/invitations/accept',
        'POST /api/verify/file',
        'GET /api/verify/number/:number',
        'GET /{*any}',
      ].sort(),
    );
  });
});
