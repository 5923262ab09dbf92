import express from 'express';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { EngineError } from '../../shared/engine/errors';
import { apiErrorSchema } from '../../shared/schemas/api-error.schema';
import { AppError, ConflictError, ForbiddenError, NotFoundError, UnauthorizedError } from '../../server/errors/app-error';
import { apiNotFound, errorHandler } from '../../server/middleware/error-handler';
import { validate } from '../../server/middleware/validate';
import type { LogEntry } from '../setup/test-app';

function appThrowing(err: unknown) {
  const logs: LogEntry[] = [];
  const app = express();
  app.use(express.json());
  app.get('/boom', () => {
    throw err;
  });
  app.use(apiNotFound);
  app.use(errorHandler({ info: () => {}, warn: () => {}, error: (message, data) => logs.push({ level: 'error', message, data }) }));
  return { app, logs };
}

describe('error handler: one envelope for every failure', () => {
  it.each([
    [new NotFoundError('No job 7.'), 404, 'NOT_FOUND'],
    [new ForbiddenError(), 403, 'FORBIDDEN'],
    [new UnauthorizedError(), 401, 'UNAUTHORIZED'],
    [new ConflictError('Already released.', 'TEMPLATE_RELEASED'), 409, 'TEMPLATE_RELEASED'],
    [new AppError(418, 'TEAPOT', 'Short and stout.'), 418, 'TEAPOT'],
  ])('when a route throws %s, then its status and code', async (err, status, code) => {
    const res = await request(appThrowing(err).app).get('/boom').expect(status);
    expect(apiErrorSchema.parse(res.body).error).toEqual({ code, message: (err as Error).message });
  });

  it('when a ZodError escapes, then 400 with issues [{ path, message }]', async () => {
    const parsed = z.object({ a: z.number() }).safeParse({ a: 'x' });
    const res = await request(appThrowing(parsed.error).app).get('/boom').expect(400);
    expect(res.body.error.code).toBe('VALIDATION_FAILED');
    expect(res.body.error.issues).toEqual([{ path: ['a'], message: expect.any(String) }]);
  });

  it('when the engine refuses a model, then 422 with its code and where', async () => {
    const err = new EngineError('UNKNOWN_SYMBOL', 'Unknown symbol "Tx".', { equation: 1, position: 4 });
    const res = await request(appThrowing(err).app).get('/boom').expect(422);
    expect(res.body.error).toEqual({
      code: 'UNKNOWN_SYMBOL',
      message: 'Unknown symbol "Tx".',
      issues: [{ path: ['equations', 1], message: 'Unknown symbol "Tx". (at character 5)' }],
    });
  });

  it('when something unexpected fails, then 500 without internals, and it is logged', async () => {
    const { app, logs } = appThrowing(new Error('connection string postgres://secret@db'));
    const res = await request(app).get('/boom').expect(500);
    expect(res.body.error.code).toBe('INTERNAL');
    expect(JSON.stringify(res.body)).not.toMatch(/secret|postgres/);
    expect(logs).toHaveLength(1);
  });

  it('when no route matches, then 404 in the envelope', async () => {
    const res = await request(appThrowing(null).app).get('/nowhere').expect(404);
    expect(res.body.error.code).toBe('NOT_FOUND');
  });
});

describe('validate({ params, query, body }) keeps the parsed values', () => {
  const app = express();
  app.use(express.json());
  app.post(
    '/items/:id',
    validate({
      params: z.object({ id: z.coerce.number().int() }),
      query: z.object({ limit: z.coerce.number().default(10), tag: z.string().optional() }),
      body: z.object({ name: z.string().trim().min(1), kind: z.enum(['a', 'b']).default('a') }),
    }),
    (req, res) => {
      res.json({ params: req.params, query: res.locals.query, body: req.body });
    },
  );
  app.use(errorHandler({ info: () => {}, warn: () => {}, error: () => {} }));

  it('when the request is valid, then the route sees coerced, trimmed and defaulted values', async () => {
    const res = await request(app).post('/items/42?tag=x').send({ name: '  Probe  ' }).expect(200);
    expect(res.body).toEqual({ params: { id: 42 }, query: { limit: 10, tag: 'x' }, body: { name: 'Probe', kind: 'a' } });
  });

  it('when params, query and body are all wrong, then one 400 lists all three', async () => {
    const res = await request(app).post('/items/abc?limit=many').send({ name: '', kind: 'z' }).expect(400);
    const paths = res.body.error.issues.map((i: { path: string[] }) => i.path.join('.'));
    expect(paths).toEqual(expect.arrayContaining(['params.id', 'query.limit', 'body.name', 'body.kind']));
  });

  it('when there is no body at all, then the body problems are reported, not a crash', async () => {
    const res = await request(app).post('/items/1').expect(400);
    expect(res.body.error.issues.map((i: { path: string[] }) => i.path.join('.'))).toContain('body.name');
  });
});
