import type { NextFunction, Request, Response } from 'express';
import type { AuthService } from './auth.service';

export const SESSION_COOKIE = 'cardloop_session';

/** The session token a request carries: the bearer token, or the session cookie. */
export function tokenOf(req: Request): string | undefined {
  const header = req.headers.authorization;
  return header?.startsWith('Bearer ') ? header.slice(7).trim() : req.cookies?.[SESSION_COOKIE];
}

/** Resolves the bearer token (or session cookie) to the user of a live session; routes decide whether one is needed. */
export function authenticate(auth: AuthService) {
  return async (req: Request, _res: Response, next: NextFunction) => {
    const token = tokenOf(req);
    if (token) {
      const user = await auth.resolve(token);
      if (user) req.user = user;
    }
    next();
  };
}
