import type { DataSource } from 'typeorm';
import { hashPassword } from './passwords';
import { UserEntity } from './user.entity';

export async function isDatabaseEmpty(dataSource: DataSource): Promise<boolean> {
  return (await dataSource.getRepository(UserEntity).count()) === 0;
}

/** Makes sure the configured admin exists and may sign in; used when the demo is not seeded. */
export async function ensureAdmin(dataSource: DataSource, email: string, password: string): Promise<void> {
  const users = dataSource.getRepository(UserEntity);
  const normalised = email.toLowerCase();
  const existing = await users.findOneBy({ email: normalised });
  if (existing) return;
  await users.save(
    users.create({
      email: normalised,
      name: 'Administrator',
      role: 'admin',
      passwordHash: await hashPassword(password),
      supplierCode: null,
    }),
  );
}
