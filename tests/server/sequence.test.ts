import request from 'supertest';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { addWorkingDays, isoWeekday, nextWorkingDay } from '../../shared/domain/calendar';
import { addCalendarDays } from '../../shared/domain/date';
import type { PlantCalendar } from '../../shared/domain/types';
import { AuditEventEntity } from '../../server/audit/audit-event.entity';
import { writeCalendar } from '../../server/calendar/calendar.service';
import { replaceBomLines } from '../../server/master-data/master-data.writer';
import { savePartsWithStock } from '../../server/stock/stock.service';
import { upsertSequenceEntries } from '../../server/sequence/sequence.writer';
import { plantToday } from '../../server/planning/plan-dates';
import { SequenceEntryEntity } from '../../server/sequence/sequence-entry.entity';
import { writeSequenceSettings } from '../../server/sequence/sequence-settings';
import { readPlanningVersion } from '../../server/settings/versions';
import { bearer, createTestContext, testPart, type TestContext } from './helpers';

let context: TestContext;

// Dates follow the real clock, as the service's frozen window does: F1–F3 are the three frozen
// working days (today is F1 when it is a working day), O1–O3 the open days after them, PAST the
// working day before F1 and SATURDAY the first Saturday after O1.
const calendar: PlantCalendar = { workingWeekdays: [1, 2, 3, 4, 5], holidays: [] };
const today = plantToday();
const F1 = nextWorkingDay(today, calendar);
const F3 = addWorkingDays(F1, 2, calendar);
const O1 = addWorkingDays(F1, 3, calendar);
const O2 = addWorkingDays(F1, 4, calendar);
const O3 = addWorkingDays(F1, 5, calendar);
const PAST = addWorkingDays(F1, -1, calendar);
const SATURDAY = addCalendarDays(O1, (6 - isoWeekday(O1) + 7) % 7 || 7);

const api = () => request(context.app);
const asPlanner = () => bearer(context.tokens.planner);

interface DayBody {
  date: string;
  load: number;
  frozen: boolean;
  working: boolean;
  units: { serial: string; sequence: number; date: string }[];
}

async function board(from = PAST, to = O3): Promise<DayBody[]> {
  const response = await api().get('/api/sequence').query({ from, to }).set(asPlanner());
  expect(response.status).toBe(200);
  return response.body.days;
}

async function order(date: string): Promise<string[]> {
  const day = (await board()).find((candidate) => candidate.date === date);
  return (day?.units ?? []).map((unit) => `${unit.sequence}:${unit.serial}`);
}

function resequence(
  days: { date: string; serials: string[] }[],
  extra: { allowFrozen?: boolean } = {},
  token = context.tokens.planner,
) {
  return api()
    .put('/api/sequence/days')
    .set(bearer(token))
    .send({ days, ...extra });
}

// Model M1 takes 2 × C per unit (the gross check below), M2 takes none.
beforeAll(async () => {
  context = await createTestContext();
  await context.dataSource.transaction(async (manager) => {
    await writeCalendar(manager, calendar);
    await savePartsWithStock(manager, [
      testPart('M1', { source: 'end_item', supplierCode: null, replenishment: null }),
      testPart('M2', { source: 'end_item', supplierCode: null, replenishment: null }),
      testPart('C', { packQty: 1, onHand: 0, leadTimeDays: 0 }),
    ]);
    await replaceBomLines(manager, [
      { parent: 'M1', component: 'C', qtyPer: 2, scrapPct: 0, effectiveFrom: null, effectiveTo: null },
    ]);
  });
});
afterAll(() => context.close());

beforeEach(async () => {
  await context.dataSource.transaction(async (manager) => {
    await manager.clear(SequenceEntryEntity);
    await writeSequenceSettings(manager, { frozenWindowDays: 3, dailyCapacity: 24 });
    await upsertSequenceEntries(manager, [
      { date: PAST, sequence: 1, model: 'M1', serial: 'Y1', qty: 1 },
      { date: F1, sequence: 1, model: 'M1', serial: 'Z1', qty: 1 },
      { date: O1, sequence: 1, model: 'M1', serial: 'A1', qty: 1 },
      { date: O1, sequence: 2, model: 'M2', serial: 'A2', qty: 1 },
      { date: O1, sequence: 3, model: 'M1', serial: 'A3', qty: 1 },
      { date: O2, sequence: 1, model: 'M2', serial: 'B1', qty: 1 },
      { date: O2, sequence: 2, model: 'M2', serial: 'B2', qty: 1 },
    ]);
  });
});

describe('GET /api/sequence', () => {
  it('shows the next 10 working days from today with the frozen window, load and models', async () => {
    const response = await api().get('/api/sequence').set(bearer(context.tokens.viewer));

    expect(response.status).toBe(200);
    const days: DayBody[] = response.body.days;
    expect(days.map((day) => day.date)).toEqual(
      Array.from({ length: 10 }, (_, index) => addWorkingDays(F1, index, calendar)),
    );
    expect(days.map((day) => day.frozen)).toEqual([true, true, true, false, false, false, false, false, false, false]);
    expect(response.body).toMatchObject({ today, frozenUntil: F3, frozenWindowDays: 3, dailyCapacity: 24 });
    expect(days[3]).toMatchObject({ date: O1, working: true, load: 3, capacity: 24 });
    expect(days[3].units.map((unit) => unit.serial)).toEqual(['A1', 'A2', 'A3']);
    expect(response.body.models).toEqual([
      { partNumber: 'M1', description: 'Part M1' },
      { partNumber: 'M2', description: 'Part M2' },
    ]);
  });

  it('lists a non-working day that still holds units, flagged so the planner moves them off', async () => {
    await context.dataSource
      .getRepository(SequenceEntryEntity)
      .insert({ date: SATURDAY, sequence: 1, model: 'M2', serial: 'W1', qty: 1 });

    const days = await board(O1, addCalendarDays(SATURDAY, 2));

    expect(days.find((day) => day.date === SATURDAY)).toMatchObject({ working: false, load: 1 });
  });

  it('refuses a range that ends before it starts, and a supplier account', async () => {
    const reversed = await api().get('/api/sequence').query({ from: O2, to: O1 }).set(asPlanner());
    const supplier = await api().get('/api/sequence').set(bearer(context.tokens.supplier));

    expect(reversed.status).toBe(400);
    expect(supplier.status).toBe(403);
  });
});

describe('PUT /api/sequence/days', () => {
  it('reorders the units of a day and renumbers them 1..n', async () => {
    const response = await resequence([{ date: O1, serials: ['A3', 'A1', 'A2'] }]);

    expect(response.status).toBe(200);
    expect(response.body.days.map((day: DayBody) => day.date)).toEqual([O1]);
    expect(await order(O1)).toEqual(['1:A3', '2:A1', '3:A2']);
  });

  it('moves a unit to another day and closes up the day it left', async () => {
    const response = await resequence([{ date: O2, serials: ['B1', 'A2', 'B2'] }]);

    expect(response.status).toBe(200);
    expect(response.body.days.map((day: DayBody) => day.date)).toEqual([O1, O2]);
    expect(await order(O1)).toEqual(['1:A1', '2:A3']);
    expect(await order(O2)).toEqual(['1:B1', '2:A2', '3:B2']);
  });

  it('takes both days of a drag in one call', async () => {
    const response = await resequence([
      { date: O1, serials: ['A1', 'A3'] },
      { date: O3, serials: ['A2'] },
    ]);

    expect(response.status).toBe(200);
    expect(await order(O1)).toEqual(['1:A1', '2:A3']);
    expect(await order(O3)).toEqual(['1:A2']);
  });

  it('answers 400 for an unknown serial and changes nothing', async () => {
    const response = await resequence([{ date: O1, serials: ['A1', 'A2', 'A3', 'NOPE'] }]);

    expect(response.status).toBe(400);
    expect(response.body.error.details).toEqual([
      { path: ['days', 0, 'serials', 3], message: "no unit with serial 'NOPE'" },
    ]);
    expect(await order(O1)).toEqual(['1:A1', '2:A2', '3:A3']);
  });

  it('answers 400 when a serial is named twice', async () => {
    const response = await resequence([
      { date: O1, serials: ['A1', 'A2', 'A3'] },
      { date: O2, serials: ['B1', 'B2', 'A2'] },
    ]);

    expect(response.status).toBe(400);
    expect(response.body.error.details[0].path).toEqual(['days', 1, 'serials', 2]);
  });

  it('answers 400 when a listed day would lose a unit without naming where it goes', async () => {
    const response = await resequence([{ date: O1, serials: ['A1', 'A3'] }]);

    expect(response.status).toBe(400);
    expect(response.body.error.message).toContain("unit 'A2'");
    expect(await order(O1)).toEqual(['1:A1', '2:A2', '3:A3']);
  });

  it('answers 400 for a day the plant does not work, naming the weekday', async () => {
    const response = await resequence([{ date: SATURDAY, serials: ['A2'] }]);

    expect(response.status).toBe(400);
    expect(response.body.error.message).toContain('Saturday, not a working day');
  });

  it('answers 409 with the figures when a day would go over capacity, and still lets a full day be reordered', async () => {
    await context.dataSource.transaction((manager) =>
      writeSequenceSettings(manager, { frozenWindowDays: 3, dailyCapacity: 2 }),
    );

    const over = await resequence([{ date: O2, serials: ['B1', 'A2', 'B2'] }]);
    const reorder = await resequence([{ date: O1, serials: ['A2', 'A1', 'A3'] }]);

    expect(over.status).toBe(409);
    expect(over.body.error.code).toBe('over_capacity');
    expect(over.body.error.details).toEqual([{ date: O2, load: 3, capacity: 2 }]);
    expect(over.body.error.message).toContain('would hold 3 units, over the daily capacity of 2');
    expect(reorder.status).toBe(200);
  });

  it('refuses a change inside the frozen window unless the planner confirms it', async () => {
    const outOf = await resequence([{ date: O1, serials: ['Z1', 'A1', 'A2', 'A3'] }]);
    const into = await resequence([{ date: F1, serials: ['Z1', 'A2'] }]);
    const confirmed = await resequence([{ date: F1, serials: ['A2', 'Z1'] }], { allowFrozen: true });

    expect(outOf.status).toBe(409);
    expect(outOf.body.error.code).toBe('frozen_window');
    expect(outOf.body.error.message).toContain('inside the frozen window (3 working days)');
    expect(into.status).toBe(409);
    expect(confirmed.status).toBe(200);
    expect(await order(F1)).toEqual(['1:A2', '2:Z1']);
  });

  it('treats a day before today as frozen: its units count as built', async () => {
    const response = await resequence([{ date: O1, serials: ['Y1', 'A1', 'A2', 'A3'] }]);

    expect(response.status).toBe(409);
    expect(response.body.error.message).toContain('before today');
  });

  it('changes nothing and bumps nothing when the order given is the order held', async () => {
    const version = await readPlanningVersion(context.dataSource.manager);

    const response = await resequence([{ date: O1, serials: ['A1', 'A2', 'A3'] }]);

    expect(response.status).toBe(200);
    expect(response.body.days).toEqual([]);
    expect(await readPlanningVersion(context.dataSource.manager)).toBe(version);
  });

  it('writes one audit event listing every unit that moved', async () => {
    const response = await resequence([{ date: O2, serials: ['A2', 'B1', 'B2'] }]);

    const last = await context.dataSource.getRepository(AuditEventEntity).findOne({
      where: { entity: 'sequence', action: 'resequence' },
      order: { id: 'DESC' },
    });
    expect(response.status).toBe(200);
    expect(last?.actorEmail).toBe('planner@example.com');
    expect(last?.entityKey).toBe(`${O1}..${O2}`);
    expect(last?.changes?.moves).toEqual([
      { serial: 'A3', model: 'M1', from: { date: O1, sequence: 3 }, to: { date: O1, sequence: 2 } },
      { serial: 'A2', model: 'M2', from: { date: O1, sequence: 2 }, to: { date: O2, sequence: 1 } },
      { serial: 'B1', model: 'M2', from: { date: O2, sequence: 1 }, to: { date: O2, sequence: 2 } },
      { serial: 'B2', model: 'M2', from: { date: O2, sequence: 2 }, to: { date: O2, sequence: 3 } },
    ]);
  });

  // Conservation, not a reference value: moving one M1 unit (2 × C each) from O1 to O2 shifts
  // exactly 2 of C's gross requirement between the two days and leaves the total alone.
  it('bumps the planning version so the plan moves the gross requirement with the unit', async () => {
    const query = { part: 'C', from: O1, to: O2 };
    const grossOf = async () => {
      const plan = await api().get('/api/plan').query(query).set(asPlanner());
      return plan.body.buckets.map((bucket: { gross: number }) => bucket.gross) as number[];
    };
    const before = await grossOf();
    const version = await readPlanningVersion(context.dataSource.manager);

    await resequence([{ date: O2, serials: ['B1', 'B2', 'A1'] }]);
    const after = await grossOf();

    expect(await readPlanningVersion(context.dataSource.manager)).toBeGreaterThan(version);
    expect(after[0]).toBe(before[0] - 2);
    expect(after[1]).toBe(before[1] + 2);
    expect(after[0] + after[1]).toBe(before[0] + before[1]);
  });
});

describe('POST /api/sequence/units', () => {
  it('adds a unit at the end of its day', async () => {
    const response = await api()
      .post('/api/sequence/units')
      .set(asPlanner())
      .send({ date: O2, model: 'M1', serial: 'N1' });

    expect(response.status).toBe(201);
    expect(response.body).toMatchObject({ date: O2, sequence: 3, model: 'M1', serial: 'N1', qty: 1 });
    expect(await order(O2)).toEqual(['1:B1', '2:B2', '3:N1']);
  });

  it('checks the model, the serial, the day, the frozen window and the capacity like the import does', async () => {
    const add = (body: object) =>
      api()
        .post('/api/sequence/units')
        .set(asPlanner())
        .send({ date: O2, model: 'M1', serial: 'N2', ...body });
    await context.dataSource.transaction((manager) =>
      writeSequenceSettings(manager, { frozenWindowDays: 3, dailyCapacity: 3 }),
    );

    const boughtPart = await add({ model: 'C' });
    const unknownModel = await add({ model: 'NOPE' });
    const takenSerial = await add({ serial: 'A1' });
    const weekend = await add({ date: SATURDAY });
    const frozen = await add({ date: F1 });
    const full = await add({ qty: 2 });
    const frozenConfirmed = await add({ date: F1, allowFrozen: true });

    expect(boughtPart.status).toBe(400);
    expect(boughtPart.body.error.details).toEqual([{ path: ['model'], message: "'C' is a buy part, not an end item" }]);
    expect(unknownModel.status).toBe(400);
    expect(takenSerial.status).toBe(409);
    expect(weekend.status).toBe(400);
    expect(frozen.status).toBe(409);
    expect(frozen.body.error.code).toBe('frozen_window');
    expect(full.status).toBe(409);
    expect(full.body.error.details).toEqual([{ date: O2, load: 4, capacity: 3 }]);
    expect(frozenConfirmed.status).toBe(201);
  });
});

describe('DELETE /api/sequence/units/:serial', () => {
  it('removes a unit and closes up its day', async () => {
    const response = await api().delete('/api/sequence/units/A1').set(asPlanner());

    expect(response.status).toBe(204);
    expect(await order(O1)).toEqual(['1:A2', '2:A3']);
  });

  it('answers 404 for an unknown serial and 409 inside the frozen window unless confirmed', async () => {
    const unknown = await api().delete('/api/sequence/units/NOPE').set(asPlanner());
    const frozen = await api().delete('/api/sequence/units/Z1').set(asPlanner());
    const confirmed = await api().delete('/api/sequence/units/Z1').query({ allowFrozen: 'true' }).set(asPlanner());

    expect(unknown.status).toBe(404);
    expect(frozen.status).toBe(409);
    expect(confirmed.status).toBe(204);
    expect(await order(F1)).toEqual([]);
  });
});

describe('sequence settings', () => {
  it('starts at a 3-day frozen window and 24 units a day, and takes new values with an audit event', async () => {
    await context.dataSource.transaction((manager) =>
      manager.delete('setting', ['sequence.frozenWindowDays', 'sequence.dailyCapacity']),
    );
    const defaults = await api().get('/api/sequence/settings').set(bearer(context.tokens.viewer));

    const saved = await api()
      .put('/api/sequence/settings')
      .set(asPlanner())
      .send({ frozenWindowDays: 0, dailyCapacity: 30 });
    const days = await board(F1, O1);

    expect(defaults.body).toEqual({ frozenWindowDays: 3, dailyCapacity: 24, version: expect.any(String) });
    expect(saved.status).toBe(200);
    expect(saved.body).toEqual({ frozenWindowDays: 0, dailyCapacity: 30, version: expect.any(String) });
    expect(days.map((day) => day.frozen)).toEqual([false, false, false, false]);
    const audit = await context.dataSource.getRepository(AuditEventEntity).findOneBy({ entity: 'sequence-settings' });
    expect(audit?.changes).toMatchObject({ after: { frozenWindowDays: 0, dailyCapacity: 30 } });
  });

  it('refuses values out of range', async () => {
    const tooLong = await api()
      .put('/api/sequence/settings')
      .set(asPlanner())
      .send({ frozenWindowDays: 16, dailyCapacity: 24 });
    const noCapacity = await api()
      .put('/api/sequence/settings')
      .set(asPlanner())
      .send({ frozenWindowDays: 3, dailyCapacity: 0 });

    expect(tooLong.status).toBe(400);
    expect(noCapacity.status).toBe(400);
  });
});

describe('who may change the sequence', () => {
  it.each(['buyer', 'receiving', 'viewer'] as const)('refuses every change to a %s', async (role) => {
    const token = context.tokens[role];

    const moved = await resequence([{ date: O1, serials: ['A3', 'A1', 'A2'] }], {}, token);
    const added = await api()
      .post('/api/sequence/units')
      .set(bearer(token))
      .send({ date: O2, model: 'M1', serial: 'N9' });
    const removed = await api().delete('/api/sequence/units/A1').set(bearer(token));
    const settings = await api()
      .put('/api/sequence/settings')
      .set(bearer(token))
      .send({ frozenWindowDays: 3, dailyCapacity: 24 });

    expect([moved.status, added.status, removed.status, settings.status]).toEqual([403, 403, 403, 403]);
  });

  it('lets an admin change it', async () => {
    const response = await resequence([{ date: O1, serials: ['A3', 'A1', 'A2'] }], {}, context.tokens.admin);

    expect(response.status).toBe(200);
  });
});
