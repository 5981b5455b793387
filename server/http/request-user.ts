import type { Role } from '../../shared/schemas/user';

/** The signed-in user a request acts for, as the authentication middleware resolved it. */
export interface AuthenticatedUser {
  id: number;
  email: string;
  name: string;
  role: Role;
  supplierCode: string | null;
  /** The session the request's token names; sign-out ends this one. */
  sessionId: string;
}

declare module 'express-serve-static-core' {
  interface Request {
    user?: AuthenticatedUser;
  }
}
