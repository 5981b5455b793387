import request from 'supertest';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { startFakeSmtp, type FakeSmtp } from '../../server/outbox/fake-smtp';
import { OutboxMessageEntity } from '../../server/outbox/outbox-message.entity';
import { enqueueMail, OutboxDispatcher, redactSecretLinks, retryDelayMs } from '../../server/outbox/outbox.service';
import { bearer, createTestContext, type TestContext } from './helpers';

const FROM = 'Cardloop <cardloop@example.com>';
const DOWN = 'smtp://127.0.0.1:1';
const HOUR = 3_600_000;

let context: TestContext;
let smtp: FakeSmtp;
beforeAll(async () => {
  context = await createTestContext();
  smtp = await startFakeSmtp();
});
afterAll(async () => {
  await smtp.close();
  await context.close();
});
afterEach(async () => {
  await context.dataSource.query('DELETE FROM outbox_message');
  smtp.messages.splice(0);
});

const queue = (subject: string, extra: { ref?: string; text?: string } = {}) =>
  context.db.write((manager) =>
    enqueueMail(manager, {
      to: 'orders@supplier-a.example.com',
      subject,
      text: extra.text ?? 'Hello.',
      ref: extra.ref,
    }),
  );
const stored = (subject: string) => context.dataSource.getRepository(OutboxMessageEntity).findOneByOrFail({ subject });

/** Runs the dispatcher at each of the given instants (mail server down), returning the message after. */
async function outage(subject: string, instants: Date[]) {
  const dispatcher = new OutboxDispatcher(context.db, DOWN, FROM);
  try {
    for (const instant of instants) await dispatcher.dispatchDue(instant);
  } finally {
    dispatcher.close();
  }
  return stored(subject);
}

describe('the outbox through a long mail-server outage', () => {
  it('backs off to at most an hour and never gives a notice up', () => {
    expect([1, 2, 3, 8, 9, 50].map(retryDelayMs)).toEqual([30_000, 60_000, 120_000, HOUR, HOUR, HOUR]);
  });

  it('keeps a notice failing, and due again, after twelve hours of failed attempts', async () => {
    await queue('Release R1', { ref: 'release:R1' });
    let clock = Date.now();
    const instants: Date[] = [];
    for (let attempt = 0; attempt < 20; attempt += 1) {
      instants.push(new Date(clock));
      clock += HOUR;
    }

    const message = await outage('Release R1', instants);

    expect(message.status).toBe('failing');
    expect(message.attempts).toBe(20);
    expect(message.firstFailedAt).not.toBeNull();
    expect(new Date(message.nextAttemptAt).getTime()).toBeLessThanOrEqual(clock + HOUR);
  });

  it('sends the notice once the mail server is back, exactly once', async () => {
    await queue('Release R2', { ref: 'release:R2' });
    await outage('Release R2', [new Date()]);
    const first = new OutboxDispatcher(context.db, smtp.url, FROM);
    const second = new OutboxDispatcher(context.db, smtp.url, FROM);

    const later = new Date(Date.now() + HOUR);
    const [a, b] = await Promise.all([first.dispatchDue(later), second.dispatchDue(later)]);
    first.close();
    second.close();

    // The notice and the admins' alert about its first failure, each sent by one dispatcher only.
    expect(a + b).toBe(smtp.messages.length);
    expect(new Set(smtp.messages.map((mail) => `${mail.to}|${mail.subject}`)).size).toBe(smtp.messages.length);
    expect(smtp.messages.filter((mail) => mail.subject === 'Release R2')).toHaveLength(1);
    expect((await stored('Release R2')).status).toBe('sent');
  });

  it('tells the admins once when a notice first fails, and never about its own alerts', async () => {
    await queue('Release R3');
    await outage('Release R3', [new Date(), new Date(Date.now() + HOUR), new Date(Date.now() + 2 * HOUR)]);

    const alerts = await context.dataSource
      .getRepository(OutboxMessageEntity)
      .findBy({ ref: 'alert:outbox', to: 'admin@example.com' });
    expect(alerts).toHaveLength(1);
    expect(alerts[0].subject).toBe('A notice cannot be delivered: Release R3');
  });

  it('shows the admin what fails, and "send again" makes it due at once', async () => {
    await queue('Release R4');
    const failing = await outage('Release R4', [new Date()]);

    const health = await request(context.app).get('/api/outbox/health').set(bearer(context.tokens.admin));
    const again = await request(context.app)
      .post(`/api/outbox/${failing.id}/send-again`)
      .set(bearer(context.tokens.admin));
    const byBuyer = await request(context.app)
      .post(`/api/outbox/${failing.id}/send-again`)
      .set(bearer(context.tokens.buyer));
    const dispatcher = new OutboxDispatcher(context.db, smtp.url, FROM);
    const sent = await dispatcher.dispatchDue();
    dispatcher.close();

    expect(health.body).toMatchObject({ failing: expect.any(Number), failingSince: failing.firstFailedAt });
    expect(health.body.failing).toBeGreaterThanOrEqual(1);
    expect(again.status).toBe(200);
    expect(new Date(again.body.nextAttemptAt).getTime()).toBeLessThanOrEqual(Date.now());
    expect(byBuyer.status).toBe(403);
    expect(sent).toBeGreaterThanOrEqual(1);
    expect(smtp.messages.some((mail) => mail.subject === 'Release R4')).toBe(true);
  });
});

describe('reading a notice in the outbox', () => {
  it('gives the admin the notice as written with its files, as a download, and nobody else', async () => {
    await context.db.write((manager) =>
      enqueueMail(manager, {
        to: 'orders@supplier-a.example.com',
        subject: 'Forecast for week 50',
        text: 'Your forecast is attached.',
        html: '<p>Your forecast is attached.</p>',
        attachments: [{ filename: 'forecast wk50.csv', content: 'part,qty\nP1,4\n', contentType: 'text/csv' }],
      }),
    );
    const { id, createdAt } = await stored('Forecast for week 50');

    const mail = await request(context.app).get(`/api/outbox/${id}/mail`).set(bearer(context.tokens.admin));
    const file = await request(context.app)
      .get(`/api/outbox/${id}/attachments/0`)
      .set(bearer(context.tokens.admin))
      .buffer(true)
      .parse((res, done) => {
        const chunks: Buffer[] = [];
        res.on('data', (chunk: Buffer) => chunks.push(chunk));
        res.on('end', () => done(null, Buffer.concat(chunks)));
      });
    const byBuyer = await request(context.app).get(`/api/outbox/${id}/mail`).set(bearer(context.tokens.buyer));
    const missing = await request(context.app)
      .get(`/api/outbox/${id + 999}/mail`)
      .set(bearer(context.tokens.admin));
    const noFile = await request(context.app).get(`/api/outbox/${id}/attachments/1`).set(bearer(context.tokens.admin));

    expect(mail.status).toBe(200);
    expect(mail.body).toEqual({
      id,
      to: 'orders@supplier-a.example.com',
      subject: 'Forecast for week 50',
      text: 'Your forecast is attached.',
      html: '<p>Your forecast is attached.</p>',
      date: createdAt,
      attachments: [{ fileName: 'forecast wk50.csv', contentType: 'text/csv', sizeBytes: 14 }],
    });
    expect(file.status).toBe(200);
    expect(file.headers['content-type']).toBe('application/octet-stream');
    expect(file.headers['content-disposition']).toContain('attachment;');
    expect((file.body as Buffer).toString('utf8')).toBe('part,qty\nP1,4\n');
    expect(byBuyer.status).toBe(403);
    expect(missing.status).toBe(404);
    expect(noFile.status).toBe(404);
  });
});

describe('single-use links in sent notices', () => {
  it('are removed from the stored text once the mail server has the message', async () => {
    const link = 'https://plant.example.com/confirm/Q2F0Y2gtbWUtaWYteW91LWNhbg_0123456789';
    await queue('Release R5', { text: `Confirm here: ${link}\nThanks.` });
    const dispatcher = new OutboxDispatcher(context.db, smtp.url, FROM);

    await dispatcher.dispatchDue();
    dispatcher.close();

    expect(smtp.messages.find((mail) => mail.subject === 'Release R5')?.text).toContain(link);
    const kept = await stored('Release R5');
    expect(kept.text).not.toContain('Q2F0Y2gtbWUtaWYteW91LWNhbg_0123456789');
    expect(kept.text).toBe('Confirm here: https://plant.example.com/confirm/[link removed after sending]\nThanks.');
    expect(redactSecretLinks('/reset-password/abcdefghijklmnopqrstuvwxyz')).toBe(
      '/reset-password/[link removed after sending]',
    );
  });
});
