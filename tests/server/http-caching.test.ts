import { get, type IncomingHttpHeaders } from 'node:http';
import type { AddressInfo } from 'node:net';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gunzipSync } from 'node:zlib';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeCalendar } from '../../server/calendar/calendar.service';
import { replaceBomLines } from '../../server/master-data/master-data.writer';
import { upsertSequenceEntries } from '../../server/sequence/sequence.writer';
import { savePartsWithStock } from '../../server/stock/stock.service';
import { bearer, createTestContext, testPart, type TestContext } from './helpers';

let context: TestContext;
let clientDir: string;
const ASSET = 'HorizonView-Dq3x9_Ab.js';

/** Gets a path over a real socket and keeps the body as sent (supertest would unzip it). */
function raw(path: string, encoding: string): Promise<{ status: number; headers: IncomingHttpHeaders; body: Buffer }> {
  const server = context.app.listen(0);
  const { port } = server.address() as AddressInfo;
  return new Promise((resolve, reject) => {
    get({ port, path, headers: { ...bearer(context.tokens.buyer), 'Accept-Encoding': encoding } }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (chunk: Buffer) => chunks.push(chunk));
      res.on('end', () => {
        server.close();
        resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) });
      });
    }).on('error', (error) => {
      server.close();
      reject(error);
    });
  });
}

beforeAll(async () => {
  clientDir = mkdtempSync(join(tmpdir(), 'cardloop-client-'));
  mkdirSync(join(clientDir, 'assets'));
  writeFileSync(join(clientDir, 'index.html'), '<!doctype html><title>Cardloop</title>');
  writeFileSync(join(clientDir, 'assets', ASSET), 'export default 1;\n');
  writeFileSync(join(clientDir, 'favicon.svg'), '<svg xmlns="http://www.w3.org/2000/svg"/>');
  context = await createTestContext({ clientDir });
  // Enough bought parts for a demand answer well above the compression threshold.
  await context.dataSource.transaction(async (manager) => {
    await writeCalendar(manager, { workingWeekdays: [1, 2, 3, 4, 5], holidays: [] });
    const bought = Array.from({ length: 40 }, (_, index) => testPart(`BUY-${index}`, { onHand: 0 }));
    await savePartsWithStock(manager, [
      testPart('M', { source: 'end_item', supplierCode: null, replenishment: null }),
      ...bought,
    ]);
    await replaceBomLines(
      manager,
      bought.map((part) => ({
        parent: 'M',
        component: part.partNumber,
        qtyPer: 1,
        scrapPct: 0,
        effectiveFrom: null,
        effectiveTo: null,
      })),
    );
    await upsertSequenceEntries(manager, [{ date: '2026-12-21', sequence: 1, model: 'M', serial: 'S1', qty: 1 }]);
  });
});
afterAll(async () => {
  await context.close();
  rmSync(clientDir, { recursive: true, force: true });
});

describe('client files', () => {
  it('lets the browser keep hashed assets for a year without asking again', async () => {
    const response = await request(context.app).get(`/assets/${ASSET}`);

    expect(response.status).toBe(200);
    expect(response.headers['cache-control']).toBe('public, max-age=31536000, immutable');
  });

  it('has the browser ask again for the page and for files without a hash', async () => {
    const page = await request(context.app).get('/horizon');
    const icon = await request(context.app).get('/favicon.svg');

    expect(page.status).toBe(200);
    expect(page.headers['cache-control']).toBe('no-cache');
    expect(icon.status).toBe(200);
    expect(icon.headers['cache-control']).toBe('no-cache');
  });
});

describe('compression', () => {
  it('gzips a large JSON answer for a client that takes gzip, and not for one that does not', async () => {
    const gzipped = await raw('/api/openapi.json', 'gzip');
    const plain = await raw('/api/openapi.json', 'identity');

    expect(gzipped.headers['content-encoding']).toBe('gzip');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(gunzipSync(gzipped.body).equals(plain.body)).toBe(true);
    expect(gzipped.body.length).toBeLessThan(plain.body.length);
  });
});

describe('GET /api/demand, served from its serialised copy', () => {
  const path = '/api/demand?from=2026-12-21&to=2026-12-24';

  it('sends the same bytes, gzipped or not, with one ETag, and 304 to a client that holds them', async () => {
    const first = await raw(path, 'identity');
    const gzipped = await raw(path, 'gzip');
    const again = await request(context.app)
      .get(path)
      .set(bearer(context.tokens.buyer))
      .set('If-None-Match', String(first.headers.etag));

    expect(first.status).toBe(200);
    expect(first.headers['content-type']).toMatch(/^application\/json/);
    expect(JSON.parse(first.body.toString()).rows).toHaveLength(40);
    expect(gzipped.headers['content-encoding']).toBe('gzip');
    expect(gunzipSync(gzipped.body).equals(first.body)).toBe(true);
    expect(gzipped.headers.etag).toBe(first.headers.etag);
    expect(first.headers.vary).toMatch(/Accept-Encoding/);
    expect(again.status).toBe(304);
  });

  it('answers afresh, with a new ETag, once a planning input changed', async () => {
    const before = await request(context.app).get(path).set(bearer(context.tokens.buyer));

    await context.db.write((manager) =>
      upsertSequenceEntries(manager, [{ date: '2026-12-22', sequence: 1, model: 'M', serial: 'S2', qty: 1 }]),
    );
    const after = await request(context.app)
      .get(path)
      .set(bearer(context.tokens.buyer))
      .set('If-None-Match', before.headers.etag);

    expect(after.status).toBe(200);
    expect(after.headers.etag).not.toBe(before.headers.etag);
    // One unit of M needs one BUY-0: the new unit on 22 Dec shows as demand that day.
    const dayOf = (body: { rows: { partNumber: string; byDay: Record<string, number> }[] }) =>
      body.rows.find((row) => row.partNumber === 'BUY-0')?.byDay['2026-12-22'] ?? 0;
    expect(dayOf(before.body)).toBe(0);
    expect(dayOf(after.body)).toBe(1);
  });
});

describe('GET /api/line-risk, served from its serialised copy', () => {
  it('answers a client that holds the same report with 304', async () => {
    const path = '/api/line-risk?from=2026-12-21&to=2026-12-24';
    const first = await request(context.app).get(path).set(bearer(context.tokens.planner));
    const again = await request(context.app)
      .get(path)
      .set(bearer(context.tokens.planner))
      .set('If-None-Match', String(first.headers.etag));

    expect(first.status).toBe(200);
    expect(first.body.unitsInHorizon).toBeGreaterThan(0);
    expect(again.status).toBe(304);
  });
});
