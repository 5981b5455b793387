import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Role } from '../../shared/schemas/user';
import { bearer, createTestContext, type TestContext } from './helpers';

let context: TestContext;
beforeAll(async () => {
  context = await createTestContext();
});
afterAll(() => context.close());

const calendar = { workingWeekdays: [1, 2, 3, 4, 5], holidays: ['2026-12-25'] };

// Each route with the roles that may call it (PRODUCT.md role rules); every other role must get 403.
const cases: { method: 'get' | 'put'; path: string; body?: object; allowed: Role[] }[] = [
  { method: 'get', path: '/api/users', allowed: ['admin'] },
  { method: 'put', path: '/api/calendar', body: calendar, allowed: ['admin', 'planner'] },
  { method: 'get', path: '/api/calendar', allowed: ['admin', 'planner', 'buyer', 'receiving', 'viewer'] },
  { method: 'get', path: '/api/parts', allowed: ['admin', 'planner', 'buyer', 'receiving', 'viewer'] },
  { method: 'get', path: '/api/outbox', allowed: ['admin'] },
];
const roles: Role[] = ['admin', 'planner', 'buyer', 'receiving', 'supplier', 'viewer'];

describe('role enforcement on the server', () => {
  for (const route of cases) {
    for (const role of roles) {
      const allowed = route.allowed.includes(role);
      it(`${route.method.toUpperCase()} ${route.path} as ${role} → ${allowed ? 'allowed' : '403'}`, async () => {
        const response = await request(context.app)
          [route.method](route.path)
          .set(bearer(context.tokens[role]))
          .send(route.body);

        if (allowed) expect(response.status).toBe(200);
        else expect(response.status).toBe(403);
      });
    }
  }

  it('answers 401 on a protected route without a token', async () => {
    const response = await request(context.app).get('/api/calendar');

    expect(response.status).toBe(401);
  });

  it('shows a supplier account only its own supplier', async () => {
    const asSupplier = await request(context.app).get('/api/suppliers').set(bearer(context.tokens.supplier));
    const asBuyer = await request(context.app).get('/api/suppliers').set(bearer(context.tokens.buyer));

    expect(asSupplier.body.map((supplier: { code: string }) => supplier.code)).toEqual(['SUP-A']);
    expect(asBuyer.body.map((supplier: { code: string }) => supplier.code)).toEqual(['SUP-A', 'SUP-B']);
  });
});
