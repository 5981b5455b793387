import type { CreateUserRequest, Role, SessionUser, UpdateUserRequest, User } from '../../shared/schemas/user';
import { recordAudit } from '../audit/audit.service';
import { hashPassword } from './passwords';
import { revokeSessions } from './sessions';
import { BadRequestError, ConflictError, NotFoundError } from '../errors';
import type { AuthenticatedUser } from '../http/request-user';
import { SupplierEntity } from '../master-data/supplier.entity';
import { UserEntity } from './user.entity';
import type { Database } from '../db/database';
import { assertCurrent, withVersion } from '../http/versions';

export function toSessionUser(user: Pick<UserEntity, 'email' | 'name' | 'role' | 'supplierCode'>): SessionUser {
  return { email: user.email, name: user.name, role: user.role as Role, supplierCode: user.supplierCode };
}

function toUser(user: UserEntity): User {
  const { version, ...rest } = withVersion({ ...toSessionUser(user), active: user.active });
  return { id: user.id, ...rest, createdAt: user.createdAt.toISOString(), version };
}

export class UsersService {
  constructor(private readonly db: Database) {}

  async list(): Promise<User[]> {
    const users = await this.db.manager.getRepository(UserEntity).find({ order: { name: 'ASC' } });
    return users.map(toUser);
  }

  async create(request: CreateUserRequest, actor: AuthenticatedUser | null): Promise<User> {
    const supplierCode = request.role === 'supplier' ? request.supplierCode! : null;
    const passwordHash = await hashPassword(request.password);
    return this.db.write(async (manager) => {
      if (await manager.existsBy(UserEntity, { email: request.email })) {
        throw new ConflictError(`A user with e-mail ${request.email} already exists.`, [
          { path: ['email'], message: 'already in use' },
        ]);
      }
      if (supplierCode) await assertSupplierExists(manager.getRepository(SupplierEntity), supplierCode);
      const user = await manager.save(
        manager.create(UserEntity, {
          email: request.email,
          name: request.name,
          role: request.role,
          passwordHash,
          supplierCode,
        }),
      );
      await recordAudit(manager, {
        actorEmail: actor?.email ?? null,
        action: 'create',
        entity: 'user',
        entityKey: user.email,
        changes: { role: user.role, supplierCode },
      });
      return toUser(user);
    });
  }

  async update(id: number, patch: UpdateUserRequest, actor: AuthenticatedUser, basedOn?: string): Promise<User> {
    const passwordHash = patch.password ? await hashPassword(patch.password) : undefined;
    return this.db.write(async (manager) => {
      const user = await manager.findOneBy(UserEntity, { id });
      if (!user) throw new NotFoundError(`No user with id ${id}.`);
      assertCurrent(basedOn, toUser(user), `The account of ${user.email}`);
      if (user.id === actor.id && (patch.active === false || (patch.role && patch.role !== 'admin'))) {
        throw new BadRequestError('You cannot disable yourself or take away your own admin role.');
      }
      const role = patch.role ?? user.role;
      const supplierCode = role === 'supplier' ? (patch.supplierCode ?? user.supplierCode) : null;
      if (role === 'supplier') {
        if (!supplierCode) {
          throw new BadRequestError('A supplier user must be bound to a supplier.', [
            { path: ['supplierCode'], message: 'required for role supplier' },
          ]);
        }
        await assertSupplierExists(manager.getRepository(SupplierEntity), supplierCode);
      }
      const before = { role: user.role, active: user.active, supplierCode: user.supplierCode };
      // What a token lets its holder do is re-read on every request, but a password change, a
      // deactivation or a new role ends every session at once: nobody keeps what they had.
      const endReason =
        patch.active === false && user.active
          ? 'deactivated'
          : passwordHash
            ? 'password-changed'
            : role !== user.role || supplierCode !== user.supplierCode
              ? 'role-changed'
              : null;
      user.role = role;
      user.supplierCode = supplierCode;
      if (patch.active !== undefined) user.active = patch.active;
      if (passwordHash) user.passwordHash = passwordHash;
      await manager.save(user);
      const sessionsEnded = endReason ? await revokeSessions(manager, user.id, endReason) : 0;
      await recordAudit(manager, {
        actorEmail: actor.email,
        action: 'update',
        entity: 'user',
        entityKey: user.email,
        changes: {
          before,
          after: { role: user.role, active: user.active, supplierCode },
          passwordChanged: !!passwordHash,
          sessionsEnded,
        },
      });
      return toUser(user);
    });
  }
}

async function assertSupplierExists(repository: { existsBy(where: object): Promise<boolean> }, code: string) {
  if (!(await repository.existsBy({ code }))) {
    throw new BadRequestError(`Unknown supplier ${code}.`, [
      { path: ['supplierCode'], message: `no supplier ${code}` },
    ]);
  }
}
