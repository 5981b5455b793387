import type { Request, Response } from 'express';
import { createHash } from 'node:crypto';
import { promisify } from 'node:util';
import { gzip } from 'node:zlib';

const gzipAsync = promisify(gzip);
/** Below this many bytes gzip saves too little to be worth it (the compression middleware's own default). */
const GZIP_THRESHOLD = 1024;

/**
 * A JSON answer serialised once and sent as is to every request that asks for the same thing, with
 * a strong ETag of its bytes and a gzipped copy made on first demand (off the event loop, in zlib's
 * thread pool). Rebuilding and compressing a large plan's demand per request costs far more than
 * sending bytes that are ready.
 */
export class SerialisedBody {
  readonly etag: string;
  private gzipped: Promise<Buffer> | null;

  /** Bytes already serialised (in a worker thread, say), with their ETag and gzipped copy if made there too. */
  constructor(
    readonly json: Buffer,
    etag?: string,
    gzipped?: Buffer,
  ) {
    this.etag = etag ?? etagOf(json);
    this.gzipped = gzipped ? Promise.resolve(gzipped) : null;
  }

  static of(value: unknown): SerialisedBody {
    return new SerialisedBody(Buffer.from(JSON.stringify(value)));
  }

  gzip(): Promise<Buffer> {
    this.gzipped ??= gzipAsync(this.json);
    return this.gzipped;
  }
}

/** A strong ETag of some bytes. */
export function etagOf(bytes: Uint8Array): string {
  return `"${createHash('sha1').update(bytes).digest('base64url')}"`;
}

/**
 * Sends a serialised body: 304 when the client holds the same bytes, the gzipped copy when the
 * client takes gzip (the compression middleware leaves an encoded body alone), the JSON otherwise.
 */
export async function sendSerialised(req: Request, res: Response, body: SerialisedBody): Promise<void> {
  res.setHeader('ETag', body.etag);
  res.setHeader('Vary', 'Accept-Encoding');
  res.type('application/json');
  if (req.fresh) {
    res.status(304).end();
    return;
  }
  if (body.json.length >= GZIP_THRESHOLD && req.acceptsEncodings('gzip', 'identity') === 'gzip') {
    const gzipped = await body.gzip();
    res.setHeader('Content-Encoding', 'gzip');
    res.send(gzipped);
    return;
  }
  res.send(body.json);
}
