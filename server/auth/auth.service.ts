import { createHash, randomBytes } from 'node:crypto';
import { IsNull } from 'typeorm';
import type {
  ChangePasswordRequest,
  LoginRequest,
  LoginResponse,
  PasswordResetInfo,
  PasswordResetRequest,
} from '../../shared/schemas/user';
import { recordAudit } from '../audit/audit.service';
import { notifyAfterCommit, type Database } from '../db/database';
import { ConflictError, GoneError, InvalidInputError, NotFoundError, UnauthorizedError } from '../errors';
import type { AuthenticatedUser } from '../http/request-user';
import { enqueueMail } from '../outbox/outbox.service';
import { hashPassword, verifyPassword } from '../users/passwords';
import { SessionEntity } from '../users/session.entity';
import { openSession, revokeSessions, SESSIONS_CHANNEL, type SessionsRevoked } from '../users/sessions';
import { UserEntity } from '../users/user.entity';
import { toSessionUser } from '../users/users.service';
import { LoginThrottle, type ThrottleLimits } from './login-throttle';
import { PasswordResetEntity } from './password-reset.entity';
import { SessionCache } from './session-cache';
import { sessionExpiry, signSessionToken, verifySessionToken } from './tokens';

/** A password-reset link works this long after the admin sent it. */
const RESET_LINK_HOURS = 24;

export interface AuthOptions {
  jwtSecret: string;
  jwtTtl: string;
  appUrl: string;
  throttle: ThrottleLimits;
}

const hashToken = (token: string) => createHash('sha256').update(token).digest('hex');

/** Sign-in, sessions the server can end, password changes and admin-sent reset links. */
export class AuthService {
  // Compared against when the e-mail is unknown, so both failures take the same time.
  private readonly decoyHash = hashPassword('not-a-real-password-decoy');
  private readonly throttle: LoginThrottle;
  private readonly sessions: SessionCache;

  constructor(
    private readonly db: Database,
    private readonly options: AuthOptions,
  ) {
    this.throttle = new LoginThrottle(db, options.throttle);
    this.sessions = new SessionCache([db.changes, db.committedHere]);
  }

  /** Signs in and opens a session; 401 on a wrong e-mail or password, 429 while throttled. */
  async login({ email, password }: LoginRequest, address: string): Promise<LoginResponse> {
    await this.throttle.check(email, address);
    const user = await this.db.manager.findOneBy(UserEntity, { email });
    const valid = await verifyPassword(user?.passwordHash ?? (await this.decoyHash), password);
    if (!user || !valid || !user.active) {
      await this.throttle.recordFailure(email, address);
      throw new UnauthorizedError('E-mail or password is not right.');
    }
    const expiresAt = sessionExpiry(this.options.jwtTtl);
    const session = await this.db.write((manager) => openSession(manager, user.id, expiresAt));
    const token = signSessionToken({ userId: user.id, sessionId: session.id }, this.options.jwtSecret, expiresAt);
    return { token, user: toSessionUser(user) };
  }

  /** The user of a token whose session still lives, or null (expired, revoked, user inactive). */
  async resolve(token: string): Promise<AuthenticatedUser | null> {
    const claims = verifySessionToken(token, this.options.jwtSecret);
    if (!claims) return null;
    const cached = this.sessions.get(claims.sessionId, claims.userId);
    if (cached) return cached;
    const mark = this.sessions.mark();
    const manager = this.db.manager;
    const session = await manager.findOneBy(SessionEntity, { id: claims.sessionId, userId: claims.userId });
    if (!session || session.revokedAt !== null || session.expiresAt <= new Date().toISOString()) return null;
    const user = await manager.findOneBy(UserEntity, { id: claims.userId, active: true });
    if (!user) return null;
    const resolved = { ...toSessionUser(user), id: user.id, sessionId: session.id };
    // Read in a write unit, the session may not be committed yet: not to be believed by others.
    if (!this.db.inWriteUnit) this.sessions.set(resolved, session.expiresAt, mark);
    return resolved;
  }

  /** Ends this session only; other devices stay signed in. */
  async logout(user: AuthenticatedUser): Promise<void> {
    await this.db.write(async (manager) => {
      await manager.update(
        SessionEntity,
        { id: user.sessionId, revokedAt: IsNull() },
        { revokedAt: new Date().toISOString(), revokedReason: 'sign-out' },
      );
      notifyAfterCommit(SESSIONS_CHANNEL, { userId: user.id, sessionIds: [user.sessionId] } satisfies SessionsRevoked);
      await recordAudit(manager, { actorEmail: user.email, action: 'sign-out', entity: 'user', entityKey: user.email });
    });
  }

  /** A signed-in user changes their own password; every other session of theirs ends. */
  async changePassword(user: AuthenticatedUser, request: ChangePasswordRequest, address: string): Promise<void> {
    await this.throttle.check(user.email, address);
    const stored = await this.db.manager.findOneByOrFail(UserEntity, { id: user.id });
    if (!(await verifyPassword(stored.passwordHash, request.currentPassword))) {
      await this.throttle.recordFailure(user.email, address);
      throw new InvalidInputError('The current password is not right.', [
        { path: ['currentPassword'], message: 'is not your current password' },
      ]);
    }
    const passwordHash = await hashPassword(request.newPassword);
    await this.db.write(async (manager) => {
      await manager.update(UserEntity, { id: user.id }, { passwordHash });
      const ended = await revokeSessions(manager, user.id, 'password-changed', user.sessionId);
      await recordAudit(manager, {
        actorEmail: user.email,
        action: 'change-password',
        entity: 'user',
        entityKey: user.email,
        changes: { otherSessionsEnded: ended },
      });
    });
  }

  /** An admin has a single-use link e-mailed to the user (through the outbox) to set a new password. */
  async sendPasswordReset(userId: number, actor: AuthenticatedUser): Promise<{ to: string; expiresAt: string }> {
    const token = randomBytes(32).toString('base64url');
    const now = new Date();
    const expiresAt = new Date(now.getTime() + RESET_LINK_HOURS * 3_600_000).toISOString();
    return this.db.write(async (manager) => {
      const user = await manager.findOneBy(UserEntity, { id: userId });
      if (!user) throw new NotFoundError(`No user with id ${userId}.`);
      if (!user.active)
        throw new ConflictError(`${user.email} is deactivated; activate the account before resetting its password.`);
      // A newer link replaces any earlier one.
      await manager.update(PasswordResetEntity, { userId, usedAt: IsNull() }, { expiresAt: now.toISOString() });
      await manager.insert(PasswordResetEntity, {
        userId,
        tokenHash: hashToken(token),
        requestedBy: actor.email,
        createdAt: now.toISOString(),
        expiresAt,
        usedAt: null,
      });
      const link = `${this.options.appUrl}/reset-password/${token}`;
      await enqueueMail(manager, {
        to: user.email,
        ref: `password-reset:${user.id}`,
        subject: 'Set a new Cardloop password',
        text: [
          `Hello ${user.name},`,
          '',
          `${actor.name} asked Cardloop to let you set a new password. Open this link within ${RESET_LINK_HOURS} hours:`,
          '',
          link,
          '',
          'The link works once. If you did not expect this, tell your Cardloop administrator.',
        ].join('\n'),
      });
      await recordAudit(manager, {
        actorEmail: actor.email,
        action: 'password-reset-sent',
        entity: 'user',
        entityKey: user.email,
        changes: { expiresAt },
      });
      return { to: user.email, expiresAt };
    });
  }

  /** What the reset page shows before the new password is typed; 404 unknown, 409 used, 410 expired. */
  async passwordResetInfo(token: string): Promise<PasswordResetInfo> {
    const { reset, user } = await this.openReset(token);
    return { email: user.email, name: user.name, expiresAt: reset.expiresAt };
  }

  /** Sets the new password from a reset link; the link is spent and every session of the user ends. */
  async resetPassword(request: PasswordResetRequest): Promise<void> {
    const passwordHash = await hashPassword(request.password);
    await this.db.write(async (manager) => {
      const { reset, user } = await this.openReset(request.token);
      const spent = await manager.update(
        PasswordResetEntity,
        { id: reset.id, usedAt: IsNull() },
        { usedAt: new Date().toISOString() },
      );
      if (spent.affected === 0) throw new ConflictError('This link was already used.');
      await manager.update(UserEntity, { id: user.id }, { passwordHash });
      const ended = await revokeSessions(manager, user.id, 'password-reset');
      await recordAudit(manager, {
        actorEmail: user.email,
        action: 'password-reset',
        entity: 'user',
        entityKey: user.email,
        changes: { sessionsEnded: ended },
      });
    });
  }

  private async openReset(token: string): Promise<{ reset: PasswordResetEntity; user: UserEntity }> {
    const manager = this.db.manager;
    const reset = await manager.findOneBy(PasswordResetEntity, { tokenHash: hashToken(token) });
    const user = reset ? await manager.findOneBy(UserEntity, { id: reset.userId, active: true }) : null;
    if (!reset || !user)
      throw new NotFoundError('This password link is not known. Check that the whole link was copied.');
    if (reset.usedAt) throw new ConflictError('This link was already used. Ask your administrator for a new one.');
    if (reset.expiresAt <= new Date().toISOString()) {
      throw new GoneError(
        'This link has expired or was replaced by a newer one. Ask your administrator for a new one.',
      );
    }
    return { reset, user };
  }
}
