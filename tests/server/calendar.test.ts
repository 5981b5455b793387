import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeCalendar } from '../../server/calendar/calendar.service';
import { bearer, createTestContext, type TestContext } from './helpers';

let context: TestContext;

beforeAll(async () => {
  context = await createTestContext();
  await context.dataSource.transaction((manager) =>
    writeCalendar(
      manager,
      { workingWeekdays: [1, 2, 3, 4, 5], holidays: ['2030-12-24', '2030-12-25'] },
      new Map([
        ['2030-12-24', 'Plant shutdown: year end'],
        ['2030-12-25', 'Plant shutdown: year end'],
      ]),
    ),
  );
});
afterAll(() => context.close());

describe('holiday names in the plant calendar', () => {
  it('are read with the calendar', async () => {
    const response = await request(context.app).get('/api/calendar').set(bearer(context.tokens.buyer));

    expect(response.status).toBe(200);
    expect(response.body.holidays).toEqual(['2030-12-24', '2030-12-25']);
    expect(response.body.holidayNames).toEqual({
      '2030-12-24': 'Plant shutdown: year end',
      '2030-12-25': 'Plant shutdown: year end',
    });
  });

  it('stay with the holidays a planner keeps, go with those removed, and a new holiday has none', async () => {
    const response = await request(context.app)
      .put('/api/calendar')
      .set(bearer(context.tokens.planner))
      .send({ workingWeekdays: [1, 2, 3, 4, 5], holidays: ['2030-12-25', '2030-12-27'] });

    expect(response.status).toBe(200);
    expect(response.body.holidays).toEqual(['2030-12-25', '2030-12-27']);
    expect(response.body.holidayNames).toEqual({ '2030-12-25': 'Plant shutdown: year end' });
  });

  it('are given to new holidays, and changed on kept ones, by the names sent beside them', async () => {
    const put = (body: object) =>
      request(context.app).put('/api/calendar').set(bearer(context.tokens.planner)).send(body);
    const response = await put({
      workingWeekdays: [1, 2, 3, 4, 5],
      holidays: ['2030-12-25', '2030-12-27', '2030-12-30'],
      holidayNames: { '2030-12-27': '  Stocktake  ', '2030-12-25': 'Year end' },
    });

    expect(response.status).toBe(200);
    expect(response.body.holidayNames).toEqual({ '2030-12-25': 'Year end', '2030-12-27': 'Stocktake' });
    // The trail names what changed, not the whole calendar before and after.
    const audit = await request(context.app).get('/api/audit').set(bearer(context.tokens.admin));
    const entry = audit.body.events.find(
      (event: { changes: Record<string, unknown> | null }) => event.changes && 'holidaysAdded' in event.changes,
    );
    expect(entry.changes).toEqual({
      holidaysAdded: ['2030-12-30'],
      holidaysRenamed: ['2030-12-25: Plant shutdown: year end → Year end', '2030-12-27: — → Stocktake'],
    });
    expect(entry.summary).toBe(
      'holidays added: 2030-12-30; holidays renamed: 2030-12-25: Plant shutdown: year end → Year end, 2030-12-27: — → Stocktake',
    );
  });

  it('refuses a name for a day that is no holiday, or one too long, and changes nothing', async () => {
    const put = (body: object) =>
      request(context.app).put('/api/calendar').set(bearer(context.tokens.planner)).send(body);
    const before = (await request(context.app).get('/api/calendar').set(bearer(context.tokens.planner))).body;

    const stray = await put({
      workingWeekdays: [1, 2, 3, 4, 5],
      holidays: ['2030-12-25'],
      holidayNames: { '2030-12-26': 'Boxing day' },
    });
    const long = await put({
      workingWeekdays: [1, 2, 3, 4, 5],
      holidays: ['2030-12-25'],
      holidayNames: { '2030-12-25': 'x'.repeat(81) },
    });

    expect(stray.status).toBe(400);
    expect(stray.body.error.details).toEqual([
      expect.objectContaining({ path: ['holidayNames', '2030-12-26'], message: 'names a day that is not a holiday' }),
    ]);
    expect(long.status).toBe(400);
    expect(long.body.error.details).toEqual([
      expect.objectContaining({ path: ['holidayNames', '2030-12-25'], message: 'at most 80 characters' }),
    ]);
    const after = (await request(context.app).get('/api/calendar').set(bearer(context.tokens.planner))).body;
    expect(after).toEqual(before);
  });
});
