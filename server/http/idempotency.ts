import { createHash } from 'node:crypto';
import type { Request } from 'express';
import type { EntityManager } from 'typeorm';
import { IDEMPOTENCY_HEADER, idempotencyKeySchema } from '../../shared/schemas/idempotency';
import { BadRequestError, ConflictError } from '../errors';
import { IdempotentRequestEntity } from './idempotent-request.entity';

/** The request's Idempotency-Key, or 400 naming the header; `what` says what a fresh key is for. */
export function readIdempotencyKey(req: Request, what: string): string {
  const parsed = idempotencyKeySchema.safeParse(req.get(IDEMPOTENCY_HEADER) ?? '');
  if (parsed.success) return parsed.data;
  const message = `The ${IDEMPOTENCY_HEADER} header ${parsed.error.issues[0]?.message ?? 'is invalid'}: send a fresh key (1–100 characters) with each new ${what}.`;
  throw new BadRequestError(message, [{ path: [IDEMPOTENCY_HEADER], message }]);
}

export interface IdempotentOutcome<T> {
  /** True when this request did the work; false when it replays an earlier answer. */
  created: boolean;
  body: T;
}

/**
 * Runs `work` once per key within `scope`, inside the caller's write unit: the same key with the
 * same body again returns the first answer and changes nothing; the same key with another body is
 * a 409. A request that failed stored nothing, so it may be retried with its key.
 */
export async function oncePerKey<T>(
  manager: EntityManager,
  scope: string,
  key: string,
  request: unknown,
  work: () => Promise<T>,
): Promise<IdempotentOutcome<T>> {
  const requestHash = createHash('sha256').update(JSON.stringify(request)).digest('hex');
  const earlier = await manager.findOneBy(IdempotentRequestEntity, { scope, idempotencyKey: key });
  if (earlier) {
    if (earlier.requestHash !== requestHash) {
      throw new ConflictError(
        `This ${IDEMPOTENCY_HEADER} was already used for a different request; send a new key for a new one.`,
        [{ idempotencyKey: key }],
        'idempotency_key_reused',
      );
    }
    return { created: false, body: JSON.parse(earlier.response) as T };
  }
  const body = await work();
  await manager.insert(IdempotentRequestEntity, {
    scope,
    idempotencyKey: key,
    requestHash,
    status: 201,
    response: JSON.stringify(body),
    createdAt: new Date().toISOString(),
  });
  return { created: true, body };
}
