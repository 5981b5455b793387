import { In, type EntityManager } from 'typeorm';
import { QTY_EPSILON, roundQty } from '../../shared/domain/quantity';
import type { StockMovementKind } from '../../shared/schemas/stock';
import { chunks } from '../db/upsert';
import { ConflictError } from '../errors';
import { PartEntity } from '../master-data/part.entity';
import { bumpPlanningVersion } from '../settings/versions';
import { StockMovementEntity } from './stock-movement.entity';

/** A movement to post: signed quantity, what it is, who and why, and what it belongs to. */
export interface NewMovement {
  partNumber: string;
  qty: number;
  kind: StockMovementKind;
  userEmail: string | null;
  reason?: string | null;
  refType?: string | null;
  ref?: string | null;
}

/**
 * The only way on-hand changes: each movement is written with the balance after it and the part's
 * on-hand moves by the same quantity, inside the caller's unit of work, so on-hand always equals the
 * sum of the part's movements. Negative on-hand is allowed (a backflush ahead of a receipt) and is
 * left for a count to settle, never clamped. A zero movement is written only for a count.
 */
export async function postMovements(
  manager: EntityManager,
  movements: readonly NewMovement[],
): Promise<StockMovementEntity[]> {
  const wanted = movements.filter((movement) => movement.kind === 'count' || Math.abs(movement.qty) > QTY_EPSILON);
  if (wanted.length === 0) return [];
  const partNumbers = [...new Set(wanted.map((movement) => movement.partNumber))];
  const parts = await manager.find(PartEntity, { where: { partNumber: In(partNumbers) } });
  const partByNumber = new Map(parts.map((part) => [part.partNumber, part]));
  const missing = partNumbers.filter((partNumber) => !partByNumber.has(partNumber));
  if (missing.length > 0)
    throw new ConflictError(`No part ${missing.join(', ')} in the master data; its stock cannot move.`);

  const at = new Date().toISOString();
  const posted: StockMovementEntity[] = [];
  const balance = new Map(parts.map((part) => [part.partNumber, part.onHand]));
  for (const movement of wanted) {
    const after = roundQty((balance.get(movement.partNumber) ?? 0) + movement.qty);
    balance.set(movement.partNumber, after);
    posted.push(
      manager.create(StockMovementEntity, {
        partNumber: movement.partNumber,
        qty: roundQty(movement.qty),
        kind: movement.kind,
        at,
        userEmail: movement.userEmail,
        reason: movement.reason ?? null,
        refType: movement.refType ?? null,
        ref: movement.ref ?? null,
        balanceAfter: after,
      }),
    );
  }
  for (const chunk of chunks(posted)) {
    await manager.createQueryBuilder().insert().into(StockMovementEntity).values(chunk).updateEntity(false).execute();
  }
  for (const part of parts) {
    const after = balance.get(part.partNumber)!;
    const counted = wanted.some((movement) => movement.partNumber === part.partNumber && movement.kind === 'count');
    if (after !== part.onHand || counted) {
      await manager.update(PartEntity, { id: part.id }, { onHand: after, ...(counted && { lastCountedAt: at }) });
    }
  }
  await bumpPlanningVersion(manager);
  return posted;
}
