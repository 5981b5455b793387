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

const PLANNING_VERSION = 'planningVersion';

/** Every change to a planning input bumps this, so a cached plan knows when it is stale. */
export async function bumpPlanningVersion(manager: EntityManager): Promise<number> {
  const next = (await readSetting<number>(manager, PLANNING_VERSION, 0)) + 1;
  await writeSetting(manager, PLANNING_VERSION, next);
  return next;
}

export function readPlanningVersion(manager: EntityManager): Promise<number> {
  return readSetting<number>(manager, PLANNING_VERSION, 0);
}
