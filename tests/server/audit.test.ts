import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { savePartsWithStock } from '../../server/stock/stock.service';
import { bearer, createTestContext, testPart, type TestContext } from './helpers';

let context: TestContext;
const today = new Date().toISOString().slice(0, 10);

beforeAll(async () => {
  context = await createTestContext();
  await context.db.write((manager) => savePartsWithStock(manager, [testPart('GEAR'), testPart('SHAFT')]));
  await request(context.app).put('/api/parts/GEAR').set(bearer(context.tokens.buyer)).send({ leadTimeDays: 4 });
  await request(context.app).put('/api/suppliers/SUP-B').set(bearer(context.tokens.admin)).send({ leadTimeDays: 4 });
});
afterAll(() => context.close());

const audit = (query: Record<string, string>, role: 'admin' | 'planner' = 'admin') =>
  request(context.app).get('/api/audit').query(query).set(bearer(context.tokens[role]));

describe('GET /api/audit', () => {
  it('shows who changed which part from what to what', async () => {
    const response = await audit({ kind: 'part', subject: 'GEAR' }, 'planner');

    expect(response.status).toBe(200);
    expect(response.body.events).toEqual([
      expect.objectContaining({
        actorEmail: 'buyer@example.com',
        action: 'update',
        kind: 'part',
        subject: 'GEAR',
        summary: 'lead time days: 0 → 4',
      }),
    ]);
  });

  it('filters by user and by days, newest first', async () => {
    const byAdmin = await audit({ user: 'admin@' });
    const tomorrowOn = await audit({ from: '2999-01-01' });
    const todayOnly = await audit({ from: today, to: today });

    expect(byAdmin.body.events.map((event: { kind: string }) => event.kind)).toEqual(['supplier']);
    expect(tomorrowOn.body.events).toEqual([]);
    const ids = todayOnly.body.events.map((event: { id: number }) => event.id);
    expect(ids.length).toBeGreaterThanOrEqual(2);
    expect([...ids].sort((a, b) => b - a)).toEqual(ids);
  });

  it('exports the filtered events as CSV with the change in one column', async () => {
    const response = await audit({ kind: 'supplier', format: 'csv' });

    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toContain('text/csv');
    const lines = response.text.trim().split('\r\n');
    expect(lines[0]).toBe('at,user,action,kind,subject,changes');
    expect(lines[1]).toMatch(/admin@example.com,update,supplier,SUP-B,lead time days: 5 → 4$/);
  });

  it('names the field of a bad filter and refuses other roles', async () => {
    const badDay = await audit({ from: '2026-13-01' });
    const backwards = await audit({ from: '2026-12-02', to: '2026-12-01' });
    const buyer = await request(context.app).get('/api/audit').set(bearer(context.tokens.buyer));
    const viewer = await request(context.app).get('/api/audit/kinds').set(bearer(context.tokens.viewer));

    expect(badDay.status).toBe(400);
    expect(badDay.body.error.details[0].path).toEqual(['from']);
    expect(backwards.status).toBe(400);
    expect(backwards.body.error.details[0]).toMatchObject({
      path: ['to'],
      message: 'the last day is before the first',
    });
    expect(buyer.status).toBe(403);
    expect(viewer.status).toBe(403);
  });

  it('lists the kinds of record the trail holds', async () => {
    const response = await request(context.app).get('/api/audit/kinds').set(bearer(context.tokens.admin));

    expect(response.body).toEqual(expect.arrayContaining(['part', 'supplier']));
  });
});
