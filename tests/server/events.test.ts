import { get, type IncomingMessage } from 'node:http';
import type { AddressInfo, Server } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { bumpPlanningVersion } from '../../server/settings/versions';
import { createTestContext, type TestContext } from './helpers';

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

function openStream(token: string): Promise<IncomingMessage> {
  const { port } = server.address() as AddressInfo;
  return new Promise((resolve) => {
    get({ port, path: '/api/events', headers: { Authorization: `Bearer ${token}` } }, resolve);
  });
}

function nextEvent(stream: IncomingMessage): Promise<string> {
  return new Promise((resolve) => {
    let buffer = '';
    const onData = (chunk: Buffer) => {
      buffer += chunk.toString('utf8');
      const match = buffer.match(/event: planning\ndata: (.*)\n\n/);
      if (match) {
        stream.off('data', onData);
        resolve(match[1]);
      }
    };
    stream.on('data', onData);
  });
}

describe('GET /api/events', () => {
  it('sends the planning version on connect and again after a planning input changes', async () => {
    const stream = await openStream(context.tokens.viewer);
    const first = JSON.parse(await nextEvent(stream));

    const nextVersion = await context.db.write((manager) => bumpPlanningVersion(manager));
    const second = JSON.parse(await nextEvent(stream));

    expect(stream.headers['content-type']).toBe('text/event-stream');
    expect(second.version).toBe(nextVersion);
    expect(second.version).toBeGreaterThan(first.version);
    stream.destroy();
  });

  it('refuses a supplier account', async () => {
    const stream = await openStream(context.tokens.supplier);

    expect(stream.statusCode).toBe(403);
    stream.destroy();
  });
});
