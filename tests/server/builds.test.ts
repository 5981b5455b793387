import request from 'supertest';
import { afterAll, beforeEach, describe, expect, it } from 'vitest';
import { BuildsService } from '../../server/builds/builds.service';
import { CloseDayJob } from '../../server/builds/close-day-job';
import { writeCalendar } from '../../server/calendar/calendar.service';
import { replaceBomLines } from '../../server/master-data/master-data.writer';
import { plantToday } from '../../server/planning/plan-dates';
import { SequenceEntryEntity } from '../../server/sequence/sequence-entry.entity';
import { upsertSequenceEntries } from '../../server/sequence/sequence.writer';
import { StockMovementEntity } from '../../server/stock/stock-movement.entity';
import { savePartsWithStock } from '../../server/stock/stock.service';
import { bearer, createTestContext, signIn, TEST_PASSWORD, testPart, type TestContext } from './helpers';

let context: TestContext;
const today = plantToday();

// Model M: 1 frame FRM (made: 2 kg of steel each), 2 batteries BAT, 8 bolts BOLT (5 % scrap
// allowance, which a build does not consume). One frame is in stock.
beforeEach(async () => {
  await context?.close();
  context = await createTestContext();
  await context.db.write(async (manager) => {
    await writeCalendar(manager, { workingWeekdays: [1, 2, 3, 4, 5, 6, 7], holidays: [] });
    await savePartsWithStock(manager, [
      testPart('M', { source: 'end_item', supplierCode: null, replenishment: null }),
      testPart('FRM', { source: 'make', supplierCode: null, onHand: 1, pointOfUse: 'ST1' }),
      testPart('STEEL', { uom: 'KGM', onHand: 100 }),
      testPart('BAT', { onHand: 3, pointOfUse: 'ST2', hazardous: true }),
      testPart('BOLT', { onHand: 50, pointOfUse: 'ST1' }),
    ]);
    await replaceBomLines(manager, [
      { parent: 'M', component: 'FRM', qtyPer: 1, scrapPct: 0, effectiveFrom: null, effectiveTo: null },
      { parent: 'M', component: 'BAT', qtyPer: 2, scrapPct: 0, effectiveFrom: null, effectiveTo: null },
      { parent: 'M', component: 'BOLT', qtyPer: 8, scrapPct: 5, effectiveFrom: null, effectiveTo: null },
      { parent: 'FRM', component: 'STEEL', qtyPer: 2, scrapPct: 0, effectiveFrom: null, effectiveTo: null },
    ]);
    await upsertSequenceEntries(manager, [
      { date: today, sequence: 1, model: 'M', serial: 'SN1', qty: 1 },
      { date: today, sequence: 2, model: 'M', serial: 'SN2', qty: 1 },
      { date: today, sequence: 3, model: 'M', serial: 'SN3', qty: 1 },
    ]);
  });
});
afterAll(() => context.close());

const build = (serial: string, key: string, token = context.tokens.line) =>
  request(context.app).post('/api/builds').set(bearer(token)).set('Idempotency-Key', key).send({ serial });
const onHand = async () =>
  Object.fromEntries(
    (await context.dataSource.query('SELECT part_number, on_hand FROM part ORDER BY part_number')).map(
      (row: { part_number: string; on_hand: number }) => [row.part_number, row.on_hand],
    ),
  );
const statusOf = async (serial: string) =>
  (await context.dataSource.getRepository(SequenceEntryEntity).findOneByOrFail({ serial })).status;

describe('POST /api/builds', () => {
  it('backflushes a built unit at the BOM quantity: the frame from stock, batteries and bolts', async () => {
    const response = await build('SN1', 'key-1');

    expect(response.status).toBe(201);
    expect(response.body).toMatchObject({ serial: 'SN1', status: 'built', builtAt: expect.any(String) });
    expect(response.body.movements).toEqual([
      { partNumber: 'BAT', qty: -2 },
      { partNumber: 'BOLT', qty: -8 },
      { partNumber: 'FRM', qty: -1 },
    ]);
    expect(await onHand()).toEqual({ BAT: 1, BOLT: 42, FRM: 0, M: 0, STEEL: 100 });
    expect(await statusOf('SN1')).toBe('built');
  });

  it('explodes through a made frame that is out of stock, and lets a bought part go negative', async () => {
    await build('SN1', 'key-1');

    const second = await build('SN2', 'key-2');

    expect(second.body.movements).toEqual([
      { partNumber: 'BAT', qty: -2 },
      { partNumber: 'BOLT', qty: -8 },
      { partNumber: 'STEEL', qty: -2 },
    ]);
    expect(await onHand()).toMatchObject({ BAT: -1, FRM: 0, STEEL: 98 });
  });

  it('answers a replayed key with the first body and consumes nothing twice; another body with it is 409', async () => {
    const first = await build('SN1', 'same-key');
    const replay = await build('SN1', 'same-key');
    const otherBody = await build('SN2', 'same-key');

    expect(replay.status).toBe(200);
    expect(replay.body).toEqual(first.body);
    expect(otherBody.status).toBe(409);
    expect(otherBody.body.error.code).toBe('idempotency_key_reused');
    expect(await onHand()).toMatchObject({ BAT: 1, BOLT: 42 });
  });

  it('consumes a unit once when parallel requests report it, with the same key or different keys', async () => {
    const sameKey = await Promise.all(Array.from({ length: 5 }, () => build('SN1', 'race-1')));
    const otherKeys = await Promise.all(Array.from({ length: 5 }, (_, index) => build('SN2', `race-2-${index}`)));

    expect(sameKey.map((response) => response.status).sort()).toEqual([200, 200, 200, 200, 201]);
    expect(otherKeys.map((response) => response.status).sort()).toEqual([201, 409, 409, 409, 409]);
    expect(
      otherKeys.filter((response) => response.status === 409).every((r) => r.body.error.code === 'already_built'),
    ).toBe(true);
    const backflushed = await context.dataSource.getRepository(StockMovementEntity).countBy({ kind: 'backflush' });
    expect(backflushed).toBe(6);
  });

  it('refuses a unit not in the sequence (404), a missing key (400) and a viewer (403), changing nothing', async () => {
    const before = await onHand();

    const unknown = await build('NOPE', 'key-x');
    const noKey = await request(context.app)
      .post('/api/builds')
      .set(bearer(context.tokens.line))
      .send({ serial: 'SN1' });
    const viewer = await build('SN1', 'key-y', context.tokens.viewer);
    const blank = await request(context.app)
      .post('/api/builds')
      .set(bearer(context.tokens.line))
      .set('Idempotency-Key', 'key-z')
      .send({ serial: '' });

    expect([unknown.status, noKey.status, viewer.status, blank.status]).toEqual([404, 400, 403, 400]);
    expect(noKey.body.error.details[0].path).toEqual(['Idempotency-Key']);
    expect(await onHand()).toEqual(before);
  });
});

describe('DELETE /api/builds/:serial', () => {
  it('puts the parts back with the opposite movements and plans the unit again', async () => {
    await build('SN1', 'key-1');

    const undone = await request(context.app)
      .delete('/api/builds/SN1')
      .query({ reason: 'Reported the wrong serial' })
      .set(bearer(context.tokens.planner));

    expect(undone.status).toBe(200);
    expect(undone.body.movements).toEqual([
      { partNumber: 'BAT', qty: 2 },
      { partNumber: 'BOLT', qty: 8 },
      { partNumber: 'FRM', qty: 1 },
    ]);
    expect(await onHand()).toEqual({ BAT: 3, BOLT: 50, FRM: 1, M: 0, STEEL: 100 });
    expect(await statusOf('SN1')).toBe('planned');
  });

  it('needs a reason, refuses an unbuilt unit, and lets the line undo only its own recent build', async () => {
    await build('SN1', 'key-1', context.tokens.planner);
    const otherLine = await signIn(context.app, 'line@example.com', TEST_PASSWORD);

    const noReason = await request(context.app).delete('/api/builds/SN1').set(bearer(context.tokens.planner));
    const notBuilt = await request(context.app)
      .delete('/api/builds/SN2')
      .query({ reason: 'x' })
      .set(bearer(context.tokens.planner));
    const byLine = await request(context.app)
      .delete('/api/builds/SN1')
      .query({ reason: 'oops' })
      .set(bearer(otherLine));

    expect(noReason.status).toBe(400);
    expect(notBuilt.status).toBe(409);
    expect(notBuilt.body.error.code).toBe('not_built');
    expect(byLine.status).toBe(403);
    expect(await statusOf('SN1')).toBe('built');
  });
});

describe('units at the line stay put', () => {
  const tomorrow = new Date(Date.parse(`${today}T00:00:00Z`) + 86_400_000).toISOString().slice(0, 10);
  const resequence = (days: { date: string; serials: string[] }[]) =>
    request(context.app)
      .put('/api/sequence/days')
      .set(bearer(context.tokens.planner))
      .send({ days, allowFrozen: true });
  const placeOf = async (serial: string) => {
    const entry = await context.dataSource.getRepository(SequenceEntryEntity).findOneByOrFail({ serial });
    return `${entry.date}#${entry.sequence}`;
  };

  it('keeps a built unit’s day and place, and keeps a started unit on its day, changing nothing when refused', async () => {
    await build('SN1', 'key-1');
    await request(context.app).post('/api/builds/SN2/start').set(bearer(context.tokens.line));

    const aheadOfBuilt = await resequence([{ date: today, serials: ['SN3', 'SN1', 'SN2'] }]);
    const startedAway = await resequence([
      { date: today, serials: ['SN1', 'SN3'] },
      { date: tomorrow, serials: ['SN2'] },
    ]);
    const removeBuilt = await request(context.app)
      .delete('/api/sequence/units/SN1')
      .query({ allowFrozen: true })
      .set(bearer(context.tokens.planner));
    const swapBehind = await resequence([{ date: today, serials: ['SN1', 'SN3', 'SN2'] }]);

    expect(aheadOfBuilt.status).toBe(409);
    expect(aheadOfBuilt.body.error.message).toContain("unit 'SN1' was built on");
    expect(startedAway.status).toBe(409);
    expect(startedAway.body.error.message).toContain("unit 'SN2' was started on");
    expect(removeBuilt.status).toBe(409);
    expect(removeBuilt.body.error.message).toContain('reverse it at the line end');
    // A started unit may still change place within its day.
    expect(swapBehind.status).toBe(200);
    expect([await placeOf('SN1'), await placeOf('SN2'), await placeOf('SN3')]).toEqual([
      `${today}#1`,
      `${today}#3`,
      `${today}#2`,
    ]);
  });

  it('refuses a schedule import that would move or change a built unit, naming the row', async () => {
    await build('SN1', 'key-1');

    const upload = await request(context.app)
      .post('/api/imports/schedule')
      .set(bearer(context.tokens.planner))
      .attach('file', Buffer.from(`date,sequence,model,serial,qty\n${tomorrow},1,M,SN1,1\n`), 'schedule.csv');

    expect(upload.status).toBe(422);
    expect(upload.body.error.details).toEqual([
      expect.objectContaining({ row: 2, column: 'serial', message: expect.stringContaining('its day cannot change') }),
    ]);
    expect(await placeOf('SN1')).toBe(`${today}#1`);
  });
});

describe('POST /api/builds/close-day', () => {
  it('builds every unit of the day not yet built, in sequence order, in one go, and only the planner may', async () => {
    await build('SN2', 'key-2');

    const byLine = await request(context.app)
      .post('/api/builds/close-day')
      .set(bearer(context.tokens.line))
      .send({ date: today });
    const closed = await request(context.app)
      .post('/api/builds/close-day')
      .set(bearer(context.tokens.planner))
      .send({ date: today });
    const again = await request(context.app)
      .post('/api/builds/close-day')
      .set(bearer(context.tokens.planner))
      .send({ date: today });

    expect(byLine.status).toBe(403);
    expect(closed.status).toBe(200);
    expect(closed.body.built).toEqual(['SN1', 'SN3']);
    expect(again.body.built).toEqual([]);
    // SN2 took the frame in stock; SN1 and SN3 have theirs made from 2 kg of steel each.
    expect(await onHand()).toEqual({ BAT: -3, BOLT: 26, FRM: 0, M: 0, STEEL: 96 });
  });
});

describe('kits', () => {
  it('lists a unit’s direct components by point of use, at the BOM quantity', async () => {
    const kit = await request(context.app).get('/api/builds/SN1/kit').set(bearer(context.tokens.line));

    expect(kit.status).toBe(200);
    expect(kit.body).toMatchObject({ serial: 'SN1', model: 'M', date: today, sequence: 1, status: 'planned' });
    expect(kit.body.pointsOfUse).toEqual([
      {
        pointOfUse: 'ST1',
        lines: [
          expect.objectContaining({ partNumber: 'BOLT', qty: 8, source: 'buy' }),
          expect.objectContaining({ partNumber: 'FRM', qty: 1, source: 'make' }),
        ],
      },
      { pointOfUse: 'ST2', lines: [expect.objectContaining({ partNumber: 'BAT', qty: 2, hazardous: true })] },
    ]);
  });

  it('gives a whole day’s kits in sequence order, and starting a unit marks it started', async () => {
    const day = await request(context.app)
      .get('/api/builds/kits')
      .query({ date: today })
      .set(bearer(context.tokens.line));
    const started = await request(context.app).post('/api/builds/SN2/start').set(bearer(context.tokens.line));

    expect(day.body.map((kit: { serial: string }) => kit.serial)).toEqual(['SN1', 'SN2', 'SN3']);
    expect(started.body.status).toBe('started');
    expect(await statusOf('SN2')).toBe('started');
  });
});

describe('planning follows the built units', () => {
  it('stops counting a built unit as demand', async () => {
    const before = await request(context.app)
      .get('/api/demand')
      .query({ from: today, to: today })
      .set(bearer(context.tokens.buyer));
    await build('SN1', 'key-1');
    const after = await request(context.app)
      .get('/api/demand')
      .query({ from: today, to: today })
      .set(bearer(context.tokens.buyer));

    const batteries = (body: { rows: { partNumber: string; total: number }[] }) =>
      body.rows.find((row) => row.partNumber === 'BAT')?.total;
    expect(batteries(before.body)).toBe(6);
    expect(batteries(after.body)).toBe(4);
  });
});

describe('the end-of-shift job', () => {
  it('is off by default, and once set closes the day at its time, once', async () => {
    const job = new CloseDayJob(context.db, new BuildsService(context.db));
    const at = (time: string) => new Date(`${today}T${time}:00`);

    const whileOff = await job.tick(at('23:00'));
    const set = await request(context.app)
      .put('/api/builds/settings')
      .set(bearer(context.tokens.admin))
      .send({ closeDayTime: '22:00' });
    const early = await job.tick(at('21:59'));
    const due = await job.tick(at('22:01'));
    const again = await job.tick(at('22:30'));

    expect(whileOff).toBeNull();
    expect(set.body).toEqual({ closeDayTime: '22:00' });
    expect(early).toBeNull();
    expect(due?.built).toEqual(['SN1', 'SN2', 'SN3']);
    expect(again).toBeNull();
    expect(await statusOf('SN3')).toBe('built');
  });

  it('is set by the admin only, and switched off with null', async () => {
    const byPlanner = await request(context.app)
      .put('/api/builds/settings')
      .set(bearer(context.tokens.planner))
      .send({ closeDayTime: '22:00' });
    await request(context.app)
      .put('/api/builds/settings')
      .set(bearer(context.tokens.admin))
      .send({ closeDayTime: '22:00' });
    await request(context.app)
      .put('/api/builds/settings')
      .set(bearer(context.tokens.admin))
      .send({ closeDayTime: null });
    const read = await request(context.app).get('/api/builds/settings').set(bearer(context.tokens.viewer));

    expect(byPlanner.status).toBe(403);
    expect(read.body).toEqual({ closeDayTime: null });
  });
});
