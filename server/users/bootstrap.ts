import type { Database } from '../db/database';
import { hashPassword } from './passwords';
import { UserEntity } from './user.entity';

/** Setting holding the e-mail addresses of the accounts the demo seed created. */
export const DEMO_ACCOUNTS = 'demo.accounts';

export async function isDatabaseEmpty(db: Database): Promise<boolean> {
  return (await db.manager.count(UserEntity)) === 0;
}

/** Makes sure the configured admin exists and may sign in; used when the demo is not seeded. */
export async function ensureAdmin(db: Database, email: string, password: string): Promise<void> {
  const normalised = email.toLowerCase();
  if (await db.manager.existsBy(UserEntity, { email: normalised })) return;
  const passwordHash = await hashPassword(password);
  await db.write((manager) =>
    manager.insert(UserEntity, {
      email: normalised,
      name: 'Administrator',
      role: 'admin',
      passwordHash,
      supplierCode: null,
    }),
  );
}
