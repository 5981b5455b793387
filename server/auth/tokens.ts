import jwt from 'jsonwebtoken';
import { createSecretKey, type KeyObject } from 'node:crypto';

const ALGORITHM = 'HS256';
const ISSUER = 'cardloop';

export interface SessionClaims {
  userId: number;
  sessionId: string;
}

const UNIT_MS: Record<string, number> = { s: 1000, m: 60_000, h: 3_600_000, d: 86_400_000 };

let lastKey: { secret: string; key: KeyObject } | undefined;

/**
 * The secret as a key object, made once: given a string, jsonwebtoken first tries to read it as a
 * PEM public key and builds the secret key only after that throws, on every call, which cost more
 * than the rest of an authenticated request.
 */
function keyOf(secret: string): KeyObject {
  if (lastKey?.secret !== secret) lastKey = { secret, key: createSecretKey(Buffer.from(secret)) };
  return lastKey.key;
}

/** When a session signed now with a lifetime like `8h` or `30m` ends. */
export function sessionExpiry(ttl: string, now = new Date()): Date {
  const match = /^(\d+)([smhd])$/.exec(ttl);
  if (!match) throw new RangeError(`A session lifetime is a number and s, m, h or d, got ${ttl}`);
  return new Date(now.getTime() + Number(match[1]) * UNIT_MS[match[2]]);
}

/** Signs a token naming the user and the session, valid until `expiresAt`; the algorithm is pinned. */
export function signSessionToken(claims: SessionClaims, secret: string, expiresAt: Date): string {
  return jwt.sign({ sid: claims.sessionId, exp: Math.floor(expiresAt.getTime() / 1000) }, keyOf(secret), {
    algorithm: ALGORITHM,
    issuer: ISSUER,
    subject: String(claims.userId),
  });
}

/** The user and session of a valid, unexpired token, or null. Whether the session still lives is the caller's check. */
export function verifySessionToken(token: string, secret: string): SessionClaims | null {
  try {
    const claims = jwt.verify(token, keyOf(secret), { algorithms: [ALGORITHM], issuer: ISSUER }) as jwt.JwtPayload;
    const userId = Number(claims.sub);
    const sessionId = typeof claims.sid === 'string' ? claims.sid : '';
    return Number.isInteger(userId) && userId > 0 && sessionId.length > 0 ? { userId, sessionId } : null;
  } catch {
    return null;
  }
}
