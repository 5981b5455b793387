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
 * The planning inputs that change apart from stock, each with a counter of its own: the planning
 * version of the last change that touched it. Only the line risk reads them (no screen follows
 * them), so they have no channel of their own. `parts` is the part master with its suppliers
 * (their names join into the part read); `sequence` is the units to build and the sequence
 * settings; `calendar` the working weekdays and holidays.
 */
export const PLANNING_PIECES = ['parts', 'bom', 'sequence', 'calendar'] as const;
export type PlanningPiece = (typeof PLANNING_PIECES)[number];
export type PlanningPieceVersions = Record<PlanningPiece, number>;

const PIECE_KEYS: Record<PlanningPiece, string> = {
  parts: 'planningVersion.parts',
  bom: 'planningVersion.bom',
  sequence: 'planningVersion.sequence',
  calendar: 'planningVersion.calendar',
};

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
 * release statuses and firm lines, kanban card states, loops' cards and settings; the line risk reads
 * those again after every change anyway. A planning piece: that piece (stock moved in the same
 * unit of work is told by the stock ledger's own bump). `any`: every piece, or not known.
 */
export type PlanningChange = 'stock' | PlanningPiece | 'any';

/**
 * Every change to a planning input (sequence, stock, BOM, releases, calendar…) bumps this. The
 * pieces the change touched move to the new planning version, so a unit of work that bumps
 * several times moves each piece any of its bumps touched.
 */
export async function bumpPlanningVersion(manager: EntityManager, change: PlanningChange = 'any'): Promise<number> {
  const next = await bumpVersion(manager, 'planning');
  const touched = change === 'any' ? PLANNING_PIECES : change === 'stock' ? [] : [change];
  for (const piece of touched) await writeSetting(manager, PIECE_KEYS[piece], next);
  return next;
}
export const readPlanningVersion = (manager: EntityManager) => readVersion(manager, 'planning');

/**
 * The planning version of the last change to each piece, in one query (the line risk reads them
 * with its inputs, in one snapshot): while a piece's counter stands, that piece is as it was when
 * the counter was read. 0 for a piece never changed since these counters began.
 */
export async function readPlanningPieceVersions(manager: EntityManager): Promise<PlanningPieceVersions> {
  const keys = PLANNING_PIECES.map((piece) => PIECE_KEYS[piece]);
  const rows = await runSql<{ key: string; value: string }[]>(
    manager,
    `SELECT "key", value FROM setting WHERE "key" IN (${keys.map(() => '?').join(', ')})`,
    keys,
  );
  const byKey = new Map(rows.map((row) => [row.key, JSON.parse(row.value) as number]));
  return Object.fromEntries(
    PLANNING_PIECES.map((piece) => [piece, byKey.get(PIECE_KEYS[piece]) ?? 0]),
  ) as PlanningPieceVersions;
}

/** Every change to the receiving board bumps this, so open Dock screens know to reload. */
export const bumpDockVersion = (manager: EntityManager) => bumpVersion(manager, 'dock');
export const readDockVersion = (manager: EntityManager) => readVersion(manager, 'dock');
