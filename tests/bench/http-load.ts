import autocannon, { type Request as LoadRequest } from 'autocannon';
import { once } from 'node:events';
import type { AddressInfo } from 'node:net';
import { createApp } from '../../server/app';
import type { Database } from '../../server/db/database';
import { createServices } from '../../server/services';
import { UserEntity } from '../../server/users/user.entity';
import { signInAs } from './database.bench';

/*
 * What the benches that put HTTP load on a real server share: a signed-in bench user, an app
 * listening on loopback, and autocannon runs reduced to requests a second and latency percentiles.
 */

export const BENCH_SECRET = 'bench-secret-bench-secret-bench-secret-bench';

export const ms = (value: number) => `${value < 10 ? value.toFixed(1) : value.toFixed(0)} ms`;

/** An admin (who may read every screen and count receipts) and a token of a live session of theirs. */
export async function benchUser(db: Database): Promise<string> {
  const admin = await db.dataSource.getRepository(UserEntity).save({
    email: 'bench@example.com',
    name: 'Bench',
    role: 'admin',
    passwordHash: 'not-used',
    supplierCode: null,
  });
  return signInAs(db, admin.id, BENCH_SECRET);
}

/** Serves the whole app over `db` on a free loopback port. */
export async function listen(db: Database) {
  const services = createServices(db, { jwtSecret: BENCH_SECRET });
  const server = createApp(db, { jwtSecret: BENCH_SECRET }, services).listen(0, '127.0.0.1');
  await once(server, 'listening');
  const { port } = server.address() as AddressInfo;
  return {
    base: `http://127.0.0.1:${port}`,
    async close() {
      server.closeAllConnections();
      server.close();
      await services.lineRisk.close();
    },
  };
}

export interface LoadOptions {
  connections: number;
  /** Seconds. */
  duration: number;
  /** Requests made in turn by every connection; a plain GET of `url` when omitted. */
  requests?: LoadRequest[];
}

export interface LoadFigures {
  perSecond: number;
  p50: number;
  p99: number;
  total: number;
  /** Connection errors and timeouts, and answers outside 2xx. */
  failed: number;
  byStatus: Record<string, number>;
}

/** Puts `connections` clients on `url` for `duration` seconds, each sending the next request as soon as an answer arrives. */
export async function load(url: string, token: string, options: LoadOptions): Promise<LoadFigures> {
  const result = await autocannon({
    url,
    connections: options.connections,
    duration: options.duration,
    headers: { Authorization: `Bearer ${token}`, 'Accept-Encoding': 'gzip' },
    ...(options.requests && { requests: options.requests }),
  });
  const byStatus = Object.fromEntries(
    Object.entries(result.statusCodeStats ?? {}).map(([status, { count }]) => [status, Number(count)]),
  );
  return {
    perSecond: result.requests.average,
    p50: result.latency.p50,
    p99: result.latency.p99,
    total: result.requests.total,
    failed: result.errors + result.non2xx,
    byStatus,
  };
}

export function formatLoad(figures: LoadFigures): string {
  return (
    `${figures.perSecond.toFixed(0).padStart(5)} req/s, p50 ${ms(figures.p50).padStart(7)}, p99 ${ms(figures.p99).padStart(7)}` +
    (figures.failed ? `, ${figures.failed} failed` : '')
  );
}
