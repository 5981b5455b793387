import type { LoginRequest, LoginResponse } from '../../shared/schemas/user';
import { UnauthorizedError } from '../errors';
import { UserEntity } from '../users/user.entity';
import { toSessionUser } from '../users/users.service';
import { hashPassword, verifyPassword } from '../users/passwords';
import { signSessionToken } from './tokens';
import type { Database } from '../db/database';

export class AuthService {
  // Compared against when the e-mail is unknown, so both failures take the same time.
  private readonly decoyHash = hashPassword('not-a-real-password-decoy');

  constructor(
    private readonly db: Database,
    private readonly jwtSecret: string,
    private readonly jwtTtl: string,
  ) {}

  async login({ email, password }: LoginRequest): Promise<LoginResponse> {
    const user = await this.db.manager.getRepository(UserEntity).findOneBy({ email });
    const valid = await verifyPassword(user?.passwordHash ?? (await this.decoyHash), password);
    if (!user || !valid || !user.active) throw new UnauthorizedError('E-mail or password is not right.');
    return { token: signSessionToken(user.id, this.jwtSecret, this.jwtTtl), user: toSessionUser(user) };
  }
}
