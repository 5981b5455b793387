import jwt from 'jsonwebtoken';
import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { bearer, createTestContext, TEST_PASSWORD, TEST_SECRET, type TestContext } from './helpers';

let context: TestContext;
beforeEach(async () => {
  context = await createTestContext();
});
afterEach(() => context.close());

describe('POST /api/auth/login', () => {
  it('returns a token and the user for the right password', async () => {
    const response = await request(context.app)
      .post('/api/auth/login')
      .send({ email: 'Buyer@Example.com', password: TEST_PASSWORD });

    expect(response.status).toBe(200);
    expect(response.body.user).toEqual({
      email: 'buyer@example.com',
      name: 'Test buyer',
      role: 'buyer',
      supplierCode: null,
    });
    expect(jwt.decode(response.body.token)).toMatchObject({ sub: expect.any(String), iss: 'cardloop' });
  });

  it('answers 401 for a wrong password and for an unknown e-mail alike', async () => {
    const wrongPassword = await request(context.app)
      .post('/api/auth/login')
      .send({ email: 'buyer@example.com', password: 'nope' });
    const unknownUser = await request(context.app)
      .post('/api/auth/login')
      .send({ email: 'nobody@example.com', password: 'nope' });

    expect(wrongPassword.status).toBe(401);
    expect(unknownUser.status).toBe(401);
    expect(wrongPassword.body.error.message).toBe(unknownUser.body.error.message);
  });

  it('answers 429 after repeated failures, even with the right password', async () => {
    for (let attempt = 0; attempt < 5; attempt += 1) {
      const failed = await request(context.app)
        .post('/api/auth/login')
        .send({ email: 'buyer@example.com', password: 'wrong' });
      expect(failed.status).toBe(401);
    }

    const limited = await request(context.app)
      .post('/api/auth/login')
      .send({ email: 'buyer@example.com', password: TEST_PASSWORD });

    expect(limited.status).toBe(429);
    expect(limited.body.error.code).toBe('rate_limited');
  });

  it('refuses a disabled account', async () => {
    const users = await request(context.app).get('/api/users').set(bearer(context.tokens.admin));
    const viewer = users.body.find((user: { email: string }) => user.email === 'viewer@example.com');
    await request(context.app)
      .patch(`/api/users/${viewer.id}`)
      .set(bearer(context.tokens.admin))
      .send({ active: false });

    const response = await request(context.app)
      .post('/api/auth/login')
      .send({ email: 'viewer@example.com', password: TEST_PASSWORD });
    const oldToken = await request(context.app).get('/api/auth/me').set(bearer(context.tokens.viewer));

    expect(response.status).toBe(401);
    expect(oldToken.status).toBe(401);
  });

  it('rejects a body without a password with 400 and the field', async () => {
    const response = await request(context.app).post('/api/auth/login').send({ email: 'buyer@example.com' });

    expect(response.status).toBe(400);
    expect(response.body.error.details[0].path).toEqual(['password']);
  });
});

describe('GET /api/auth/me', () => {
  it('returns the signed-in user', async () => {
    const response = await request(context.app).get('/api/auth/me').set(bearer(context.tokens.supplier));

    expect(response.status).toBe(200);
    expect(response.body).toEqual({
      email: 'supplier@example.com',
      name: 'Test supplier',
      role: 'supplier',
      supplierCode: 'SUP-A',
    });
  });

  it('answers 401 without a token', async () => {
    const response = await request(context.app).get('/api/auth/me');

    expect(response.status).toBe(401);
    expect(response.body.error.code).toBe('unauthorized');
  });

  it('refuses a token signed with another algorithm or secret, or expired', async () => {
    const unsigned = jwt.sign({}, '', { algorithm: 'none', subject: '1', issuer: 'cardloop' });
    const otherSecret = jwt.sign({}, 'another-secret-another-secret-another', { subject: '1', issuer: 'cardloop' });
    const expired = jwt.sign({ exp: Math.floor(Date.now() / 1000) - 60 }, TEST_SECRET, {
      subject: '1',
      issuer: 'cardloop',
    });

    for (const token of [unsigned, otherSecret, expired]) {
      const response = await request(context.app).get('/api/auth/me').set(bearer(token));
      expect(response.status).toBe(401);
    }
  });
});
