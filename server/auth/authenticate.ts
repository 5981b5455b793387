import type { NextFunction, Request, Response } from 'express';
import type { Database } from '../db/database';
import type { Role } from '../../shared/schemas/user';
import { verifySessionToken } from './tokens';
import { UserEntity } from '../users/user.entity';

export const SESSION_COOKIE = 'cardloop_session';

/** Resolves the bearer token (or session cookie) to an active user; routes decide whether one is needed. */
export function authenticate(db: Database, jwtSecret: string) {
  return async (req: Request, _res: Response, next: NextFunction) => {
    const header = req.headers.authorization;
    const token = header?.startsWith('Bearer ') ? header.slice(7).trim() : req.cookies?.[SESSION_COOKIE];
    if (token) {
      const userId = verifySessionToken(token, jwtSecret);
      const user = userId ? await db.manager.findOneBy(UserEntity, { id: userId, active: true }) : null;
      if (user) {
        req.user = {
          id: user.id,
          email: user.email,
          name: user.name,
          role: user.role as Role,
          supplierCode: user.supplierCode,
        };
      }
    }
    next();
  };
}
