/**
 * Hostile request bodies (issue 8), property-based with fast-check: every POST, PUT and PATCH
 * route of the API (found by walking the router, so a new route is fuzzed without being listed
 * here) gets random JSON — arbitrary values, objects with the field names the API uses holding
 * values of the wrong type, size or shape, and malformed JSON text — from a role its guard lets
 * through. The server refuses with a 4xx in the error envelope (zod validation) or accepts;
 * it never answers 500 and never logs an unhandled error.
 * Sources: OWASP ASVS 4.0 V5.1.1–V5.1.4 (input validation, positive allow-lists, structured data
 * validated against a schema), V7.4.1 (a generic message on unexpected errors).
 */
import fc from 'fast-check';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { apiErrorSchema } from '../../../shared/schemas/api-error.schema';
import { ROLES, type Role } from '../../../shared/schemas/roles';
import { createTestApp, type TestApp } from '../../setup/test-app';
import { listRoutes } from './routes';

type Agent = ReturnType<TestApp['agent']>;

const DUMMY: Record<string, string> = { token: 'no-such-token', symbol: 'x1', number: 'NO-SUCH-0001', index: '0' };
const DUMMY_ID = '00000000-0000-4000-8000-000000000000';
const fill = (path: string) => path.replace(/:(\w+)/g, (_m, name: string) => DUMMY[name] ?? DUMMY_ID);

/** Field names the API's bodies use, so that random objects reach the schemas' inner checks. */
const FIELDS = [
  'name', 'email', 'password', 'role', 'customerId', 'organisation', 'address', 'receivesCertificates', 'description', 'maker', 'model', 'serialNumber', 'notes',
  'accreditationNumber', 'contactEmail', 'contactPhone', 'title', 'document', 'equations', 'inputs', 'measurand', 'constants', 'correlations', 'coverage', 'monteCarlo',
  'values', 'unit', 'standardId', 'templateVersionId', 'itemId', 'jobId', 'points', 'label', 'reason', 'comment', 'token', 'nominal', 'budget', 'settings', 'dueDate',
  'certifiedValues', 'certificateNumber', 'issuedAt', 'validUntil', '__proto__', 'constructor',
];
const hostileValue = fc.oneof(
  fc.jsonValue({ maxDepth: 3 }),
  fc.constantFrom('', ' ', 'x'.repeat(5000), '<script>alert(1)</script>', "'; drop table customers; --", '=HYPERLINK("http://example.com")', '../../etc/passwd', '\u0000', '1e400', 'NaN', '-1', DUMMY_ID, 'admin'),
  fc.constantFrom(Number.MAX_SAFE_INTEGER, -1, 0, 1e308, -0, 2 ** 53 + 1),
  fc.array(fc.string(), { maxLength: 5 }),
);
const hostileBody = fc.oneof(
  fc.jsonValue({ maxDepth: 4 }),
  fc.dictionary(fc.constantFrom(...FIELDS), hostileValue, { maxKeys: 8 }),
  fc.array(fc.dictionary(fc.constantFrom(...FIELDS), hostileValue, { maxKeys: 4 }), { maxLength: 3 }),
);

function expectRefusedOrAccepted(res: request.Response, what: string) {
  expect(res.status, `${what} answered ${res.status}: ${JSON.stringify(res.body).slice(0, 400)}`).toBeLessThan(500);
  if (res.status >= 400 && res.type === 'application/json') {
    expect(apiErrorSchema.safeParse(res.body).success, `${what}: not the error envelope: ${JSON.stringify(res.body).slice(0, 300)}`).toBe(true);
  }
}

describe('random JSON bodies on every POST, PUT and PATCH route', () => {
  let t: TestApp;
  const agents = {} as Record<Role, Agent>;
  beforeAll(async () => {
    t = await createTestApp();
    for (const role of ROLES) agents[role] = await t.signIn(role);
  });
  afterAll(() => t?.close());

  it('when the bodies are random, then no route answers 500 or leaves the error envelope', async () => {
    const routes = listRoutes(t.app).filter((r) => ['POST', 'PUT', 'PATCH'].includes(r.method) && r.path.startsWith('/api/') && !r.path.startsWith('/api/auth/'));
    expect(routes.length).toBeGreaterThan(10);
    for (const route of routes) {
      const url = fill(route.path);
      const method = route.method.toLowerCase() as 'post' | 'put' | 'patch';
      // The roles the guard lets through (a 401/403 would never reach the body's validation).
      const through: Array<Agent> = [];
      for (const role of ROLES) {
        const res = await agents[role][method](url).send({});
        expectRefusedOrAccepted(res, `${route.method} ${route.path} as ${role} with {}`);
        if (res.status !== 401 && res.status !== 403) through.push(agents[role]);
      }
      if (through.length === 0) through.push(t.agent());
      await fc.assert(
        fc.asyncProperty(hostileBody, fc.nat({ max: through.length - 1 }), async (body, i) => {
          const res = await through[i][method](url).set('Content-Type', 'application/json').send(JSON.stringify(body));
          expectRefusedOrAccepted(res, `${route.method} ${route.path} with ${JSON.stringify(body).slice(0, 200)}`);
        }),
        { numRuns: 25, seed: 8_2026_21 },
      );
      const malformed = await through[0][method](url).set('Content-Type', 'application/json').send('{"name": "unterminated');
      expectRefusedOrAccepted(malformed, `${route.method} ${route.path} with malformed JSON`);
    }
    expect(t.logs.filter((l) => l.level === 'error')).toEqual([]);
  }, 600_000);

  it('when the JSON body is over the size limit, then 413 in the envelope', async () => {
    const res = await agents.admin.put('/api/lab').set('Content-Type', 'application/json').send(`{"name":"${'x'.repeat(6 * 1024 * 1024)}"}`);
    expect(res.status).toBe(413);
    expect(apiErrorSchema.parse(res.body).error.code).toBe('PAYLOAD_TOO_LARGE');
  });

  it('when a body is malformed JSON, then 400 MALFORMED_JSON', async () => {
    const res = await request(t.app).post('/api/customers').set('Origin', t.origin).set('Content-Type', 'application/json').send('{');
    // The guard may answer first (no session): either way the envelope, never a 500.
    expectRefusedOrAccepted(res, 'POST /api/customers with "{"');
    const signedIn = await agents.quality_manager.post('/api/customers').set('Content-Type', 'application/json').send('{');
    expect(signedIn.status).toBe(400);
    expect(signedIn.body.error.code).toBe('MALFORMED_JSON');
  });
});
