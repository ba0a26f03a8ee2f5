/** Health, unknown routes, security headers, and the error handler's envelope and statuses. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import express from 'express';
import request from 'supertest';
import { makeTestApp, type TestContext } from './helpers.js';
import { ApiError, errorHandler } from '../../server/middleware/errors.js';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await makeTestApp();
});
afterAll(() => ctx.close());

describe('application', () => {
  it('answers the health route without a session', async () => {
    const res = await request(ctx.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'ok', database: 'ok' });
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
    expect(res.headers['x-powered-by']).toBeUndefined();
  });

  it('answers 401 for an API route without a session, in the error envelope', async () => {
    const res = await request(ctx.app).get('/api/projects');
    expect(res.status).toBe(401);
    expect(res.body).toEqual({ error: { code: 'unauthenticated', message: expect.any(String), details: [] } });
  });
});

describe('error handler', () => {
  const logged: string[] = [];
  const app = express();
  app.get('/boom', () => {
    throw new Error('secret internal detail at /srv/db.sqlite');
  });
  app.get('/conflict', () => {
    throw ApiError.conflict('already approved');
  });
  app.use(errorHandler((l) => logged.push(l)));

  it('turns an unexpected error into a 500 without internals, and logs it', async () => {
    const res = await request(app).get('/boom');
    expect(res.status).toBe(500);
    expect(res.body.error.code).toBe('internal');
    expect(JSON.stringify(res.body)).not.toContain('secret');
    expect(logged.join('\n')).toContain('secret internal detail');
  });

  it('keeps the status and code of a typed error', async () => {
    const res = await request(app).get('/conflict');
    expect(res.status).toBe(409);
    expect(res.body.error).toEqual({ code: 'conflict', message: 'already approved', details: [] });
  });
});
