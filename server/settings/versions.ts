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

/**
 * The planning version of the last planning change that touched more than stock. Only caches
 * read it (no screen follows it), so it has no channel of its own.
 */
const PLANNING_STRUCTURE_KEY = 'planningVersion.structure';

/** Read by every request served from a cache, so in plain SQL: the entity machinery costs more than the query. */
async function readCounter(manager: EntityManager, key: string): Promise<number> {
  const rows = await runSql<{ value: string }[]>(manager, 'SELECT value FROM setting WHERE "key" = ?', [key]);
  return rows.length > 0 ? (JSON.parse(rows[0].value) as number) : 0;
}

export const readVersion = (manager: EntityManager, channel: VersionChannel) => readCounter(manager, KEYS[channel]);

export async function bumpVersion(manager: EntityManager, channel: VersionChannel): Promise<number> {
  const next = (await readVersion(manager, channel)) + 1;
  await writeSetting(manager, KEYS[channel], next);
  notifyAfterCommit(channel, { version: next });
  return next;
}

/**
 * What a planning change touched. `stock`: nothing but stock and its arrival — on-hand, when a
 * part was last counted, stock movements, release lines' received quantities and closed flags,
 * release statuses, kanban card states; the line risk reads those again after every change anyway.
 * `any`: anything else too (part master, BOM, sequence, calendar, suppliers, loops…), or not known.
 */
export type PlanningChange = 'stock' | 'any';

/**
 * Every change to a planning input (sequence, stock, BOM, releases, calendar…) bumps this. A
 * change that is not `stock` alone also moves the structure version to the new planning version,
 * so a unit of work with a full bump anywhere in it moves it, whatever else it bumped.
 */
export async function bumpPlanningVersion(manager: EntityManager, change: PlanningChange = 'any'): Promise<number> {
  const next = await bumpVersion(manager, 'planning');
  if (change !== 'stock') await writeSetting(manager, PLANNING_STRUCTURE_KEY, next);
  return next;
}
export const readPlanningVersion = (manager: EntityManager) => readVersion(manager, 'planning');
/**
 * The planning version of the last change beyond stock: while it stands, planning inputs other
 * than stock are as they were when it was read.
 */
export const readPlanningStructureVersion = (manager: EntityManager) => readCounter(manager, PLANNING_STRUCTURE_KEY);
/** Every change to the receiving board bumps this, so open Dock screens know to reload. */
export const bumpDockVersion = (manager: EntityManager) => bumpVersion(manager, 'dock');
export const readDockVersion = (manager: EntityManager) => readVersion(manager, 'dock');
