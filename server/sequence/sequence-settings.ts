import type { EntityManager } from 'typeorm';
import {
  DEFAULT_DAILY_CAPACITY,
  DEFAULT_FROZEN_WINDOW_DAYS,
  type SequenceSettings,
} from '../../shared/schemas/sequence';
import { readSetting, writeSetting } from '../settings/settings';

const FROZEN_WINDOW_DAYS = 'sequence.frozenWindowDays';
const DAILY_CAPACITY = 'sequence.dailyCapacity';

/** The frozen window and daily capacity, with the plant defaults until a planner sets them. */
export async function readSequenceSettings(manager: EntityManager): Promise<SequenceSettings> {
  return {
    frozenWindowDays: await readSetting<number>(manager, FROZEN_WINDOW_DAYS, DEFAULT_FROZEN_WINDOW_DAYS),
    dailyCapacity: await readSetting<number>(manager, DAILY_CAPACITY, DEFAULT_DAILY_CAPACITY),
  };
}

export async function writeSequenceSettings(manager: EntityManager, settings: SequenceSettings): Promise<void> {
  await writeSetting(manager, FROZEN_WINDOW_DAYS, settings.frozenWindowDays);
  await writeSetting(manager, DAILY_CAPACITY, settings.dailyCapacity);
}
