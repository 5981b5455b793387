import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bearer, createTestContext, type TestContext } from './helpers';

let context: TestContext;
beforeAll(async () => {
  context = await createTestContext();
});
afterAll(() => context.close());

describe('the API error contract', () => {
  it('GET /api/health answers ok without sign-in', async () => {
    const response = await request(context.app).get('/api/health');

    expect(response.status).toBe(200);
    expect(response.body).toEqual({ status: 'ok' });
  });

  it('answers 400 with zod issues for invalid input', async () => {
    const response = await request(context.app)
      .put('/api/calendar')
      .set(bearer(context.tokens.planner))
      .send({ workingWeekdays: [1, 8], holidays: ['2026-02-30'] });

    expect(response.status).toBe(400);
    expect(response.body.error.code).toBe('invalid_input');
    const paths = response.body.error.details.map((issue: { path: unknown[] }) => issue.path.join('.'));
    expect(paths).toEqual(expect.arrayContaining(['workingWeekdays.1', 'holidays.0']));
  });

  it('answers 400, not 500, for a body that is not JSON', async () => {
    const response = await request(context.app)
      .put('/api/calendar')
      .set(bearer(context.tokens.planner))
      .set('Content-Type', 'application/json')
      .send('{"workingWeekdays": [1,');

    expect(response.status).toBe(400);
    expect(response.body.error.code).toBe('invalid_json');
  });

  it('answers 413 for a body over the size limit', async () => {
    const huge = { workingWeekdays: [1], holidays: Array.from({ length: 120_000 }, () => '2026-01-01') };

    const response = await request(context.app).put('/api/calendar').set(bearer(context.tokens.planner)).send(huge);

    expect(response.status).toBe(413);
    expect(response.body.error.code).toBe('payload_too_large');
  });

  it('answers 404 in the error shape for an unknown API route', async () => {
    const response = await request(context.app).get('/api/no-such-thing').set(bearer(context.tokens.admin));

    expect(response.status).toBe(404);
    expect(response.body).toEqual({ error: { code: 'not_found', message: 'No such API route.' } });
  });

  it('answers 409 when an e-mail is already in use', async () => {
    const response = await request(context.app)
      .post('/api/users')
      .set(bearer(context.tokens.admin))
      .send({ email: 'buyer@example.com', name: 'Second buyer', role: 'buyer', password: 'long-enough-password' });

    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('conflict');
  });

  it('publishes an OpenAPI document generated from the route schemas', async () => {
    const response = await request(context.app).get('/api/openapi.json');

    expect(response.status).toBe(200);
    expect(response.body.openapi).toBe('3.1.0');
    const login = response.body.paths['/auth/login'].post;
    expect(login.requestBody.content['application/json'].schema.properties).toHaveProperty('password');
    expect(Object.keys(response.body.paths)).toEqual(expect.arrayContaining(['/users/{id}', '/calendar', '/health']));
  });
});
