import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { openDatabase, type Database } from '../../server/db/database';
import { plantToday } from '../../server/planning/plan-dates';
import { HISTORY_DAYS, buildDemoScenario } from '../../seed/scenario';
import { EARLY_SUPPLIER, LATE_SUPPLIER, OPEN_KANBAN, SHORT_SUPPLIER } from '../../seed/scenario-history';
import { COUNT_TO_CHECK, DUE_FOR_COUNT, OVERSIZED_LOOP, UNDERSIZED_LOOP } from '../../seed/scenario-stock';
import { readCountDue } from '../../server/stock/stock.service';
import { runSql } from '../../server/db/sql';
import { DockService } from '../../server/dock/dock.service';
import { LineRiskService } from '../../server/line-risk/line-risk.service';
import { LoopsService } from '../../server/loops/loops.service';
import { PlanningService } from '../../server/planning/planning.service';
import { SupplierPerformanceService } from '../../server/supplier-performance/supplier-performance.service';
import { createApp } from '../../server/app';
import { createServices } from '../../server/services';
import { addCalendarDays } from '../../shared/domain/calendar';
import type { LineRiskReport, ShortageDto } from '../../shared/schemas/line-risk';
import { DEMO_PASSWORD, seedDemoScenario } from '../../seed/seed-demo';
import { bearer, signIn } from './helpers';

let db: Database;
beforeAll(async () => {
  db = await openDatabase(':memory:');
  await seedDemoScenario(db, plantToday());
}, 120_000);
afterAll(() => db.close());

describe('the seeded demo plant', () => {
  it('starts in a steady state: the past weeks built, and on-hand what the ledger sums to', async () => {
    const built: { days: number; units: number }[] = await db.manager.query(
      "SELECT COUNT(DISTINCT date) AS days, COUNT(*) AS units FROM sequence_entry WHERE status = 'built'",
    );
    const mismatches = await db.manager.query(
      `SELECT p.part_number FROM part p LEFT JOIN stock_movement m ON m.part_number = p.part_number
       GROUP BY p.part_number, p.on_hand HAVING ABS(p.on_hand - COALESCE(SUM(m.qty), 0)) > 1e-6`,
    );
    const backflushed: { units: number }[] = await db.manager.query(
      "SELECT COUNT(DISTINCT ref) AS units FROM stock_movement WHERE kind = 'backflush'",
    );

    expect(Number(built[0].days)).toBe(HISTORY_DAYS);
    expect(Number(backflushed[0].units)).toBe(Number(built[0].units));
    expect(mismatches).toEqual([]);
  });

  it('leaves every unit from today on planned', async () => {
    const early: { n: number }[] = await runSql(
      db.manager,
      "SELECT COUNT(*) AS n FROM sequence_entry WHERE status <> 'built' AND date < ?",
      [plantToday()],
    );
    const late: { n: number }[] = await runSql(
      db.manager,
      "SELECT COUNT(*) AS n FROM sequence_entry WHERE status = 'built' AND date >= ?",
      [plantToday()],
    );

    expect(Number(early[0].n)).toBe(0);
    expect(Number(late[0].n)).toBe(0);
  });
});

describe('the demo plant’s story', () => {
  it('keeps exactly its three planted alarms; every other short part waits for the normal release', async () => {
    const lineRisk = new LineRiskService(db, new LoopsService(db, new PlanningService(db)));

    const shortages = await lineRisk.shortages();

    const alarms = shortages.filter((shortage) => shortage.action !== 'release');
    expect(alarms.map((shortage) => [shortage.action, shortage.partNumber])).toEqual([
      ['expedite', 'BAT-06-312'],
      ['loop', UNDERSIZED_LOOP.partNumber],
      ['count', COUNT_TO_CHECK],
    ]);
    expect(shortages.filter((shortage) => shortage.action === 'release').length).toBeGreaterThan(0);
  });

  it('has only its planted parts due a count, on whatever day it starts', async () => {
    // The 90-day interval is measured from today: the other parts' counts are dated close enough
    // to the opening that none of them crosses it as the day the demo starts moves.
    const due = await readCountDue(db.manager);

    expect([...due].sort()).toEqual([COUNT_TO_CHECK, ...DUE_FOR_COUNT].sort());
  });

  it('has loops at their recommendation but two: one short of cards, one with cards to take out', async () => {
    const loops = await new LoopsService(db, new PlanningService(db)).listLoops();

    const resize = loops.filter((loop) => loop.proposal.action !== 'none');
    expect(resize.map((loop) => loop.partNumber).sort()).toEqual(
      [UNDERSIZED_LOOP.partNumber, OVERSIZED_LOOP.partNumber].sort(),
    );
    expect(loops.filter((loop) => loop.activeCards > 0).length).toBe(loops.length);
  });

  it('has deliveries due at the dock on the first day, one late, and one supplier answer waiting for the buyer', async () => {
    const firstDay = buildDemoScenario(plantToday()).sequence[0]!.date;

    const dock = await new DockService(db).list();

    const dueFirstDay = dock.filter((item) => item.arrivalDate === firstDay).flatMap((item) => item.lines);
    expect(dueFirstDay.map((line) => line.partNumber).sort()).toEqual([...OPEN_KANBAN.dueToday].sort());
    const late = dock.filter((item) => item.overdue);
    expect(late.map((item) => item.supplierCode)).toEqual([LATE_SUPPLIER]);
    const waiting: { n: number }[] = await db.manager.query(
      "SELECT COUNT(*) AS n FROM release WHERE status = 'exception'",
    );
    expect(Number(waiting[0].n)).toBe(1);
  });

  it('has one card emptied at the line the day before, waiting for the first release run', async () => {
    const empty: { partNumber: string }[] = await db.manager.query(
      `SELECT l.part_number AS "partNumber" FROM kanban_card c JOIN kanban_loop l ON l.id = c.loop_id
       WHERE c.state = 'empty'`,
    );

    expect(empty.map((card) => card.partNumber)).toEqual([OPEN_KANBAN.emptied]);
  });

  it('scores a late supplier, a short delivery and an early one from the weeks before', async () => {
    const performance = await new SupplierPerformanceService(db).performance({});
    const total = (code: string, key: 'lines' | 'lateLines' | 'earlyLines' | 'requestedQty' | 'filledQty') =>
      performance.filter((month) => month.supplierCode === code).reduce((sum, month) => sum + month[key], 0);

    expect(total(LATE_SUPPLIER, 'lateLines') / total(LATE_SUPPLIER, 'lines')).toBeGreaterThan(0.5);
    expect(total(SHORT_SUPPLIER, 'filledQty')).toBeLessThan(total(SHORT_SUPPLIER, 'requestedQty'));
    expect(total(EARLY_SUPPLIER, 'earlyLines')).toBeGreaterThan(0);
    const shortReceipts: { n: number }[] = await runSql(
      db.manager,
      "SELECT COUNT(*) AS n FROM receipt WHERE discrepancy = 'short' AND final = ?",
      [true],
    );
    expect(Number(shortReceipts[0].n)).toBeGreaterThan(0);
  });

  it('has sent every release by e-mail, with no live confirmation link left in the Outbox', async () => {
    const releases: { number: string }[] = await db.manager.query('SELECT number FROM release');
    const mail: { ref: string; status: string; text: string }[] = await db.manager.query(
      'SELECT ref, status, text FROM outbox_message',
    );

    expect(mail.map((message) => message.ref).sort()).toEqual(
      releases.map((release) => `release:${release.number}`).sort(),
    );
    for (const message of mail) {
      expect(message.status).toBe('sent');
      expect(message.text).toContain('/confirm/[link removed after sending]');
    }
  });

  it('dates every stock count on a weekday, as the plant works Monday to Friday', async () => {
    const counted: { lastCountedAt: string | null }[] = await db.manager.query(
      'SELECT last_counted_at AS "lastCountedAt" FROM part',
    );
    const dates = counted.flatMap((part) => (part.lastCountedAt ? [new Date(part.lastCountedAt)] : []));

    expect(dates.length).toBeGreaterThan(50);
    expect(dates.filter((date) => date.getUTCDay() === 0 || date.getUTCDay() === 6)).toEqual([]);
  });

  it('names its holidays as plant shutdown days', async () => {
    const holidays: { date: string; name: string }[] = await db.manager.query('SELECT date, name FROM plant_holiday');

    expect(holidays.length).toBeGreaterThan(0);
    for (const holiday of holidays) expect(holiday.name).toMatch(/^Plant shutdown: /);
  });
});

describe('the demo plant’s Line risk after the first release run', () => {
  it('shows in the 4-week view only the three planted alarms, through GET /api/shortages and GET /api/line-risk', async () => {
    const options = { jwtSecret: 'demo-seed-secret-demo-seed-secret-0000' };
    const app = createApp(db, options, createServices(db, options));
    const buyer = bearer(await signIn(app, 'buyer@example.com', DEMO_PASSWORD));
    const planner = bearer(await signIn(app, 'planner@example.com', DEMO_PASSWORD));
    const today = plantToday();
    // The screen's "4 weeks": today and the 27 calendar days after it.
    const fourWeeks = { from: today, to: addCalendarDays(today, 27) };

    const run = await request(app).post('/api/releases/run').set(buyer).set('Idempotency-Key', 'demo-run').send({
      date: today,
    });
    const shortages = await request(app).get('/api/shortages').query(fourWeeks).set(planner);
    const report = await request(app).get('/api/line-risk').query(fourWeeks).set(planner);

    expect(run.status).toBe(200);
    expect(run.body.releases.length).toBeGreaterThan(0);
    expect(shortages.status).toBe(200);
    expect(report.status).toBe(200);
    const planted = [
      ['expedite', 'BAT-06-312'],
      ['loop', UNDERSIZED_LOOP.partNumber],
      ['count', COUNT_TO_CHECK],
    ];
    const alarmsOf = (list: ShortageDto[]) =>
      list
        .filter((shortage) => shortage.action !== 'release')
        .map((shortage) => [shortage.action, shortage.partNumber]);
    expect(alarmsOf(shortages.body)).toEqual(planted);
    expect(alarmsOf((report.body as LineRiskReport).shortages)).toEqual(planted);
    // Every other short part is covered by a release still to be sent, by a day not yet past.
    for (const shortage of shortages.body as ShortageDto[]) {
      if (shortage.action === 'release') expect(shortage.releaseBy! >= today).toBe(true);
    }
  });
});

describe('the demo plant seeded on each day of a week', () => {
  // The story's dates follow the day the demo starts, and the supplier's delivery weekdays decide
  // which releases fall on the same day; every weekday must give the same story.
  const week = Array.from({ length: 7 }, (_, index) => addCalendarDays('2027-03-01', index));

  it.each(week)(
    'seeds on %s with its dock story, one release per supplier and day, each e-mailed',
    async (day) => {
      // Only the clock is faked: loop sizing and the dock read the plant's today from it.
      vi.useFakeTimers({ toFake: ['Date'] });
      vi.setSystemTime(new Date(`${day}T10:00:00`));
      const plant = await openDatabase(':memory:');
      try {
        await seedDemoScenario(plant, day);
        const firstDay = buildDemoScenario(day).sequence[0]!.date;

        const dock = await new DockService(plant).list();
        const mismatches = await plant.manager.query(
          `SELECT p.part_number FROM part p LEFT JOIN stock_movement m ON m.part_number = p.part_number
         GROUP BY p.part_number, p.on_hand HAVING ABS(p.on_hand - COALESCE(SUM(m.qty), 0)) > 1e-6`,
        );
        const releases: { number: string }[] = await plant.manager.query('SELECT number FROM release');
        const mail: { ref: string }[] = await plant.manager.query('SELECT ref FROM outbox_message');

        const dueFirstDay = dock.filter((item) => item.arrivalDate === firstDay).flatMap((item) => item.lines);
        expect(dueFirstDay.map((line) => line.partNumber).sort()).toEqual([...OPEN_KANBAN.dueToday].sort());
        const late = dock.filter((item) => item.overdue);
        expect(late.map((item) => [item.supplierCode, item.lines.filter((line) => line.open).length])).toEqual([
          [LATE_SUPPLIER, 1],
        ]);
        expect(dock.filter((item) => item.status === 'exception').map((item) => item.lines[0]!.partNumber)).toEqual([
          OPEN_KANBAN.exception,
        ]);
        expect(mismatches).toEqual([]);
        expect(mail.map((message) => message.ref).sort()).toEqual(
          releases.map((release) => `release:${release.number}`).sort(),
        );
      } finally {
        await plant.close();
        vi.useRealTimers();
      }
    },
    120_000,
  );
});
