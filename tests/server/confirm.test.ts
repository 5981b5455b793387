import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEventEntity } from '../../server/audit/audit-event.entity';
import { CONFIRM_RATE_LIMIT } from '../../server/releases/confirm.router';
import { ConfirmationTokenEntity } from '../../server/releases/confirmation-token.entity';
import { hashConfirmationToken } from '../../server/releases/confirmation-tokens';
import { KanbanCardEntity } from '../../server/loops/kanban-card.entity';
import { KanbanLoopEntity } from '../../server/loops/kanban-loop.entity';
import { syncLoops } from '../../server/loops/loop-sync';
import { OutboxMessageEntity } from '../../server/outbox/outbox-message.entity';
import { savePartsWithStock } from '../../server/stock/stock.service';
import { ReleaseEntity } from '../../server/releases/release.entity';
import { ReleaseLineEntity } from '../../server/releases/release-line.entity';
import { SupplierEntity } from '../../server/master-data/supplier.entity';
import { isoWeekday } from '../../shared/domain/calendar';
import { readPlanningVersion } from '../../server/settings/versions';
import { addCalendarDays } from '../../shared/domain/date';
import { cardNumber } from '../../shared/domain/gs1';
import type { Release, RunReleasesResponse } from '../../shared/schemas/releases';
import { bearer, createTestContext, testPart, type TestContext } from './helpers';

const APP_URL = 'https://cardloop.example.com';

let context: TestContext;
let nextDay = 1;

/*
 * Fixture: kanban part K (container 10, "Caster 100 mm") and kanban part W (container 25, in kg)
 * from SUP-A, one card each. Each test empties both cards and runs releases for a new March 2027
 * day, so every test gets a fresh release of two lines. SUP-A delivers every working day with no
 * transit, and the parts' 2-day lead time puts each line's need date two working days after release.
 */
beforeAll(async () => {
  context = await createTestContext({ appUrl: APP_URL });
  await context.dataSource.transaction(async (manager) => {
    await savePartsWithStock(manager, [
      testPart('K', { packQty: 10, leadTimeDays: 2, description: 'Caster 100 mm' }),
      testPart('W', { packQty: 25, leadTimeDays: 2, uom: 'KGM', description: 'Wire, 1.5 mm²' }),
    ]);
    await syncLoops(manager);
    const loops = await manager.find(KanbanLoopEntity, { order: { partNumber: 'ASC' } });
    await manager.insert(
      KanbanCardEntity,
      loops.map((loop) => ({
        loopId: loop.id,
        cardIndex: 1,
        cardNumber: cardNumber(loop.id, 1),
        state: 'full',
        stateChangedAt: new Date().toISOString(),
        retiredAt: null,
        releaseLineId: null,
      })),
    );
  });
});
afterAll(async () => {
  await context.close();
});

/** Empties both cards, runs a new day and returns the release with the raw token from its e-mail. */
async function freshRelease(): Promise<{ release: Release; token: string }> {
  await context.dataSource
    .getRepository(KanbanCardEntity)
    .update({ cardIndex: 1 }, { state: 'empty', releaseLineId: null });
  const date = `2027-03-${String(nextDay++).padStart(2, '0')}`;
  const response = await request(context.app)
    .post('/api/releases/run')
    .set(bearer(context.tokens.buyer))
    .send({ date });
  expect(response.status).toBe(200);
  const [release] = (response.body as RunReleasesResponse).releases;
  const mails = await context.dataSource.getRepository(OutboxMessageEntity).find({ order: { id: 'DESC' }, take: 1 });
  const token = mails[0].text.match(/\/confirm\/([A-Za-z0-9_-]+)/)![1];
  return { release, token };
}

/** The calendar day after a need date: shipping then cannot arrive by the need date. */
const dayAfter = (needDate: string) => addCalendarDays(needDate, 1);

const asRequested = (release: Release) =>
  release.lines.map((line) => ({ id: line.id, confirmedQty: line.qty, shipDate: line.needDate }));

function answer(token: string, body: object) {
  return request(context.app).post(`/api/confirm/${token}`).send(body);
}

function releaseRow(number: string) {
  return context.dataSource.getRepository(ReleaseEntity).findOneByOrFail({ number });
}

describe('GET /api/confirm/:token', () => {
  it('shows the release behind the link without signing in', async () => {
    const { release, token } = await freshRelease();

    const response = await request(context.app).get(`/api/confirm/${token}`);

    expect(response.status).toBe(200);
    expect(response.body.release).toMatchObject({
      number: release.number,
      supplierCode: 'SUP-A',
      supplierName: 'Supplier A',
      plantName: 'Cardloop demo plant',
      releaseDate: release.releaseDate,
      transitDays: 0,
    });
    // Released Monday 1 Mar 2027, needed Wednesday 3 Mar; the default on-time window lets the goods
    // arrive one working day early, so with no transit they may ship Tuesday 2 or Wednesday 3 Mar.
    const window = { expedite: false, earliestShipDate: '2027-03-02', latestShipDate: '2027-03-03' };
    expect(response.body.release.lines).toEqual([
      {
        id: expect.any(Number),
        partNumber: 'K',
        qty: 10,
        needDate: '2027-03-03',
        description: 'Caster 100 mm',
        uom: 'H87',
        hazardous: false,
        ...window,
      },
      {
        id: expect.any(Number),
        partNumber: 'W',
        qty: 25,
        needDate: '2027-03-03',
        description: 'Wire, 1.5 mm²',
        uom: 'KGM',
        hazardous: false,
        ...window,
      },
    ]);
    expect(response.body.today).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    expect(Date.parse(response.body.expiresAt)).toBeGreaterThan(Date.now() + 6 * 24 * 3600 * 1000);
  });

  it('stores only the SHA-256 of the token', async () => {
    const { release, token } = await freshRelease();

    const stored = await context.dataSource.getRepository(ConfirmationTokenEntity).findBy({ releaseId: release.id });

    expect(stored).toHaveLength(1);
    expect(stored[0].tokenHash).toBe(hashConfirmationToken(token));
    expect(stored[0].tokenHash).not.toContain(token);
    // SHA-256 of "abc": NIST FIPS 180-2, Secure Hash Standard, appendix B.1 (one-block message example).
    expect(hashConfirmationToken('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
  });

  it('answers 404 for an altered or unknown token', async () => {
    const { token } = await freshRelease();
    const altered = `${token.slice(0, -1)}${token.endsWith('A') ? 'B' : 'A'}`;

    const alteredResponse = await request(context.app).get(`/api/confirm/${altered}`);
    const unknown = await request(context.app).get('/api/confirm/not-a-token');

    expect(alteredResponse.status).toBe(404);
    expect(alteredResponse.body.error.code).toBe('not_found');
    expect(unknown.status).toBe(404);
  });

  it('answers 410 once the link has expired', async () => {
    const { release, token } = await freshRelease();
    await context.dataSource
      .getRepository(ConfirmationTokenEntity)
      .update({ releaseId: release.id }, { expiresAt: new Date(Date.now() - 1000).toISOString() });

    const view = await request(context.app).get(`/api/confirm/${token}`);
    const post = await answer(token, { lines: asRequested(release), note: '' });

    expect(view.status).toBe(410);
    expect(view.body.error.code).toBe('gone');
    expect(post.status).toBe(410);
    expect((await releaseRow(release.number)).status).toBe('sent');
  });
});

describe('POST /api/confirm/:token', () => {
  it('confirms a release answered as requested, firms it up and spends the link', async () => {
    const { release, token } = await freshRelease();
    const versionBefore = await readPlanningVersion(context.dataSource.manager);

    const response = await answer(token, {
      lines: asRequested(release),
      note: 'All good',
      carrier: 'Road Freight Co',
      trackingNumber: 'TRK-001',
    });

    expect(response.status).toBe(200);
    expect(response.body).toEqual({
      status: 'confirmed',
      number: release.number,
      changedLines: 0,
      shippingToken: expect.stringMatching(/^[A-Za-z0-9_-]{43}$/),
    });
    const stored = await request(context.app).get(`/api/releases/${release.number}`).set(bearer(context.tokens.buyer));
    expect(stored.body).toMatchObject({
      status: 'confirmed',
      carrier: 'Road Freight Co',
      trackingNumber: 'TRK-001',
      supplierNote: 'All good',
      confirmedAt: expect.any(String),
    });
    expect(stored.body.lines.map((line: Release['lines'][number]) => [line.confirmedQty, line.shipDate])).toEqual(
      release.lines.map((line) => [line.qty, line.needDate]),
    );
    expect(await readPlanningVersion(context.dataSource.manager)).toBeGreaterThan(versionBefore);
    const audit = await context.dataSource
      .getRepository(AuditEventEntity)
      .findBy({ entity: 'release', entityKey: release.number, action: 'confirm' });
    expect(audit).toEqual([expect.objectContaining({ actorEmail: 'supplier:SUP-A' })]);
  });

  it('answers 409 when the link is used again', async () => {
    const { release, token } = await freshRelease();
    await answer(token, { lines: asRequested(release), note: '' });

    const view = await request(context.app).get(`/api/confirm/${token}`);
    const again = await answer(token, { lines: asRequested(release), note: '' });

    expect(view.status).toBe(409);
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('conflict');
  });

  it('makes a changed quantity an exception for the buyer, who can accept it', async () => {
    const { release, token } = await freshRelease();
    const lines = asRequested(release);
    lines[0].confirmedQty = 8;

    const response = await answer(token, { lines, note: 'Only 8 in stock' });

    expect(response.body).toEqual({
      status: 'exception',
      number: release.number,
      changedLines: 1,
      shippingToken: expect.any(String),
    });
    expect((await releaseRow(release.number)).status).toBe('exception');
    const viewer = await request(context.app)
      .post(`/api/releases/${release.number}/accept-exception`)
      .set(bearer(context.tokens.viewer));
    expect(viewer.status).toBe(403);
    const accepted = await request(context.app)
      .post(`/api/releases/${release.number}/accept-exception`)
      .set(bearer(context.tokens.buyer));
    expect(accepted.status).toBe(200);
    expect(accepted.body.status).toBe('confirmed');
    // The accepted answer becomes the order everywhere; what was first asked stays beside it.
    expect(accepted.body.lines[0]).toMatchObject({ qty: 8, confirmedQty: 8, requestedQty: 10 });
    const twice = await request(context.app)
      .post(`/api/releases/${release.number}/accept-exception`)
      .set(bearer(context.tokens.buyer));
    expect(twice.status).toBe(409);
  });

  it('makes a ship date after the need date an exception, and one earlier than the window allows', async () => {
    const late = await freshRelease();
    const onTime = await freshRelease();
    const early = await freshRelease();
    const lateLines = asRequested(late.release);
    lateLines[1].shipDate = dayAfter(late.release.lines[1].needDate);
    // One working day early is inside the default early tolerance; two is not.
    const onTimeLines = asRequested(onTime.release);
    onTimeLines[0].shipDate = onTime.release.lines[0].earliestShipDate;
    const earlyLines = asRequested(early.release);
    earlyLines[0].shipDate = early.release.releaseDate;

    const lateResponse = await answer(late.token, { lines: lateLines, note: '' });
    const onTimeResponse = await answer(onTime.token, { lines: onTimeLines });
    const earlyResponse = await answer(early.token, { lines: earlyLines });

    expect(lateResponse.body.status).toBe('exception');
    expect(onTimeResponse.body.status).toBe('confirmed');
    expect(earlyResponse.body).toMatchObject({ status: 'exception', changedLines: 1 });
  });

  it('refuses a ship date before today with 422 naming the line, and the link stays usable', async () => {
    const { release, token } = await freshRelease();
    const lines = asRequested(release);
    lines[1].shipDate = '2020-01-06';

    const response = await answer(token, { lines });

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([
      expect.objectContaining({ path: ['lines', 1, 'shipDate'], message: expect.stringContaining('before today') }),
    ]);
    expect((await request(context.app).get(`/api/confirm/${token}`)).status).toBe(200);
  });

  it('stores the arrival a ship date implies: transit days after it, in working days', async () => {
    await context.dataSource.getRepository(SupplierEntity).update({ code: 'SUP-A' }, { transitDays: 2 });
    try {
      const { release, token } = await freshRelease();
      const lines = asRequested(release);
      // Shipped Friday 26 Mar 2027 (a Friday in the Gregorian calendar), two working days on the
      // road (Monday 29, Tuesday 30): arrives Tuesday 30 Mar.
      expect(isoWeekday('2027-03-26')).toBe(5);
      for (const line of lines) line.shipDate = '2027-03-26';

      await answer(token, { lines });

      const stored = await context.dataSource.getRepository(ReleaseLineEntity).findBy({ releaseId: release.id });
      expect(stored.map((line) => line.arrivalDate)).toEqual(['2027-03-30', '2027-03-30']);
    } finally {
      await context.dataSource.getRepository(SupplierEntity).update({ code: 'SUP-A' }, { transitDays: 0 });
    }
  });

  it('lets the buyer resend an exception, which waits for a new answer', async () => {
    const { release, token } = await freshRelease();
    const lines = asRequested(release);
    lines[0].confirmedQty = 5;
    await answer(token, { lines, note: '' });

    const resent = await request(context.app)
      .post(`/api/releases/${release.number}/resend`)
      .set(bearer(context.tokens.buyer));

    expect(resent.body.status).toBe('sent');
    expect(resent.body.lines[0].confirmedQty).toBeNull();
  });

  it('answers 400 when a line is left unanswered, and the link stays usable', async () => {
    const { release, token } = await freshRelease();

    const response = await answer(token, { lines: asRequested(release).slice(0, 1), note: '' });

    expect(response.status).toBe(400);
    expect(response.body.error.message).toContain('W');
    expect((await request(context.app).get(`/api/confirm/${token}`)).status).toBe(200);
  });

  it('answers 400 for a line of another release or a line answered twice', async () => {
    const other = await freshRelease();
    const { release, token } = await freshRelease();
    const foreign = [
      ...asRequested(release),
      { id: other.release.lines[0].id, confirmedQty: 1, shipDate: '2027-03-03' },
    ];
    const twice = [...asRequested(release), asRequested(release)[0]];

    const foreignResponse = await answer(token, { lines: foreign, note: '' });
    const twiceResponse = await answer(token, { lines: twice, note: '' });

    expect(foreignResponse.status).toBe(400);
    expect(foreignResponse.body.error.details).toEqual([expect.objectContaining({ path: ['lines', 2, 'id'] })]);
    expect(twiceResponse.status).toBe(400);
  });

  it('answers 400 for a negative quantity or a date that is not a date', async () => {
    const { release, token } = await freshRelease();
    const negative = asRequested(release).map((line) => ({ ...line, confirmedQty: -1 }));
    const badDate = asRequested(release).map((line) => ({ ...line, shipDate: '03/03/2027' }));

    expect((await answer(token, { lines: negative })).status).toBe(400);
    expect((await answer(token, { lines: badDate })).status).toBe(400);
  });

  it('answers 410 for the link of a cancelled release', async () => {
    const { release, token } = await freshRelease();
    await request(context.app).post(`/api/releases/${release.number}/cancel`).set(bearer(context.tokens.buyer));

    const response = await answer(token, { lines: asRequested(release) });

    expect(response.status).toBe(410);
    expect(response.body.error.message).toContain('cancelled');
  });
});

describe('a signed-in supplier answers its own release', () => {
  const ownPath = (number: string) => `/api/releases/${encodeURIComponent(number)}/confirmation`;
  const answerOwn = (number: string, body: object, token = context.tokens.supplier) =>
    request(context.app).post(ownPath(number)).set(bearer(token)).send(body);

  it('shows the same release as the link does, with no link expiry', async () => {
    const { release, token } = await freshRelease();

    const own = await request(context.app).get(ownPath(release.number)).set(bearer(context.tokens.supplier));
    const byLink = await request(context.app).get(`/api/confirm/${token}`);

    expect(own.status).toBe(200);
    expect(own.body.release).toEqual(byLink.body.release);
    expect(own.body.expiresAt).toBeNull();
  });

  it('lets only the release’s own supplier in: staff 403, another supplier’s release 404', async () => {
    const { release } = await freshRelease();
    await context.dataSource.getRepository(ReleaseEntity).update({ number: release.number }, { supplierCode: 'SUP-B' });

    const asOther = await request(context.app).get(ownPath(release.number)).set(bearer(context.tokens.supplier));
    const answerAsOther = await answerOwn(release.number, { lines: asRequested(release) });
    const asBuyer = await request(context.app).get(ownPath(release.number)).set(bearer(context.tokens.buyer));
    await context.dataSource.getRepository(ReleaseEntity).update({ number: release.number }, { supplierCode: 'SUP-A' });

    expect(asOther.status).toBe(404);
    expect(answerAsOther.status).toBe(404);
    expect(asBuyer.status).toBe(403);
    expect((await releaseRow(release.number)).status).toBe('sent');
  });

  it('confirms as the link would, records who answered, and spends the e-mailed link', async () => {
    const { release, token } = await freshRelease();

    const response = await answerOwn(release.number, { lines: asRequested(release), carrier: 'Road Freight Co' });
    const linkAfter = await request(context.app).get(`/api/confirm/${token}`);
    const again = await answerOwn(release.number, { lines: asRequested(release) });

    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ status: 'confirmed', number: release.number, changedLines: 0 });
    expect(await releaseRow(release.number)).toMatchObject({ status: 'confirmed', carrier: 'Road Freight Co' });
    expect(linkAfter.status).toBe(409);
    expect(again.status).toBe(409);
    const audit = await context.dataSource
      .getRepository(AuditEventEntity)
      .findBy({ entity: 'release', entityKey: release.number, action: 'confirm' });
    expect(audit).toEqual([expect.objectContaining({ actorEmail: 'supplier@example.com' })]);
  });

  it('counts one answer when the link and the signed-in page answer at the same moment', async () => {
    const { release, token } = await freshRelease();
    const lessOfFirst = asRequested(release).map((line, index) =>
      index === 0 ? { ...line, confirmedQty: line.confirmedQty - 1 } : line,
    );

    const answers = await Promise.all([
      answer(token, { lines: asRequested(release) }),
      answerOwn(release.number, { lines: lessOfFirst }),
    ]);

    expect(answers.map((response) => response.status).sort()).toEqual([200, 409]);
    const winner = answers.find((response) => response.status === 200)!;
    const lines = await context.dataSource
      .getRepository(ReleaseLineEntity)
      .find({ where: { releaseId: release.id }, order: { id: 'ASC' } });
    const expectedQty = winner.body.status === 'confirmed' ? release.lines[0].qty : release.lines[0].qty - 1;
    expect(lines.find((line) => line.id === release.lines[0].id)?.confirmedQty).toBe(expectedQty);
    const audit = await context.dataSource
      .getRepository(AuditEventEntity)
      .findBy({ entity: 'release', entityKey: release.number });
    expect(audit.filter((event) => event.action === 'confirm' || event.action === 'propose')).toHaveLength(1);
  });

  it('refuses a ship date before today with 422 naming the line, and the release still waits', async () => {
    const { release } = await freshRelease();
    const lines = asRequested(release).map((line, index) => (index === 1 ? { ...line, shipDate: '2020-01-06' } : line));

    const response = await answerOwn(release.number, { lines });

    expect(response.status).toBe(422);
    expect(response.body.error.details).toEqual([expect.objectContaining({ path: ['lines', 1, 'shipDate'] })]);
    expect((await releaseRow(release.number)).status).toBe('sent');
  });
});

describe('rate limit on the public confirmation routes', () => {
  it(`answers 429 in the error shape after ${CONFIRM_RATE_LIMIT} requests a minute from one address`, async () => {
    const limited = await createTestContext();
    try {
      const statuses: number[] = [];
      for (let attempt = 0; attempt <= CONFIRM_RATE_LIMIT; attempt += 1) {
        statuses.push((await request(limited.app).get('/api/confirm/guess')).status);
      }
      const last = await request(limited.app).get('/api/confirm/guess');

      expect(statuses.slice(0, CONFIRM_RATE_LIMIT).every((status) => status === 404)).toBe(true);
      expect(statuses[CONFIRM_RATE_LIMIT]).toBe(429);
      expect(last.body).toEqual({ error: { code: 'rate_limited', message: expect.any(String) } });
    } finally {
      await limited.close();
    }
  });
});
