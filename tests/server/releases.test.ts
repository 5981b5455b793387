import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEventEntity } from '../../server/audit/audit-event.entity';
import { writeCalendar } from '../../server/calendar/calendar.service';
import { ReleaseJob } from '../../server/releases/release-job';
import { CardScanEntity } from '../../server/loops/card-scan.entity';
import { KanbanCardEntity } from '../../server/loops/kanban-card.entity';
import { KanbanLoopEntity } from '../../server/loops/kanban-loop.entity';
import { syncLoops } from '../../server/loops/loop-sync';
import { OutboxMessageEntity } from '../../server/outbox/outbox-message.entity';
import { replaceBomLines } from '../../server/master-data/master-data.writer';
import { savePartsWithStock } from '../../server/stock/stock.service';
import { upsertSequenceEntries } from '../../server/sequence/sequence.writer';
import { PlanningService } from '../../server/planning/planning.service';
import { EXPEDITE_NOTE, HAZARDOUS_NOTE } from '../../server/releases/release-mail';
import { ReleasesService, RELEASE_JOB_LAST_RUN } from '../../server/releases/releases.service';
import { writeSetting } from '../../server/settings/settings';
import { readPlanningVersion } from '../../server/settings/versions';
import { cardNumber } from '../../shared/domain/gs1';
import { releaseNumber } from '../../shared/domain/release-rules';
import { SupplierEntity } from '../../server/master-data/supplier.entity';
import type { Release, RunReleasesResponse } from '../../shared/schemas/releases';
import { bearer, createTestContext, testPart, type TestContext } from './helpers';
import { runSql } from '../../server/db/sql';
import { readShipNotices } from '../../server/ship-notices/ship-notices.service';

const APP_URL = 'https://cardloop.example.com';

let context: TestContext;

/*
 * Fixture, on a Monday–Friday calendar without holidays; the run date is Monday 1 March 2027.
 * Suppliers (from helpers): SUP-A delivers every working day; SUP-B here on Thursdays only.
 *
 * Kanban parts, one supplier loop each:
 * - K from SUP-A, lead time 2, container 10: cards 1 and 2 empty, card 3 full, card 4 empty but
 *   pulled (retired).
 * - H from SUP-B, lead time 5, container 4, hazardous: card 1 empty.
 * Scheduled parts (bought), under end item M (1 × P and 2 × Q per unit):
 * - P from SUP-A: lead time 2 working days, pack 5, on hand 3.
 * - Q from SUP-B: lead time 3 working days, pack 1, on hand 20.
 * Sequence of M: 4 on Mon 1 Mar, 6 on Wed 3 Mar, 10 on Mon 8 Mar.
 */
const RUN_DATE = '2027-03-01';

async function seedFixture(): Promise<void> {
  await context.dataSource.transaction(async (manager) => {
    await writeCalendar(manager, { workingWeekdays: [1, 2, 3, 4, 5], holidays: [] });
    await manager.update(SupplierEntity, { code: 'SUP-B' }, { deliveryWeekdays: [4] });
    await savePartsWithStock(manager, [
      testPart('M', { source: 'end_item', supplierCode: null, replenishment: null }),
      testPart('K', { packQty: 10, leadTimeDays: 2, description: 'Caster 100 mm' }),
      testPart('H', {
        packQty: 4,
        leadTimeDays: 5,
        supplierCode: 'SUP-B',
        hazardous: true,
        description: 'Battery 6 V',
      }),
      testPart('P', { replenishment: 'scheduled', leadTimeDays: 2, packQty: 5, onHand: 3, description: 'Side panel' }),
      testPart('Q', { replenishment: 'scheduled', supplierCode: 'SUP-B', leadTimeDays: 3, packQty: 1, onHand: 20 }),
    ]);
    const line = (component: string, qtyPer: number) => ({
      parent: 'M',
      component,
      qtyPer,
      scrapPct: 0,
      effectiveFrom: null,
      effectiveTo: null,
    });
    await replaceBomLines(manager, [line('P', 1), line('Q', 2)]);
    await upsertSequenceEntries(manager, [
      { date: '2027-03-01', sequence: 1, model: 'M', serial: 'U1', qty: 4 },
      { date: '2027-03-03', sequence: 1, model: 'M', serial: 'U2', qty: 6 },
      { date: '2027-03-08', sequence: 1, model: 'M', serial: 'U3', qty: 10 },
    ]);
    await syncLoops(manager);
    const loops = await manager.find(KanbanLoopEntity);
    const loopOf = (partNumber: string) => loops.find((loop) => loop.partNumber === partNumber)!.id;
    const now = new Date().toISOString();
    const card = (partNumber: string, cardIndex: number, state: string, retiredAt: string | null = null) => ({
      loopId: loopOf(partNumber),
      cardIndex,
      cardNumber: cardNumber(loopOf(partNumber), cardIndex),
      state,
      stateChangedAt: now,
      retiredAt,
      releaseLineId: null,
    });
    await manager.insert(KanbanCardEntity, [
      card('K', 1, 'empty'),
      card('K', 2, 'empty'),
      card('K', 3, 'full'),
      card('K', 4, 'empty', now),
      card('H', 1, 'empty'),
    ]);
  });
}

function run(date: string, role: keyof TestContext['tokens'] = 'buyer') {
  return request(context.app).post('/api/releases/run').set(bearer(context.tokens[role])).send({ date });
}

function cardOf(partNumber: string, cardIndex: number) {
  return context.dataSource.manager
    .createQueryBuilder(KanbanCardEntity, 'card')
    .innerJoin(KanbanLoopEntity, 'loop', 'loop.id = card.loopId')
    .where('loop.partNumber = :partNumber AND card.cardIndex = :cardIndex', { partNumber, cardIndex })
    .getOneOrFail();
}

function mailsTo(address: string) {
  return context.dataSource.getRepository(OutboxMessageEntity).find({ where: { to: address }, order: { id: 'ASC' } });
}

function tokenIn(text: string): string {
  const match = text.match(new RegExp(`${APP_URL.replace(/\./g, '\\.')}/confirm/([A-Za-z0-9_-]+)`));
  if (!match) throw new Error('no confirmation link in the mail');
  return match[1];
}

let firstRun: RunReleasesResponse;
let versionBefore: number;

beforeAll(async () => {
  context = await createTestContext({ appUrl: APP_URL });
  await seedFixture();
  versionBefore = await readPlanningVersion(context.dataSource.manager);
  const response = await run(RUN_DATE);
  expect(response.status).toBe(200);
  firstRun = response.body;
});
afterAll(async () => {
  await context.close();
});

describe('POST /api/releases/run', () => {
  it('builds one release per supplier from empty cards and due planned releases', () => {
    // Kanban lines: one per empty card in circulation, qty = container, needed on the supplier's
    // first delivery day once its lead time has passed (the loop's T = lead time plus one delivery
    // interval covers the wait):
    //   K (SUP-A, every day, LT 2): Mon 1 Mar + 2 working days = Wed 3 Mar;
    //   H (SUP-B, Thursdays, LT 5): Mon 1 Mar + 5 = Mon 8 Mar → next Thursday, Thu 11 Mar.
    // Planned lines, worked by hand with the MRP record's rules (gross-to-net against on hand,
    // lot-for-lot rounded up to packs, release = receipt − lead time; Vollmann, Berry, Whybark and
    // Jacobs, "Manufacturing Planning and Control for Supply Chain Management", 5th ed., ch. 6,
    // from memory), each receipt then brought forward to the supplier's last delivery day on or
    // before it and ordered a lead time before that:
    //   P (SUP-A, on hand 3, pack 5, LT 2): Mon 1 Mar gross 4 → net 1 → receipt 5 on Mon 1 Mar,
    //     released Thu 25 Feb (past due): ordered today it can come Wed 3 Mar at the earliest, so it
    //     is an expedite asked for Mon 1 Mar; Wed 3 Mar gross 6 on 4 available → net 2 → receipt 5,
    //     due today; Mon 8 Mar gross 10 on 3 → receipt 10, ordered Thu 4 Mar, not yet due.
    //   Q (SUP-B, on hand 20, LT 3): 8 and 12 use up the stock; Mon 8 Mar needs 20. The plan would
    //     release it Wed 3 Mar, but SUP-B brings it on Thursday 4 Mar, which must be ordered today.
    expect(firstRun.date).toBe(RUN_DATE);
    expect(firstRun.existing).toEqual([]);
    const summary = firstRun.releases.map((release) => ({
      number: release.number,
      supplierCode: release.supplierCode,
      status: release.status,
      lines: release.lines.map(({ partNumber, qty, needDate, origin, expedite }) => ({
        partNumber,
        qty,
        needDate,
        origin,
        expedite,
      })),
    }));
    expect(summary).toEqual([
      {
        number: 'R270301-SUP-A',
        supplierCode: 'SUP-A',
        status: 'sent',
        lines: [
          { partNumber: 'P', qty: 5, needDate: '2027-03-01', origin: 'plan', expedite: true },
          { partNumber: 'K', qty: 10, needDate: '2027-03-03', origin: 'kanban', expedite: false },
          { partNumber: 'K', qty: 10, needDate: '2027-03-03', origin: 'kanban', expedite: false },
          { partNumber: 'P', qty: 5, needDate: '2027-03-03', origin: 'plan', expedite: false },
        ],
      },
      {
        number: 'R270301-SUP-B',
        supplierCode: 'SUP-B',
        status: 'sent',
        lines: [
          { partNumber: 'Q', qty: 20, needDate: '2027-03-04', origin: 'plan', expedite: false },
          { partNumber: 'H', qty: 4, needDate: '2027-03-11', origin: 'kanban', expedite: false },
        ],
      },
    ]);
    expect(firstRun.releases[0].lines[0]).toMatchObject({
      id: expect.any(Number),
      confirmedQty: null,
      shipDate: null,
      receivedQty: 0,
      closed: false,
    });
  });

  it('creates nothing new when the same date runs again', async () => {
    const again = await run(RUN_DATE);

    expect(again.status).toBe(200);
    expect(again.body).toEqual({ date: RUN_DATE, releases: [], existing: ['R270301-SUP-A', 'R270301-SUP-B'] });
    const all = await request(context.app).get('/api/releases').set(bearer(context.tokens.buyer));
    expect(all.body.map((release: Release) => release.number)).toEqual(['R270301-SUP-A', 'R270301-SUP-B']);
    expect(await mailsTo('orders@supplier-a.example.com')).toHaveLength(1);
  });

  it('moves the released cards to ordered with a scan logged, and leaves full and pulled cards alone', async () => {
    const lineIds = firstRun.releases[0].lines.filter((line) => line.origin === 'kanban').map((line) => line.id);
    const [card1, card2, card3, card4] = await Promise.all([1, 2, 3, 4].map((index) => cardOf('K', index)));

    expect([card1.state, card2.state, card3.state, card4.state]).toEqual(['ordered', 'ordered', 'full', 'empty']);
    expect([card1.releaseLineId, card2.releaseLineId].sort()).toEqual([...lineIds].sort());
    const scans = await context.dataSource.getRepository(CardScanEntity).findBy({ cardId: card1.id });
    expect(scans).toEqual([
      expect.objectContaining({
        event: 'release',
        fromState: 'empty',
        toState: 'ordered',
        userEmail: 'buyer@example.com',
      }),
    ]);
    expect(firstRun.releases[0].lines.find((line) => line.id === card1.releaseLineId)?.cardNumber).toBe(
      card1.cardNumber,
    );
  });

  it('queues one e-mail per release whose link opens the confirmation page', async () => {
    const [mailA] = await mailsTo('orders@supplier-a.example.com');
    const [mailB] = await mailsTo('orders@supplier-b.example.net');

    expect(mailA.subject).toContain('R270301-SUP-A');
    expect(mailA.text).toContain('Side panel');
    expect(mailA.text).toContain('2027-03-03');
    expect(mailA.html).toContain('R270301-SUP-A');
    expect(mailA.text).not.toContain(HAZARDOUS_NOTE);
    expect(mailB.text).toContain(HAZARDOUS_NOTE);
    // One expedite line on SUP-A's release (P for Mon 1 Mar), none on SUP-B's.
    expect(mailA.text.split(EXPEDITE_NOTE)).toHaveLength(2);
    expect(mailA.html).toContain('Expedite');
    expect(mailB.text).not.toContain(EXPEDITE_NOTE);
    const page = await request(context.app).get(`/api/confirm/${tokenIn(mailA.text)}`);
    expect(page.status).toBe(200);
    expect(page.body.release).toMatchObject({
      number: 'R270301-SUP-A',
      supplierCode: 'SUP-A',
      supplierName: 'Supplier A',
    });
    expect(page.body.release.lines).toHaveLength(4);
  });

  it('records the run and each release in the audit trail and bumps the planning version', async () => {
    const audit = context.dataSource.getRepository(AuditEventEntity);

    expect(await audit.findBy({ entity: 'release', action: 'create', entityKey: 'R270301-SUP-A' })).toHaveLength(1);
    expect(await audit.findBy({ entity: 'release_run', entityKey: RUN_DATE })).toHaveLength(2);
    expect(await readPlanningVersion(context.dataSource.manager)).toBeGreaterThan(versionBefore);
  });

  it('does not order again on a later day what open lines already cover', async () => {
    // On Tue 2 Mar the plan counts the open lines of P (5 on 1 Mar, 5 on 3 Mar) as scheduled
    // receipts: 3 + 5 + 5 − 6 = 7 left after Wed 3 Mar, so nothing is due before the 8 Mar need,
    // released Thu 4 Mar. Without them, Wed 3 Mar would be short and a line would be released now.
    const response = await run('2027-03-02');

    expect(response.status).toBe(200);
    expect(response.body.releases).toEqual([]);
  });

  it('refuses a viewer (403) and a date that is not a date (400)', async () => {
    const viewer = await run('2027-03-04', 'viewer');
    const bad = await run('2027-02-30');

    expect(viewer.status).toBe(403);
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('invalid_input');
  });
});

describe('GET /api/releases', () => {
  it('filters by status and date', async () => {
    const sent = await request(context.app)
      .get('/api/releases?status=sent&date=2027-03-01')
      .set(bearer(context.tokens.viewer));
    const none = await request(context.app).get('/api/releases?status=received').set(bearer(context.tokens.viewer));

    expect(sent.body).toHaveLength(2);
    expect(none.body).toEqual([]);
  });

  it('shows a supplier account only its own releases, and another supplier’s as 404', async () => {
    const list = await request(context.app).get('/api/releases').set(bearer(context.tokens.supplier));
    const own = await request(context.app).get('/api/releases/R270301-SUP-A').set(bearer(context.tokens.supplier));
    const other = await request(context.app).get('/api/releases/R270301-SUP-B').set(bearer(context.tokens.supplier));

    expect(list.body.map((release: Release) => release.supplierCode)).toEqual(['SUP-A']);
    expect(own.status).toBe(200);
    expect(own.body).toMatchObject({
      number: 'R270301-SUP-A',
      status: 'sent',
      sentAt: expect.any(String),
      confirmedAt: null,
      carrier: null,
    });
    expect(other.status).toBe(404);
    expect(other.body.error.code).toBe('not_found');
  });

  it('answers 404 for an unknown release number', async () => {
    const response = await request(context.app).get('/api/releases/R000000-NOPE').set(bearer(context.tokens.buyer));

    expect(response.status).toBe(404);
  });
});

describe('POST /api/releases/:number/resend', () => {
  it('sends a new link and the old one stops working', async () => {
    const [first] = await mailsTo('orders@supplier-a.example.com');
    const oldToken = tokenIn(first.text);

    const response = await request(context.app)
      .post('/api/releases/R270301-SUP-A/resend')
      .set(bearer(context.tokens.buyer));

    expect(response.status).toBe(200);
    expect(response.body.status).toBe('sent');
    const mails = await mailsTo('orders@supplier-a.example.com');
    expect(mails).toHaveLength(2);
    expect(mails[1].subject).toContain('sent again');
    const newToken = tokenIn(mails[1].text);
    expect(newToken).not.toBe(oldToken);
    expect((await request(context.app).get(`/api/confirm/${oldToken}`)).status).toBe(410);
    expect((await request(context.app).get(`/api/confirm/${newToken}`)).status).toBe(200);
  });

  it('is for buyers and admins only', async () => {
    const response = await request(context.app)
      .post('/api/releases/R270301-SUP-A/resend')
      .set(bearer(context.tokens.supplier));

    expect(response.status).toBe(403);
  });
});

describe('POST /api/releases/:number/cancel', () => {
  it('cancels an unreceived release, returns its cards to empty and ends its link', async () => {
    const [mail] = await mailsTo('orders@supplier-b.example.net');

    const response = await request(context.app)
      .post('/api/releases/R270301-SUP-B/cancel')
      .set(bearer(context.tokens.buyer));

    expect(response.status).toBe(200);
    expect(response.body.status).toBe('cancelled');
    expect(response.body.lines.every((line: { closed: boolean }) => line.closed)).toBe(true);
    const card = await cardOf('H', 1);
    expect(card.state).toBe('empty');
    expect(card.releaseLineId).toBeNull();
    expect((await request(context.app).get(`/api/confirm/${tokenIn(mail.text)}`)).status).toBe(410);
    const again = await request(context.app)
      .post('/api/releases/R270301-SUP-B/cancel')
      .set(bearer(context.tokens.buyer));
    expect(again.status).toBe(409);
  });

  it('refuses once anything was received', async () => {
    const release = firstRun.releases[0];
    await runSql(context.dataSource.manager, 'UPDATE release_line SET received_qty = 5 WHERE id = ?', [
      release.lines[0].id,
    ]);

    const response = await request(context.app)
      .post(`/api/releases/${release.number}/cancel`)
      .set(bearer(context.tokens.admin));

    expect(response.status).toBe(409);
    await runSql(context.dataSource.manager, 'UPDATE release_line SET received_qty = 0 WHERE id = ?', [
      release.lines[0].id,
    ]);
  });
});

describe('GET|PUT /api/releases/settings', () => {
  it('starts at 06:00 and lets an admin set another time', async () => {
    const before = await request(context.app).get('/api/releases/settings').set(bearer(context.tokens.buyer));
    const put = await request(context.app)
      .put('/api/releases/settings')
      .set(bearer(context.tokens.admin))
      .send({ jobTime: '05:30' });

    expect(before.body).toEqual({ jobTime: '06:00', lastRunDate: null, version: expect.any(String) });
    expect(put.status).toBe(200);
    expect(put.body.jobTime).toBe('05:30');
    const after = await request(context.app).get('/api/releases/settings').set(bearer(context.tokens.admin));
    expect(after.body.jobTime).toBe('05:30');
  });

  it.each(['24:00', '6:00', '06:60', '0600', ''])('refuses the time "%s" with 400', async (jobTime) => {
    const response = await request(context.app)
      .put('/api/releases/settings')
      .set(bearer(context.tokens.admin))
      .send({ jobTime });

    expect(response.status).toBe(400);
    expect(response.body.error.details[0].path).toEqual(['jobTime']);
  });

  it('lets only an admin change the time', async () => {
    const response = await request(context.app)
      .put('/api/releases/settings')
      .set(bearer(context.tokens.buyer))
      .send({ jobTime: '07:00' });

    expect(response.status).toBe(403);
  });
});

describe('ReleaseJob', () => {
  const at = (date: string, time: string) => new Date(`${date}T${time}:00`);

  it('runs a working day once, at or after the set time, and catches up after a restart', async () => {
    const job = new ReleaseJob(
      context.db,
      new ReleasesService(context.db, new PlanningService(context.db), { appUrl: APP_URL, readShipNotices }),
    );
    await writeSetting(context.dataSource.manager, RELEASE_JOB_LAST_RUN, '2027-03-02');
    await request(context.app)
      .put('/api/releases/settings')
      .set(bearer(context.tokens.admin))
      .send({ jobTime: '06:00' });

    const early = await job.tick(at('2027-03-03', '05:59'));
    const due = await job.tick(at('2027-03-03', '09:41'));
    const twice = await job.tick(at('2027-03-03', '09:42'));
    const saturday = await job.tick(at('2027-03-06', '06:00'));

    expect(early).toBeNull();
    // The pulled-back card of H (cancelled above) is empty again and is ordered by this run.
    expect(due?.date).toBe('2027-03-03');
    expect(due?.releases.map((release) => release.number)).toEqual(['R270303-SUP-B']);
    expect(twice).toBeNull();
    expect(saturday).toBeNull();
    const settings = await request(context.app).get('/api/releases/settings').set(bearer(context.tokens.buyer));
    expect(settings.body.lastRunDate).toBe('2027-03-03');
  });

  it('starts a brand-new schedule on the next day rather than mailing at first start', async () => {
    const job = new ReleaseJob(
      context.db,
      new ReleasesService(context.db, new PlanningService(context.db), { appUrl: APP_URL, readShipNotices }),
    );
    await runSql(context.dataSource.manager, 'DELETE FROM setting WHERE key = ?', [RELEASE_JOB_LAST_RUN]);

    const first = await job.tick(at('2027-03-04', '10:00'));

    expect(first).toBeNull();
    const settings = await request(context.app).get('/api/releases/settings').set(bearer(context.tokens.buyer));
    expect(settings.body.lastRunDate).toBe('2027-03-04');
  });
});

describe('release rules', () => {
  it('numbers a release R + yymmdd + supplier code', () => {
    expect(releaseNumber('SUP-A', '2027-03-01')).toBe('R270301-SUP-A');
  });
});
