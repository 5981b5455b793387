import { Between, type EntityManager } from 'typeorm';
import { roundQty } from '../../shared/domain/quantity';
import type {
  StockChange,
  StockCountRequest,
  StockItem,
  StockLedger,
  StockMovement,
  StockMovementKind,
  StockMovementsQuery,
  StockScrapRequest,
} from '../../shared/schemas/stock';
import { recordAudit } from '../audit/audit.service';
import type { Database } from '../db/database';
import { NotFoundError } from '../errors';
import type { AuthenticatedUser } from '../http/request-user';
import type { Part } from '../../shared/schemas/master-data';
import { upsertParts } from '../master-data/master-data.writer';
import { refuseUnfitQty } from '../master-data/typed-quantity';
import { PartEntity } from '../master-data/part.entity';
import { readSetting } from '../settings/settings';
import { postMovements, type PostedMovement } from './stock-ledger';
import { StockMovementEntity } from './stock-movement.entity';

/** Days after which a part's stock is due a count; the plant may set its own. Common practice, no source. */
export const DEFAULT_COUNT_INTERVAL_DAYS = 90;
export const COUNT_INTERVAL = 'stock.countIntervalDays';

/**
 * When a part (`p`) was last counted, in SQL. A part never counted is judged from its first
 * movement: opening stock counts as its first count.
 */
export const COUNTED_AT_SQL = `COALESCE(p.last_counted_at,
  (SELECT MIN(m.at) FROM stock_movement m WHERE m.part_number = p.part_number))`;
const COUNTED_SQL = `SELECT p.part_number AS "partNumber", p.source AS source, ${COUNTED_AT_SQL} AS "countedAt" FROM part p`;

/** A part's source and COUNTED_AT_SQL, as read. */
export interface CountedPart {
  source: string;
  countedAt: string | null;
}

/**
 * Whether a part is due a count: no count (nor opening stock) within the plant's interval. End items
 * are built, not stocked, so they are never due. A negative on-hand is its own flag.
 */
export async function countDueTest(manager: EntityManager, now = new Date()): Promise<(part: CountedPart) => boolean> {
  const interval = await readSetting<number>(manager, COUNT_INTERVAL, DEFAULT_COUNT_INTERVAL_DAYS);
  const dueBefore = new Date(now.getTime() - interval * 86_400_000).toISOString();
  return (part) => part.source !== 'end_item' && (part.countedAt === null || part.countedAt < dueBefore);
}

/** The parts due a count (see countDueTest). */
export async function readCountDue(manager: EntityManager, now = new Date()): Promise<Set<string>> {
  const isDue = await countDueTest(manager, now);
  const rows: (CountedPart & { partNumber: string })[] = await manager.query(COUNTED_SQL);
  return new Set(rows.filter(isDue).map((row) => row.partNumber));
}

/** The start of a plant day as an instant, for ledger date filters on stored timestamps. */
function startOf(date: string): string {
  return new Date(`${date}T00:00:00`).toISOString();
}

function endOf(date: string): string {
  return new Date(new Date(`${date}T00:00:00`).getTime() + 86_400_000 - 1).toISOString();
}

export function toStockMovement(entity: StockMovementEntity, balance: number): StockMovement {
  return {
    id: entity.id,
    at: entity.at,
    kind: entity.kind as StockMovementKind,
    qty: entity.qty,
    balance,
    userEmail: entity.userEmail,
    reason: entity.reason,
    refType: entity.refType,
    ref: entity.ref,
  };
}

function latestMovement(manager: EntityManager, partNumber: string): Promise<StockMovementEntity> {
  return manager.findOneOrFail(StockMovementEntity, { where: { partNumber }, order: { id: 'DESC' } });
}

/** Counts posted as variances, one per part: the on-hand import and single counts alike. */
export async function postCounts(
  manager: EntityManager,
  counts: readonly { partNumber: string; counted: number }[],
  actorEmail: string | null,
  reason: string,
): Promise<PostedMovement[]> {
  const parts = await manager.find(PartEntity, { select: { partNumber: true, onHand: true } });
  const onHand = new Map(parts.map((part) => [part.partNumber, part.onHand]));
  return postMovements(
    manager,
    counts.map((count) => ({
      partNumber: count.partNumber,
      qty: roundQty(count.counted - (onHand.get(count.partNumber) ?? 0)),
      kind: 'count',
      userEmail: actorEmail,
      reason,
      refType: 'count',
      ref: String(count.counted),
    })),
  );
}

/**
 * On-hand named in the part master (a parts file, the demo): a new part opens its ledger with it,
 * an existing part whose figure changed gets a count adjustment. Never an overwrite without trace.
 */
export async function postMasterDataStock(
  manager: EntityManager,
  stock: readonly { partNumber: string; onHand: number }[],
  newParts: ReadonlySet<string>,
  actorEmail: string | null,
  reason: string,
): Promise<void> {
  const opening = stock.filter((row) => newParts.has(row.partNumber));
  await postMovements(
    manager,
    opening.map((row) => ({
      partNumber: row.partNumber,
      qty: row.onHand,
      kind: 'opening',
      userEmail: actorEmail,
      reason,
    })),
  );
  const parts = await manager.find(PartEntity, { select: { partNumber: true, onHand: true } });
  const current = new Map(parts.map((part) => [part.partNumber, part.onHand]));
  const changed = stock.filter(
    (row) => !newParts.has(row.partNumber) && roundQty(row.onHand - (current.get(row.partNumber) ?? 0)) !== 0,
  );
  await postCounts(
    manager,
    changed.map((row) => ({ partNumber: row.partNumber, counted: row.onHand })),
    actorEmail,
    reason,
  );
}

/** Saves the part master and posts the on-hand it names (opening for new parts, counts for changed ones). */
export async function savePartsWithStock(
  manager: EntityManager,
  parts: readonly Part[],
  actorEmail: string | null = null,
  reason = 'Part master',
): Promise<void> {
  const known = new Set(
    (await manager.find(PartEntity, { select: { partNumber: true } })).map((part) => part.partNumber),
  );
  await upsertParts(manager, [...parts]);
  const newParts = new Set(parts.filter((part) => !known.has(part.partNumber)).map((part) => part.partNumber));
  await postMasterDataStock(manager, parts, newParts, actorEmail, reason);
}

/** The stock ledger: movements with their running balance, counts and scrap. */
export class StockService {
  constructor(private readonly db: Database) {}

  /** Every part's on-hand with the reasons to count it (negative, not counted lately). */
  async list(now = new Date()): Promise<StockItem[]> {
    const manager = this.db.manager;
    const due = await readCountDue(manager, now);
    const parts = await manager.find(PartEntity, { order: { partNumber: 'ASC' } });
    return parts.map((part) => ({
      partNumber: part.partNumber,
      description: part.description,
      uom: part.uom,
      source: part.source,
      supplierCode: part.supplierCode,
      pointOfUse: part.pointOfUse,
      onHand: part.onHand,
      lastCountedAt: part.lastCountedAt,
      negative: part.onHand < 0,
      countDue: due.has(part.partNumber),
    }));
  }

  /** The part's movements between two plant days (inclusive; open ends allowed) with the running balance. */
  async ledger(partNumber: string, query: StockMovementsQuery): Promise<StockLedger> {
    const manager = this.db.manager;
    const part = await manager.findOneBy(PartEntity, { partNumber });
    if (!part) throw new NotFoundError(`No part ${partNumber}.`);
    const from = query.from ? startOf(query.from) : '';
    const to = query.to ? endOf(query.to) : '9999';
    const [before] = await manager
      .createQueryBuilder(StockMovementEntity, 'movement')
      .select('COALESCE(SUM(movement.qty), 0)', 'sum')
      .where('movement.partNumber = :partNumber', { partNumber })
      .andWhere('movement.at < :from', { from })
      .getRawMany<{ sum: number | string }>();
    const rows = await manager.find(StockMovementEntity, {
      where: { partNumber, at: Between(from, to) },
      order: { id: 'ASC' },
    });
    let balance = roundQty(Number(before.sum));
    const opening = balance;
    const movements = rows.map((row) => {
      balance = roundQty(balance + row.qty);
      return toStockMovement(row, balance);
    });
    return {
      partNumber,
      description: part.description,
      uom: part.uom,
      opening,
      movements,
      closing: balance,
      onHand: part.onHand,
      lastCountedAt: part.lastCountedAt,
    };
  }

  /** A count: the variance against on-hand is posted as an adjustment, with who counted and why. */
  count(request: StockCountRequest, actor: AuthenticatedUser): Promise<StockChange> {
    return this.db.write(async (manager) => {
      const part = await this.findPart(manager, request.partNumber);
      refuseUnfitQty(request.counted, part, ['counted']);
      await postCounts(
        manager,
        [{ partNumber: part.partNumber, counted: request.counted }],
        actor.email,
        request.reason ?? 'Count',
      );
      const movement = await latestMovement(manager, part.partNumber);
      await recordAudit(manager, {
        actorEmail: actor.email,
        action: 'count',
        entity: 'stock',
        entityKey: part.partNumber,
        changes: { onHand: { from: part.onHand, to: request.counted }, reason: request.reason ?? null },
      });
      return {
        partNumber: part.partNumber,
        movement: toStockMovement(movement, movement.balanceAfter),
        onHand: movement.balanceAfter,
      };
    });
  }

  /** Scrap that really happened (dropped, damaged, wrong) leaves stock as its own movement. */
  scrap(request: StockScrapRequest, actor: AuthenticatedUser): Promise<StockChange> {
    return this.db.write(async (manager) => {
      const part = await this.findPart(manager, request.partNumber);
      refuseUnfitQty(request.qty, part, ['qty'], 'positive');
      await postMovements(manager, [
        {
          partNumber: part.partNumber,
          qty: -request.qty,
          kind: 'scrap',
          userEmail: actor.email,
          reason: request.reason,
        },
      ]);
      const movement = await latestMovement(manager, part.partNumber);
      await recordAudit(manager, {
        actorEmail: actor.email,
        action: 'scrap',
        entity: 'stock',
        entityKey: part.partNumber,
        changes: { qty: request.qty, reason: request.reason, onHand: { from: part.onHand, to: movement.balanceAfter } },
      });
      return {
        partNumber: part.partNumber,
        movement: toStockMovement(movement, movement.balanceAfter),
        onHand: movement.balanceAfter,
      };
    });
  }

  private async findPart(manager: EntityManager, partNumber: string): Promise<PartEntity> {
    const part = await manager.findOneBy(PartEntity, { partNumber });
    if (!part) throw new NotFoundError(`No part ${partNumber}.`);
    return part;
  }
}
