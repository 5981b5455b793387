import type { EntityManager } from 'typeorm';
import { QTY_EPSILON, roundQty } from '../../shared/domain/quantity';
import type { StockMovementKind } from '../../shared/schemas/stock';
import { chunks } from '../db/upsert';
import { forUpdate, runSql } from '../db/sql';
import { ConflictError } from '../errors';
import { bumpPlanningVersion } from '../settings/versions';

/** A movement to post: signed quantity, what it is, who and why, and what it belongs to. */
export interface NewMovement {
  partNumber: string;
  qty: number;
  kind: StockMovementKind;
  userEmail: string | null;
  reason?: string | null;
  refType?: string | null;
  ref?: string | null;
  /** When it happened, when not now (the demo's history). */
  at?: string;
}

/** A movement as written, with the part's on-hand right after it. */
export interface PostedMovement extends Required<NewMovement> {
  at: string;
  balanceAfter: number;
}

/** Rows per statement: 9 parameters a row stays far below SQLite's 32,766 and PostgreSQL's 65,535. */
const ROWS_PER_INSERT = 1000;

/*
 * Plain SQL throughout: closing a day of a large plant posts tens of thousands of movements and
 * moves thousands of parts, and an ORM's per-row bookkeeping would cost more than the database.
 */

async function readOnHand(
  manager: EntityManager,
  partNumbers: string[],
): Promise<Map<string, { id: number; onHand: number }>> {
  const found = new Map<string, { id: number; onHand: number }>();
  for (const chunk of chunks(partNumbers)) {
    // Locked until the unit commits: a concurrent movement of the same part waits, then reads the new balance.
    const rows: { id: number; partNumber: string; onHand: number }[] = await runSql(
      manager,
      `SELECT id, part_number AS "partNumber", on_hand AS "onHand" FROM "part" WHERE part_number IN (${chunk.map(() => '?').join(', ')}) ORDER BY id${forUpdate(manager)}`,
      chunk,
    );
    for (const row of rows) found.set(row.partNumber, { id: Number(row.id), onHand: Number(row.onHand) });
  }
  return found;
}

/**
 * The only way on-hand changes: each movement is written with the balance after it and the part's
 * on-hand moves by the same quantity, inside the caller's unit of work, so on-hand always equals the
 * sum of the part's movements. Negative on-hand is allowed (a backflush ahead of a receipt) and is
 * left for a count to settle, never clamped. A zero movement is written only for a count. The
 * planning version moves as for a change of stock alone (see PlanningChange).
 */
export async function postMovements(
  manager: EntityManager,
  movements: readonly NewMovement[],
): Promise<PostedMovement[]> {
  const wanted = movements.filter((movement) => movement.kind === 'count' || Math.abs(movement.qty) > QTY_EPSILON);
  if (wanted.length === 0) return [];
  const partNumbers = [...new Set(wanted.map((movement) => movement.partNumber))];
  const parts = await readOnHand(manager, partNumbers);
  const missing = partNumbers.filter((partNumber) => !parts.has(partNumber));
  if (missing.length > 0)
    throw new ConflictError(`No part ${missing.join(', ')} in the master data; its stock cannot move.`);

  const at = new Date().toISOString();
  const balance = new Map([...parts].map(([partNumber, part]) => [partNumber, part.onHand]));
  const posted: PostedMovement[] = wanted.map((movement) => {
    const balanceAfter = roundQty(balance.get(movement.partNumber)! + movement.qty);
    balance.set(movement.partNumber, balanceAfter);
    return {
      partNumber: movement.partNumber,
      qty: roundQty(movement.qty),
      kind: movement.kind,
      userEmail: movement.userEmail,
      reason: movement.reason ?? null,
      refType: movement.refType ?? null,
      ref: movement.ref ?? null,
      at: movement.at ?? at,
      balanceAfter,
    };
  });

  for (const chunk of chunks(posted, ROWS_PER_INSERT)) {
    await runSql(
      manager,
      `INSERT INTO "stock_movement" ("part_number", "qty", "kind", "at", "user_email", "reason", "ref_type", "ref", "balance_after")
       VALUES ${chunk.map(() => '(?, ?, ?, ?, ?, ?, ?, ?, ?)').join(', ')}`,
      chunk.flatMap((row) => [
        row.partNumber,
        row.qty,
        row.kind,
        row.at,
        row.userEmail,
        row.reason,
        row.refType,
        row.ref,
        row.balanceAfter,
      ]),
    );
  }
  const changed = [...parts].filter(([partNumber, part]) => balance.get(partNumber) !== part.onHand);
  for (const chunk of chunks(changed, ROWS_PER_INSERT)) {
    await runSql(
      manager,
      `UPDATE "part" SET "on_hand" = CASE "id" ${chunk.map(() => 'WHEN ? THEN CAST(? AS double precision)').join(' ')} END
       WHERE "id" IN (${chunk.map(() => '?').join(', ')})`,
      [
        ...chunk.flatMap(([partNumber, part]) => [part.id, balance.get(partNumber)!]),
        ...chunk.map(([, part]) => part.id),
      ],
    );
  }
  const counted = [
    ...new Set(wanted.filter((movement) => movement.kind === 'count').map((movement) => movement.partNumber)),
  ];
  for (const chunk of chunks(counted)) {
    await runSql(
      manager,
      `UPDATE "part" SET "last_counted_at" = ? WHERE part_number IN (${chunk.map(() => '?').join(', ')})`,
      [at, ...chunk],
    );
  }
  // Stock alone moved here; a caller that changes more in the same unit (a build marks its units)
  // bumps fully itself.
  await bumpPlanningVersion(manager, 'stock');
  return posted;
}
