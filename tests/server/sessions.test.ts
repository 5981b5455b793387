import { get, type IncomingMessage, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { IsNull } from 'typeorm';
import { OutboxMessageEntity } from '../../server/outbox/outbox-message.entity';
import { SessionEntity } from '../../server/users/session.entity';
import { ENDED_SESSION_KEEP_DAYS, openSession, pruneExpiredSessions } from '../../server/users/sessions';
import { MAX_STREAMS_PER_USER } from '../../server/events/events.router';
import { bearer, createTestContext, signIn, TEST_PASSWORD, type TestContext } from './helpers';

let context: TestContext;
beforeEach(async () => {
  context = await createTestContext({ loginAccountLimit: 5, loginAddressLimit: 8 });
});
afterEach(() => context.close());

const me = (token: string) => request(context.app).get('/api/auth/me').set(bearer(token));
const idOf = async (email: string) =>
  (
    (await request(context.app).get('/api/users').set(bearer(context.tokens.admin))).body as {
      id: number;
      email: string;
    }[]
  ).find((user) => user.email === email)!.id;

describe('sessions the server can end', () => {
  it('signs out one session: its token stops working, another device stays signed in', async () => {
    const laptop = context.tokens.buyer;
    const tablet = await signIn(context.app, 'buyer@example.com', TEST_PASSWORD);

    const out = await request(context.app).post('/api/auth/logout').set(bearer(laptop));

    expect(out.status).toBe(204);
    expect((await me(laptop)).status).toBe(401);
    expect((await me(tablet)).status).toBe(200);
  });

  it('ends every session of a user whose password the admin changes, or who is deactivated', async () => {
    const buyerId = await idOf('buyer@example.com');
    const viewerId = await idOf('viewer@example.com');

    await request(context.app)
      .patch(`/api/users/${buyerId}`)
      .set(bearer(context.tokens.admin))
      .send({ password: 'a-brand-new-password' });
    await request(context.app)
      .patch(`/api/users/${viewerId}`)
      .set(bearer(context.tokens.admin))
      .send({ active: false });

    expect((await me(context.tokens.buyer)).status).toBe(401);
    expect((await me(context.tokens.viewer)).status).toBe(401);
    expect((await me(context.tokens.admin)).status).toBe(200);
  });

  it('ends every session of a shared account signed in on many devices, however many there are', async () => {
    const receivingId = await idOf('receiving@example.com');
    // A dock account shared by tablets and scanners piles up sessions; on PostgreSQL the notice
    // of their end travels by NOTIFY, whose payload is capped at 8,000 bytes (PostgreSQL 15
    // documentation, NOTIFY: "must be shorter than 8000 bytes"; from memory).
    const expiresAt = new Date(Date.now() + 3_600_000);
    await context.db.write(async (manager) => {
      for (let device = 0; device < 300; device += 1) await openSession(manager, receivingId, expiresAt);
    });

    const deactivated = await request(context.app)
      .patch(`/api/users/${receivingId}`)
      .set(bearer(context.tokens.admin))
      .send({ active: false });

    expect(deactivated.status).toBe(200);
    expect(
      await context.dataSource.getRepository(SessionEntity).countBy({ userId: receivingId, revokedAt: IsNull() }),
    ).toBe(0);
    expect((await me(context.tokens.receiving)).status).toBe(401);
  });

  it('refuses a token on the request right after its session ended, though it was used a moment before', async () => {
    const [buyerId, viewerId, lineId] = await Promise.all(
      ['buyer@example.com', 'viewer@example.com', 'line@example.com'].map(idOf),
    );
    const usedBefore = [];
    for (const token of [context.tokens.buyer, context.tokens.viewer, context.tokens.line])
      usedBefore.push((await me(token)).status);

    const admin = bearer(context.tokens.admin);
    await request(context.app).patch(`/api/users/${buyerId}`).set(admin).send({ password: 'a-brand-new-password' });
    await request(context.app).patch(`/api/users/${viewerId}`).set(admin).send({ active: false });
    await request(context.app).patch(`/api/users/${lineId}`).set(admin).send({ role: 'viewer' });

    expect(usedBefore).toEqual([200, 200, 200]);
    expect((await me(context.tokens.buyer)).status).toBe(401);
    expect((await me(context.tokens.viewer)).status).toBe(401);
    expect((await me(context.tokens.line)).status).toBe(401);
  });

  it('lets a user change their own password, ending their other sessions but not this one', async () => {
    const other = await signIn(context.app, 'planner@example.com', TEST_PASSWORD);

    const wrong = await request(context.app)
      .post('/api/auth/password')
      .set(bearer(context.tokens.planner))
      .send({ currentPassword: 'not-it-at-all', newPassword: 'planner-new-password' });
    const changed = await request(context.app)
      .post('/api/auth/password')
      .set(bearer(context.tokens.planner))
      .send({ currentPassword: TEST_PASSWORD, newPassword: 'planner-new-password' });

    expect(wrong.status).toBe(400);
    expect(wrong.body.error.details[0].path).toEqual(['currentPassword']);
    expect(changed.status).toBe(204);
    expect((await me(context.tokens.planner)).status).toBe(200);
    expect((await me(other)).status).toBe(401);
    expect(
      (
        await request(context.app)
          .post('/api/auth/login')
          .send({ email: 'planner@example.com', password: 'planner-new-password' })
      ).status,
    ).toBe(200);
  });

  it('closes an open event stream the moment its user is deactivated', async () => {
    const server: Server = context.app.listen(0);
    try {
      const { port } = server.address() as AddressInfo;
      const stream = await new Promise<IncomingMessage>((resolve) =>
        get({ port, path: '/api/events', headers: bearer(context.tokens.viewer) }, resolve),
      );
      expect(stream.statusCode).toBe(200);
      const ended = new Promise<void>((resolve) => stream.on('end', () => resolve()));
      stream.resume();

      await request(context.app)
        .patch(`/api/users/${await idOf('viewer@example.com')}`)
        .set(bearer(context.tokens.admin))
        .send({ active: false });

      await ended;
    } finally {
      server.closeAllConnections();
      server.close();
    }
  });

  it(`refuses a user's event stream beyond ${MAX_STREAMS_PER_USER} open at once`, async () => {
    const server: Server = context.app.listen(0);
    const streams: IncomingMessage[] = [];
    try {
      const { port } = server.address() as AddressInfo;
      const open = () =>
        new Promise<IncomingMessage>((resolve) =>
          get({ port, path: '/api/events', headers: bearer(context.tokens.viewer) }, resolve),
        );
      for (let index = 0; index < MAX_STREAMS_PER_USER; index += 1) streams.push(await open());
      const oneMore = await open();
      streams.push(oneMore);
      const otherUser = await new Promise<IncomingMessage>((resolve) =>
        get({ port, path: '/api/events', headers: bearer(context.tokens.planner) }, resolve),
      );
      streams.push(otherUser);

      expect(streams.slice(0, MAX_STREAMS_PER_USER).every((stream) => stream.statusCode === 200)).toBe(true);
      expect(oneMore.statusCode).toBe(429);
      expect(otherUser.statusCode).toBe(200);
    } finally {
      for (const stream of streams) stream.destroy();
      server.closeAllConnections();
      server.close();
    }
  });
});

describe('password reset links sent by an admin', () => {
  const linkIn = (text: string) => /\/reset-password\/([A-Za-z0-9_-]+)/.exec(text)?.[1];

  it('e-mails a single-use link that sets a new password and ends every session', async () => {
    const buyerId = await idOf('buyer@example.com');

    const sent = await request(context.app)
      .post(`/api/users/${buyerId}/password-reset`)
      .set(bearer(context.tokens.admin));
    const mail = await context.dataSource
      .getRepository(OutboxMessageEntity)
      .findOneByOrFail({ to: 'buyer@example.com' });
    const token = linkIn(mail.text)!;
    const info = await request(context.app).get(`/api/auth/password-reset/${token}`);
    const reset = await request(context.app)
      .post('/api/auth/password-reset')
      .send({ token, password: 'reset-by-link-password' });
    const again = await request(context.app)
      .post('/api/auth/password-reset')
      .send({ token, password: 'another-new-password' });

    expect(sent.status).toBe(202);
    expect(sent.body.to).toBe('buyer@example.com');
    expect(mail.subject).toBe('Set a new Cardloop password');
    expect(info.body).toMatchObject({ email: 'buyer@example.com', name: 'Test buyer' });
    expect(reset.status).toBe(204);
    expect(again.status).toBe(409);
    expect((await me(context.tokens.buyer)).status).toBe(401);
    const login = await request(context.app)
      .post('/api/auth/login')
      .send({ email: 'buyer@example.com', password: 'reset-by-link-password' });
    expect(login.status).toBe(200);
  });

  it('answers 404 for an unknown link, 410 for one replaced by a newer link, and 403 to a non-admin', async () => {
    const buyerId = await idOf('buyer@example.com');
    await request(context.app).post(`/api/users/${buyerId}/password-reset`).set(bearer(context.tokens.admin));
    const first = linkIn(
      (await context.dataSource.getRepository(OutboxMessageEntity).findOneByOrFail({ to: 'buyer@example.com' })).text,
    )!;
    await request(context.app).post(`/api/users/${buyerId}/password-reset`).set(bearer(context.tokens.admin));

    const unknown = await request(context.app).get('/api/auth/password-reset/AAAAAAAAAAAAAAAAAAAAAAAAAAAA');
    const replaced = await request(context.app).get(`/api/auth/password-reset/${first}`);
    const byBuyer = await request(context.app)
      .post(`/api/users/${buyerId}/password-reset`)
      .set(bearer(context.tokens.buyer));

    expect(unknown.status).toBe(404);
    expect(replaced.status).toBe(410);
    expect(byBuyer.status).toBe(403);
  });
});

describe('sign-in throttling', () => {
  const login = (email: string, password: string, address: string) =>
    request(context.app).post('/api/auth/login').set('X-Forwarded-For', address).send({ email, password });

  it('locks an account tried from many addresses, whatever address comes next', async () => {
    for (let attempt = 0; attempt < 5; attempt += 1) {
      expect((await login('buyer@example.com', 'guess', `198.51.100.${attempt + 1}`)).status).toBe(401);
    }

    const fromNewAddress = await login('buyer@example.com', TEST_PASSWORD, '198.51.100.200');

    expect(fromNewAddress.status).toBe(429);
    expect(fromNewAddress.body.error.details[0]).toMatchObject({ scope: 'account' });
    expect(fromNewAddress.body.error.message).toMatch(/for this account/);
  });

  it('does not lock colleagues behind the same proxy out for one person’s typos', async () => {
    for (let attempt = 0; attempt < 5; attempt += 1) await login('buyer@example.com', 'typo', '203.0.113.7');

    const colleague = await login('planner@example.com', TEST_PASSWORD, '203.0.113.7');

    expect(colleague.status).toBe(200);
  });

  it('stops one address trying many accounts, and only that address', async () => {
    const accounts = ['admin', 'planner', 'buyer', 'receiving', 'viewer', 'supplier', 'nobody', 'ghost'];
    for (const account of accounts) await login(`${account}@example.com`, 'guess', '192.0.2.9');

    const sameAddress = await login('viewer@example.com', TEST_PASSWORD, '192.0.2.9');
    const otherAddress = await login('viewer@example.com', TEST_PASSWORD, '192.0.2.10');

    expect(sameAddress.status).toBe(429);
    expect(sameAddress.body.error.details[0]).toMatchObject({ scope: 'address' });
    expect(otherAddress.status).toBe(200);
  });

  it('believes X-Forwarded-For only from the proxies TRUST_PROXY names', async () => {
    // The nodes sit behind a proxy at 10.0.0.0/8; this test client (loopback) is not one of them.
    const behindProxy = await createTestContext({ trustProxy: '10.0.0.0/8', loginAddressLimit: 3 });
    try {
      const attempt = (email: string, password: string, address: string) =>
        request(behindProxy.app).post('/api/auth/login').set('X-Forwarded-For', address).send({ email, password });
      for (const [index, account] of ['admin', 'planner', 'buyer'].entries())
        await attempt(`${account}@example.com`, 'guess', `198.51.100.${index + 1}`);

      const claimingAnotherAddress = await attempt('viewer@example.com', TEST_PASSWORD, '198.51.100.99');

      expect(claimingAnotherAddress.status).toBe(429);
      expect(claimingAnotherAddress.body.error.details[0]).toMatchObject({ scope: 'address' });
    } finally {
      await behindProxy.close();
    }
  });
});

describe('sessions long expired', () => {
  it('are deleted once they expired more than the keeping period ago; live and recently ended ones stay', async () => {
    const DAY = 86_400_000;
    const now = new Date();
    const userId = await idOf('viewer@example.com');
    const ages = { long: ENDED_SESSION_KEEP_DAYS + 1, recent: ENDED_SESSION_KEEP_DAYS - 1 };
    const [longExpired, recentlyExpired, live] = await context.db.write(async (manager) => [
      await openSession(manager, userId, new Date(now.getTime() - ages.long * DAY)),
      await openSession(manager, userId, new Date(now.getTime() - ages.recent * DAY)),
      await openSession(manager, userId, new Date(now.getTime() + DAY)),
    ]);

    const pruned = await context.db.write((manager) => pruneExpiredSessions(manager, now));
    const left = await context.dataSource.getRepository(SessionEntity).findBy({ userId });

    expect(pruned).toBe(1);
    const ids = left.map((session) => session.id);
    expect(ids).not.toContain(longExpired.id);
    expect(ids).toEqual(expect.arrayContaining([recentlyExpired.id, live.id]));
    // The signed-in viewer's own session is live too.
    expect((await me(context.tokens.viewer)).status).toBe(200);
  });
});
