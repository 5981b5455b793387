import type { NextFunction, Request, Response } from 'express';
import type { DataSource } from 'typeorm';
import type { Role } from '../../shared/schemas/user';
import { verifySessionToken } from './tokens';
import { UserEntity } from '../users/user.entity';

export interface AuthenticatedUser {
  id: number;
  email: string;
  name: string;
  role: Role;
  supplierCode: string | null;
}

declare module 'express-serve-static-core' {
  interface Request {
    user?: AuthenticatedUser;
  }
}

export const SESSION_COOKIE = 'cardloop_session';

/** Resolves the bearer token (or session cookie) to an active user; routes decide whether one is needed. */
export function authenticate(dataSource: DataSource, jwtSecret: string) {
  const users = dataSource.getRepository(UserEntity);
  return async (req: Request, _res: Response, next: NextFunction) => {
    const header = req.headers.authorization;
    const token = header?.startsWith('Bearer ') ? header.slice(7).trim() : req.cookies?.[SESSION_COOKIE];
    if (token) {
      const userId = verifySessionToken(token, jwtSecret);
      const user = userId ? await users.findOneBy({ id: userId, active: true }) : null;
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
