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
});
