import request from 'supertest';
import { Like } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeCalendar } from '../../server/calendar/calendar.service';
import { startFakeSmtp, type FakeSmtp } from '../../server/outbox/fake-smtp';
import { OutboxMessageEntity } from '../../server/outbox/outbox-message.entity';
import { OutboxDispatcher } from '../../server/outbox/outbox.service';
import { replaceBomLines } from '../../server/master-data/master-data.writer';
import { savePartsWithStock } from '../../server/stock/stock.service';
import { upsertSequenceEntries } from '../../server/sequence/sequence.writer';
import { bearer, createTestContext, testPart, type TestContext } from './helpers';

let context: TestContext;
let smtp: FakeSmtp;

beforeAll(async () => {
  smtp = await startFakeSmtp();
  context = await createTestContext({ fakeSmtp: smtp });
  await context.dataSource.transaction(async (manager) => {
    await writeCalendar(manager, { workingWeekdays: [1, 2, 3, 4, 5], holidays: [] });
    await savePartsWithStock(manager, [
      testPart('M', { source: 'end_item', supplierCode: null, replenishment: null }),
      testPart('D', { supplierCode: 'SUP-B' }),
    ]);
    await replaceBomLines(manager, [
      { parent: 'M', component: 'D', qtyPer: 3, scrapPct: 0, effectiveFrom: null, effectiveTo: null },
    ]);
    await upsertSequenceEntries(manager, [{ date: '2027-03-01', sequence: 1, model: 'M', serial: 'S1', qty: 2 }]);
  });
});
afterAll(async () => {
  await context.close();
  await smtp.close();
});

describe('POST /api/demand/forecast-mail', () => {
  it('queues a forecast with the CSV attached, and the dispatcher delivers it', async () => {
    const response = await request(context.app)
      .post('/api/demand/forecast-mail')
      .set(bearer(context.tokens.buyer))
      .send({ supplier: 'SUP-B', from: '2027-03-01', to: '2027-03-02' });

    expect(response.status).toBe(202);
    expect(response.body).toMatchObject({
      to: 'orders@supplier-b.example.net',
      parts: 1,
      from: '2027-03-01',
      until: '2027-03-02',
    });
    const [queued] = await context.dataSource.getRepository(OutboxMessageEntity).find();
    expect(queued.status).toBe('pending');
    expect(queued.attachments?.[0].content.split('\r\n')).toEqual([
      'part_number,supplier_code,2027-03-01,2027-03-02,total',
      'D,SUP-B,6,0,6',
    ]);

    const dispatcher = new OutboxDispatcher(context.db, smtp.url, 'Cardloop <cardloop@example.com>');
    const sent = await dispatcher.dispatchDue();
    dispatcher.close();

    expect(sent).toBe(1);
    const captured = await request(context.app).get('/api/dev/mail').set(bearer(context.tokens.admin));
    expect(captured.body[0]).toMatchObject({ to: 'orders@supplier-b.example.net', subject: response.body.subject });
    expect(captured.body[0].text).toContain('D');
    expect(captured.body[0].attachments).toEqual([
      expect.objectContaining({ fileName: expect.stringMatching(/\.csv$/), contentType: 'text/csv' }),
    ]);
    const file = await request(context.app)
      .get(`/api/dev/mail/${captured.body[0].id}/attachments/0`)
      .set(bearer(context.tokens.admin))
      .buffer(true)
      .parse((res, done) => {
        let body = '';
        res.on('data', (chunk: Buffer) => (body += chunk.toString()));
        res.on('end', () => done(null, body));
      });
    expect(file.status).toBe(200);
    expect(file.headers['content-disposition']).toMatch(/^attachment; filename=".+\.csv"/);
    expect(String(file.body).split('\r\n')).toEqual(queued.attachments?.[0].content.split('\r\n'));
    const byBuyer = await request(context.app)
      .get(`/api/dev/mail/${captured.body[0].id}/attachments/0`)
      .set(bearer(context.tokens.buyer));
    const missing = await request(context.app)
      .get(`/api/dev/mail/${captured.body[0].id}/attachments/5`)
      .set(bearer(context.tokens.admin));
    expect(byBuyer.status).toBe(403);
    expect(missing.status).toBe(404);
    const delivered = await context.dataSource.getRepository(OutboxMessageEntity).findOneByOrFail({ id: queued.id });
    expect(delivered.status).toBe('sent');
  });

  it('answers 404 for an unknown supplier and 403 to a viewer', async () => {
    const unknown = await request(context.app)
      .post('/api/demand/forecast-mail')
      .set(bearer(context.tokens.buyer))
      .send({ supplier: 'NOPE' });
    const viewer = await request(context.app)
      .post('/api/demand/forecast-mail')
      .set(bearer(context.tokens.viewer))
      .send({ supplier: 'SUP-B' });

    expect(unknown.status).toBe(404);
    expect(viewer.status).toBe(403);
  });
});

describe('OutboxDispatcher', () => {
  it('keeps a message failing with the error and a later retry time while the mail server is down', async () => {
    await request(context.app)
      .post('/api/demand/forecast-mail')
      .set(bearer(context.tokens.buyer))
      .send({ supplier: 'SUP-A' });
    const dispatcher = new OutboxDispatcher(context.db, 'smtp://127.0.0.1:1', 'Cardloop <cardloop@example.com>');
    const now = new Date();

    const sent = await dispatcher.dispatchDue(now);
    dispatcher.close();

    expect(sent).toBe(0);
    const pending = await context.dataSource
      .getRepository(OutboxMessageEntity)
      .findOneByOrFail({ status: 'failing', subject: Like('Demand forecast%') });
    expect(pending.attempts).toBe(1);
    expect(pending.lastError).toEqual(expect.any(String));
    expect(new Date(pending.nextAttemptAt).getTime()).toBeGreaterThan(now.getTime());
  });
});
