import { get, type IncomingMessage } from 'node:http';
import type { AddressInfo, Server } from 'node:net';

export interface EventStream {
  stream: IncomingMessage;
  /** The next event of that name, whether it arrived before the call or arrives after. */
  next: <T = unknown>(event: string) => Promise<T>;
  /**
   * The first event of that name carrying a version above the one given: a notice of a write made
   * before the stream opened may still arrive after it (PostgreSQL delivers on commit).
   */
  nextPast: (event: string, version: number) => Promise<{ version: number }>;
  close: () => void;
}

/**
 * Opens GET /api/events and keeps every event from the first byte on, so an event sent while a
 * test awaits some other request is not lost (PostgreSQL may deliver a notice before the
 * request that caused it has answered).
 */
export function openEventStream(server: Server, headers: Record<string, string>): Promise<EventStream> {
  const { port } = server.address() as AddressInfo;
  return new Promise((resolve, reject) => {
    const req = get({ port, path: '/api/events', headers }, (stream) => {
      let buffer = '';
      const arrived: { event: string; payload: unknown }[] = [];
      const waiting: { event: string; done: (payload: unknown) => void }[] = [];
      stream.on('data', (chunk: Buffer) => {
        buffer += chunk.toString('utf8');
        let match: RegExpMatchArray | null;
        while ((match = buffer.match(/event: (\w+)\ndata: (.*)\n\n/))) {
          buffer = buffer.slice((match.index ?? 0) + match[0].length);
          const event = match[1];
          const payload: unknown = JSON.parse(match[2]);
          const waiter = waiting.findIndex((entry) => entry.event === event);
          if (waiter >= 0) waiting.splice(waiter, 1)[0].done(payload);
          else arrived.push({ event, payload });
        }
      });
      const next = <T>(event: string): Promise<T> => {
        const index = arrived.findIndex((entry) => entry.event === event);
        if (index >= 0) return Promise.resolve(arrived.splice(index, 1)[0].payload as T);
        return new Promise<T>((done) => waiting.push({ event, done: done as (payload: unknown) => void }));
      };
      const nextPast = async (event: string, version: number): Promise<{ version: number }> => {
        let payload = await next<{ version: number }>(event);
        while (payload.version <= version) payload = await next<{ version: number }>(event);
        return payload;
      };
      resolve({ stream, next, nextPast, close: () => stream.destroy() });
    });
    req.on('error', reject);
  });
}
