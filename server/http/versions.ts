import { createHash } from 'node:crypto';
import type { Request } from 'express';
import { ConflictError } from '../errors';

/*
 * Optimistic concurrency for everything people edit: a representation carries a `version` (a hash
 * of its content), the client sends it back in `If-Match`, and a change made on a stale copy is
 * refused with 409 `stale` and the current state, instead of silently undoing someone else's.
 */

/** A short hash of a value's JSON; equal content, equal version. */
export function versionOf(value: unknown): string {
  return createHash('sha256').update(JSON.stringify(value)).digest('base64url').slice(0, 16);
}

/** The representation with its version beside it. */
export function withVersion<T extends object>(value: T): T & { version: string } {
  return { ...value, version: versionOf(value) };
}

/** The version the client based its change on: the If-Match header, quotes and weak prefix removed. */
export function ifMatchOf(req: Request): string | undefined {
  const header = req.get('If-Match')?.trim();
  if (!header || header === '*') return undefined;
  return header.replace(/^W\//, '').replace(/^"|"$/g, '');
}

/** Throws 409 `stale` with the current state when the change was based on another version. */
export function assertCurrent(expected: string | undefined, current: { version: string }, what: string): void {
  if (expected === undefined || expected === current.version) return;
  throw new ConflictError(
    `${what} was changed by someone else since you opened it; it is shown as it is now. Make your change again.`,
    [{ current }],
    'stale',
  );
}
