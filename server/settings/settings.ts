import type { EntityManager } from 'typeorm';
import { SettingEntity } from './setting.entity';

/** Reads one setting, or the fallback when it was never set. */
export async function readSetting<T>(manager: EntityManager, key: string, fallback: T): Promise<T> {
  const row = await manager.findOneBy(SettingEntity, { key });
  return row ? (row.value as T) : fallback;
}

export async function writeSetting(
  manager: EntityManager,
  key: string,
  value: object | number | string | boolean,
): Promise<void> {
  await manager.upsert(SettingEntity, { key, value }, ['key']);
}
