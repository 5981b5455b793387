import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addWorkingDays, nextWorkingDay } from '../../shared/domain/calendar';
import type { PlantCalendar } from '../../shared/domain/types';
import { writeCalendar } from '../../server/calendar/calendar.service';
import { savePartsWithStock } from '../../server/stock/stock.service';
import { syncLoops } from '../../server/loops/loop-sync';
import { plantToday } from '../../server/planning/plan-dates';
import { upsertSequenceEntries } from '../../server/sequence/sequence.writer';
import { bearer, createTestContext, testPart, type TestContext } from './helpers';

// Two people edit the same thing from copies loaded at the same time: the second save, based on a
// stale copy, must be refused with 409 `stale` and the current state, never silently undo the first.

let context: TestContext;
const calendar: PlantCalendar = { workingWeekdays: [1, 2, 3, 4, 5], holidays: [] };
const first = addWorkingDays(nextWorkingDay(plantToday(), calendar), 5, calendar);
const second = addWorkingDays(first, 1, calendar);

beforeAll(async () => {
  context = await createTestContext();
  await context.db.write(async (manager) => {
    await writeCalendar(manager, calendar);
    await savePartsWithStock(manager, [
      testPart('MDL', { source: 'end_item', supplierCode: null, replenishment: null }),
      testPart('KAN-1', { replenishment: 'kanban' }),
    ]);
    await syncLoops(manager);
    await upsertSequenceEntries(manager, [
      { date: first, sequence: 1, model: 'MDL', serial: 'A1', qty: 1 },
      { date: first, sequence: 2, model: 'MDL', serial: 'A2', qty: 1 },
      { date: second, sequence: 1, model: 'MDL', serial: 'B1', qty: 1 },
    ]);
  });
});
afterAll(() => context.close());

const asPlanner = () => bearer(context.tokens.planner);
const asAdmin = () => bearer(context.tokens.admin);

describe('two planners resequencing from the same board', () => {
  it('refuses the stale move with the day as it is now and who changed it, and keeps the first move', async () => {
    const board = await request(context.app).get('/api/sequence').query({ from: first, to: second }).set(asPlanner());
    const basedOn = board.body.days.map((day: { date: string; version: string }) => ({
      date: day.date,
      version: day.version,
    }));

    const firstPlanner = await request(context.app)
      .put('/api/sequence/days')
      .set(asPlanner())
      .send({ days: [{ date: first, serials: ['A2', 'A1'] }], basedOn });
    const secondPlanner = await request(context.app)
      .put('/api/sequence/days')
      .set(bearer(context.tokens.admin))
      .send({
        days: [
          { date: first, serials: ['A1'] },
          { date: second, serials: ['B1', 'A2'] },
        ],
        basedOn,
      });
    const after = await request(context.app).get('/api/sequence').query({ from: first, to: second }).set(asPlanner());

    expect(firstPlanner.status).toBe(200);
    expect(secondPlanner.status).toBe(409);
    expect(secondPlanner.body.error.code).toBe('stale');
    expect(secondPlanner.body.error.message).toMatch(/Test planner changed it at \d\d:\d\d/);
    expect(secondPlanner.body.error.details[0].days[0].units.map((unit: { serial: string }) => unit.serial)).toEqual([
      'A2',
      'A1',
    ]);
    expect(secondPlanner.body.error.details[0].lastChange).toMatchObject({ by: 'Test planner', action: 'resequence' });
    expect(after.body.days[0].units.map((unit: { serial: string }) => unit.serial)).toEqual(['A2', 'A1']);
  });

  it('accepts a move based on a current board, and one that names no versions (API clients)', async () => {
    const board = await request(context.app).get('/api/sequence').query({ from: first, to: second }).set(asPlanner());
    const basedOn = board.body.days.map((day: { date: string; version: string }) => ({
      date: day.date,
      version: day.version,
    }));

    const current = await request(context.app)
      .put('/api/sequence/days')
      .set(asPlanner())
      .send({ days: [{ date: first, serials: ['A1', 'A2'] }], basedOn });
    const unversioned = await request(context.app)
      .put('/api/sequence/days')
      .set(asPlanner())
      .send({ days: [{ date: first, serials: ['A2', 'A1'] }] });

    expect(current.status).toBe(200);
    expect(unversioned.status).toBe(200);
  });
});

describe('If-Match on edited settings and records', () => {
  it.each([
    ['the calendar', '/api/calendar', 'put', () => ({ workingWeekdays: [1, 2, 3, 4, 5, 6], holidays: [] })],
    ['the sequence settings', '/api/sequence/settings', 'put', () => ({ frozenWindowDays: 2, dailyCapacity: 30 })],
    ['the release job time', '/api/releases/settings', 'put', () => ({ jobTime: '05:30' })],
  ] as const)('refuses a change of %s made on a stale copy', async (_what, path, _method, change) => {
    const loaded = await request(context.app).get(path).set(asAdmin());
    const firstSave = await request(context.app)
      .put(path)
      .set(asAdmin())
      .set('If-Match', loaded.body.version)
      .send(change());
    const { version: _old, ...current } = firstSave.body;
    const undo = await request(context.app)
      .put(path)
      .set(asAdmin())
      .set('If-Match', loaded.body.version)
      .send({ ...loaded.body, version: undefined });

    expect(firstSave.status).toBe(200);
    expect(firstSave.body.version).not.toBe(loaded.body.version);
    expect(undo.status).toBe(409);
    expect(undo.body.error.code).toBe('stale');
    expect(undo.body.error.details[0].current).toMatchObject(current);
  });

  it('refuses a user change made on a stale copy of the account', async () => {
    const users = await request(context.app).get('/api/users').set(asAdmin());
    const viewer = users.body.find((user: { email: string }) => user.email === 'viewer@example.com');

    const firstSave = await request(context.app)
      .patch(`/api/users/${viewer.id}`)
      .set(asAdmin())
      .set('If-Match', viewer.version)
      .send({ role: 'buyer' });
    const stale = await request(context.app)
      .patch(`/api/users/${viewer.id}`)
      .set(asAdmin())
      .set('If-Match', viewer.version)
      .send({ active: false });

    expect(firstSave.status).toBe(200);
    expect(stale.status).toBe(409);
    expect(stale.body.error.details[0].current).toMatchObject({ role: 'buyer', active: true });
  });

  it('refuses a loop change made on a stale copy, but not because demand moved', async () => {
    const loops = await request(context.app).get('/api/kanban/loops').set(asAdmin());
    const loop = loops.body[0];

    const firstSave = await request(context.app)
      .patch(`/api/kanban/loops/${loop.id}`)
      .set(asAdmin())
      .set('If-Match', loop.version)
      .send({ safetyFactor: 0.2 });
    const stale = await request(context.app)
      .patch(`/api/kanban/loops/${loop.id}`)
      .set(asAdmin())
      .set('If-Match', loop.version)
      .send({ containerQty: 7 });

    expect(firstSave.status).toBe(200);
    expect(stale.status).toBe(409);
    expect(stale.body.error.details[0].current).toMatchObject({ safetyFactor: 0.2 });
  });
});
