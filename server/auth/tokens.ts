import jwt from 'jsonwebtoken';

const ALGORITHM = 'HS256';
const ISSUER = 'cardloop';

/** Signs a session token for a user id; the algorithm is pinned so a token cannot choose its own. */
export function signSessionToken(userId: number, secret: string, ttl: string): string {
  return jwt.sign({}, secret, {
    algorithm: ALGORITHM,
    issuer: ISSUER,
    subject: String(userId),
    expiresIn: ttl as jwt.SignOptions['expiresIn'],
  });
}

/** Returns the user id of a valid, unexpired token, or null. */
export function verifySessionToken(token: string, secret: string): number | null {
  try {
    const claims = jwt.verify(token, secret, { algorithms: [ALGORITHM], issuer: ISSUER }) as jwt.JwtPayload;
    const userId = Number(claims.sub);
    return Number.isInteger(userId) && userId > 0 ? userId : null;
  } catch {
    return null;
  }
}
