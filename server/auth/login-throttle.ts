import { LessThan, MoreThan } from 'typeorm';
import type { Database } from '../db/database';
import { RateLimitedError } from '../errors';
import { LoginFailureEntity } from './login-failure.entity';

export interface ThrottleLimits {
  /** Failed sign-ins on one account, from anywhere, within the window. */
  perAccount: number;
  /** Failed sign-ins from one client address, on any account, within the window. */
  perAddress: number;
}

export const THROTTLE_WINDOW_MS = 15 * 60_000;

/**
 * Sign-in throttling kept in the database, so every app node counts the same failures. An account
 * is protected from many addresses guessing its password (per account), and a single address from
 * trying many accounts (per address) — with a per-address limit well above one person's typos, so
 * colleagues behind the same proxy are not locked out by one of them.
 */
export class LoginThrottle {
  constructor(
    private readonly db: Database,
    private readonly limits: ThrottleLimits,
  ) {}

  /** Throws 429 when either count has reached its limit in the window; says which and for how long. */
  async check(email: string, address: string, now = new Date()): Promise<void> {
    const since = new Date(now.getTime() - THROTTLE_WINDOW_MS).toISOString();
    const manager = this.db.manager;
    const account = await manager.find(LoginFailureEntity, {
      where: { email, at: MoreThan(since) },
      order: { at: 'ASC' },
    });
    const fromAddress = await manager.find(LoginFailureEntity, {
      where: { address, at: MoreThan(since) },
      order: { at: 'ASC' },
    });
    const wait = (failures: LoginFailureEntity[], limit: number) => {
      const freedAt = new Date(failures[failures.length - limit].at).getTime() + THROTTLE_WINDOW_MS;
      return Math.max(1, Math.ceil((freedAt - now.getTime()) / 60_000));
    };
    if (account.length >= this.limits.perAccount) {
      const minutes = wait(account, this.limits.perAccount);
      throw new RateLimitedError(
        `Too many failed sign-ins for this account. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}, or ask an admin to e-mail you a password-reset link.`,
        [{ scope: 'account', retryAfterMinutes: minutes }],
      );
    }
    if (fromAddress.length >= this.limits.perAddress) {
      const minutes = wait(fromAddress, this.limits.perAddress);
      throw new RateLimitedError(
        `Too many failed sign-ins from this network address. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}.`,
        [{ scope: 'address', retryAfterMinutes: minutes }],
      );
    }
  }

  /** Counts one failure; failures older than a day are pruned on the way. */
  async recordFailure(email: string, address: string, now = new Date()): Promise<void> {
    await this.db.write(async (manager) => {
      await manager.insert(LoginFailureEntity, { email, address: address.slice(0, 64), at: now.toISOString() });
      await manager.delete(LoginFailureEntity, { at: LessThan(new Date(now.getTime() - 86_400_000).toISOString()) });
    });
  }
}
