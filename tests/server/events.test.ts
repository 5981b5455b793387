import type { Server } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bumpPlanningVersion } from '../../server/settings/versions';
import { openEventStream } from './event-stream';
import { bearer, createTestContext, type TestContext } from './helpers';

let context: TestContext;
let server: Server;

beforeAll(async () => {
  context = await createTestContext();
  server = context.app.listen(0);
});
afterAll(async () => {
  server.close();
  await context.close();
});

describe('GET /api/events', () => {
  it('sends the planning version on connect and again after a planning input changes', async () => {
    const events = await openEventStream(server, bearer(context.tokens.viewer));
    const first = await events.next<{ version: number }>('planning');

    const nextVersion = await context.db.write((manager) => bumpPlanningVersion(manager));
    const second = await events.nextPast('planning', first.version);

    expect(events.stream.headers['content-type']).toBe('text/event-stream');
    expect(second.version).toBe(nextVersion);
    expect(second.version).toBeGreaterThan(first.version);
    events.close();
  });

  it('refuses a supplier account', async () => {
    const events = await openEventStream(server, bearer(context.tokens.supplier));

    expect(events.stream.statusCode).toBe(403);
    events.close();
  });
});
