import type { EntityManager } from 'typeorm';
import { notifyAfterCommit } from '../db/database';
import { runSql } from '../db/sql';
import { writeSetting } from './settings';

/**
 * Version counters of what open screens follow. Each change bumps its counter in the same
 * transaction as the change (caches compare it, so a cached plan knows when it is stale) and, once
 * committed, tells the open event streams.
 */
export type VersionChannel = 'planning' | 'dock';

const KEYS: Record<VersionChannel, string> = { planning: 'planningVersion', dock: 'dock.version' };

/** Read by every request served from a cache, so in plain SQL: the entity machinery costs more than the query. */
export async function readVersion(manager: EntityManager, channel: VersionChannel): Promise<number> {
  const rows = await runSql<{ value: string }[]>(manager, 'SELECT value FROM setting WHERE "key" = ?', [KEYS[channel]]);
  return rows.length > 0 ? (JSON.parse(rows[0].value) as number) : 0;
}

export async function bumpVersion(manager: EntityManager, channel: VersionChannel): Promise<number> {
  const next = (await readVersion(manager, channel)) + 1;
  await writeSetting(manager, KEYS[channel], next);
  notifyAfterCommit(channel, { version: next });
  return next;
}

/** Every change to a planning input (sequence, stock, BOM, releases, calendar…) bumps this. */
export const bumpPlanningVersion = (manager: EntityManager) => bumpVersion(manager, 'planning');
export const readPlanningVersion = (manager: EntityManager) => readVersion(manager, 'planning');
/** Every change to the receiving board bumps this, so open Dock screens know to reload. */
export const bumpDockVersion = (manager: EntityManager) => bumpVersion(manager, 'dock');
export const readDockVersion = (manager: EntityManager) => readVersion(manager, 'dock');
