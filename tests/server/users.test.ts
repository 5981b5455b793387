import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bearer, createTestContext, signIn, type TestContext } from './helpers';
import { runSql } from '../../server/db/sql';

let context: TestContext;
beforeAll(async () => {
  context = await createTestContext();
});
afterAll(() => context.close());

describe('/api/users', () => {
  it('adds a user who can then sign in, with the password stored as an argon2id hash', async () => {
    const created = await request(context.app)
      .post('/api/users')
      .set(bearer(context.tokens.admin))
      .send({ email: 'New.Planner@example.org', name: 'New Planner', role: 'planner', password: 'planner-password-1' });

    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ email: 'new.planner@example.org', role: 'planner', active: true });
    const [row] = await runSql<{ password_hash: string }[]>(
      context.dataSource.manager,
      'SELECT password_hash FROM "user" WHERE email = ?',
      ['new.planner@example.org'],
    );
    expect(row.password_hash).toMatch(/^\$argon2id\$/);
    await expect(signIn(context.app, 'new.planner@example.org', 'planner-password-1')).resolves.toEqual(
      expect.any(String),
    );
  });

  it('says what an e-mail address looks like when one sent is not, adding nobody', async () => {
    const refused = await request(context.app)
      .post('/api/users')
      .set(bearer(context.tokens.admin))
      .send({ email: 'noor at example', name: 'Noor', role: 'planner', password: 'planner-password-1' });

    expect(refused.status).toBe(400);
    expect(refused.body.error.details).toContainEqual(
      expect.objectContaining({ path: ['email'], message: 'an e-mail address like name@example.com' }),
    );
    const [{ count }] = await runSql<{ count: number }[]>(
      context.dataSource.manager,
      'SELECT COUNT(*) AS count FROM "user" WHERE name = ?',
      ['Noor'],
    );
    expect(Number(count)).toBe(0);
  });

  it('binds a supplier user to an existing supplier and rejects an unknown one', async () => {
    const missing = await request(context.app)
      .post('/api/users')
      .set(bearer(context.tokens.admin))
      .send({ email: 'rep@supplier-b.example.net', name: 'Rep', role: 'supplier', password: 'supplier-password' });
    const unknown = await request(context.app).post('/api/users').set(bearer(context.tokens.admin)).send({
      email: 'rep@supplier-b.example.net',
      name: 'Rep',
      role: 'supplier',
      password: 'supplier-password',
      supplierCode: 'NOPE',
    });
    const bound = await request(context.app).post('/api/users').set(bearer(context.tokens.admin)).send({
      email: 'rep@supplier-b.example.net',
      name: 'Rep',
      role: 'supplier',
      password: 'supplier-password',
      supplierCode: 'SUP-B',
    });

    expect(missing.status).toBe(400);
    expect(missing.body.error.details[0].path).toEqual(['supplierCode']);
    expect(unknown.status).toBe(400);
    expect(bound.status).toBe(201);
    expect(bound.body.supplierCode).toBe('SUP-B');
  });

  it('changes a role and records it in the audit trail', async () => {
    const users = await request(context.app).get('/api/users').set(bearer(context.tokens.admin));
    const viewer = users.body.find((user: { email: string }) => user.email === 'viewer@example.com');

    const response = await request(context.app)
      .patch(`/api/users/${viewer.id}`)
      .set(bearer(context.tokens.admin))
      .send({ role: 'buyer' });

    expect(response.status).toBe(200);
    expect(response.body.role).toBe('buyer');
    const [audit] = await context.dataSource.query(
      "SELECT actor_email, action FROM audit_event WHERE entity = 'user' AND entity_key = 'viewer@example.com'",
    );
    expect(audit).toEqual({ actor_email: 'admin@example.com', action: 'update' });
  });

  it('will not let an admin disable themself', async () => {
    const users = await request(context.app).get('/api/users').set(bearer(context.tokens.admin));
    const admin = users.body.find((user: { email: string }) => user.email === 'admin@example.com');

    const response = await request(context.app)
      .patch(`/api/users/${admin.id}`)
      .set(bearer(context.tokens.admin))
      .send({ active: false });

    expect(response.status).toBe(400);
  });

  it('answers 404 for an unknown user id and 400 for a non-numeric one', async () => {
    const unknown = await request(context.app)
      .patch('/api/users/9999')
      .set(bearer(context.tokens.admin))
      .send({ active: true });
    const invalid = await request(context.app)
      .patch('/api/users/abc')
      .set(bearer(context.tokens.admin))
      .send({ active: true });

    expect(unknown.status).toBe(404);
    expect(invalid.status).toBe(400);
  });
});
