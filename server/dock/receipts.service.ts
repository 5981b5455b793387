import { In, QueryFailedError, type EntityManager } from 'typeorm';
import { canTransition, isCardState } from '../../shared/domain/card-cycle';
import {
  allocateExcess,
  overCheck,
  type OpenSupplyLine,
  type OverAction,
  type OverCheck,
} from '../../shared/domain/over-receipt';
import { QTY_EPSILON, roundQty } from '../../shared/domain/quantity';
import { RECEIVABLE_STATUSES, type DockStatus } from '../../shared/schemas/dock';
import {
  addsToOnHand,
  type Discrepancy,
  type ExcessShare,
  type OverCheckQuery,
  type OverCheckResponse,
  type Receipt,
  type ReceiptRequest,
  type ReceiptResponse,
} from '../../shared/schemas/receipts';
import { recordAudit } from '../audit/audit.service';
import { bumpDockVersion } from '../settings/versions';
import { ConflictError, NotFoundError, RefusedInputError } from '../errors';
import { expectedArrival } from '../../shared/domain/dock-cards';
import { ShipNoticeEntity } from '../ship-notices/ship-notice.entity';
import { ShipNoticeLineEntity } from '../ship-notices/ship-notice-line.entity';
import { applyCardEvent } from '../loops/card-events';
import { KanbanCardEntity } from '../loops/kanban-card.entity';
import type { AuthenticatedUser } from '../http/request-user';
import { PartEntity } from '../master-data/part.entity';
import { refuseUnfitQty } from '../master-data/typed-quantity';
import { postMovements } from '../stock/stock-ledger';
import { ReleaseLineEntity } from '../releases/release-line.entity';
import { ReleaseEntity } from '../releases/release.entity';
import { bumpPlanningVersion } from '../settings/versions';
import { SupplierEntity } from '../master-data/supplier.entity';
import { forUpdate, runSql } from '../db/sql';
import { ReceiptEntity } from './receipt.entity';
import { ReceiptShareEntity } from './receipt-share.entity';
import type { Database } from '../db/database';

/** A receipt's body, and whether this request created it (201) or replayed an earlier one (200). */
export interface ReceiveOutcome {
  created: boolean;
  body: ReceiptResponse;
}

function isUniqueViolation(error: unknown): boolean {
  if (!(error instanceof QueryFailedError)) return false;
  const driverError = error.driverError as { code?: string } | undefined;
  // SQLite words it in the message; PostgreSQL answers SQLSTATE 23505.
  return /UNIQUE constraint failed/i.test(error.message) || driverError?.code === '23505';
}

/** Release states whose answer is firm, so a line is expected on its answered arrival (as the plan reads it). */
const FIRM_STATUSES = ['confirmed', 'shipped', 'partial'];

/** What a line is ordered for: the supplier's confirmed quantity once given, else the request. */
function orderedOf(line: ReleaseLineEntity): number {
  return line.confirmedQty ?? line.qty;
}

function toReceipt(
  entity: ReceiptEntity,
  line: ReleaseLineEntity,
  release: ReleaseEntity,
  shares: ExcessShare[],
): Receipt {
  const discrepancy = entity.discrepancy as Discrepancy | null;
  const overAction = entity.overAction as OverAction | null;
  const returnedQty = overAction === 'return' ? entity.excessQty : 0;
  return {
    id: entity.id,
    releaseLineId: entity.releaseLineId,
    releaseNumber: release.number,
    partNumber: line.partNumber,
    qty: entity.qty,
    shipNoticeId: entity.shipNoticeId,
    discrepancy,
    note: entity.note,
    final: entity.final,
    addedToOnHand: addsToOnHand(discrepancy) ? roundQty(entity.qty - returnedQty) : 0,
    overAction,
    excessQty: entity.excessQty,
    returnedQty,
    appliedTo: shares,
    onHandAfter: entity.onHandAfter,
    userEmail: entity.userEmail,
    receivedAt: entity.receivedAt,
  };
}

/** The request as stored, so a replay can be compared field by field with the first one. */
function normalise(request: ReceiptRequest) {
  return {
    releaseLineId: request.releaseLineId,
    qty: request.qty,
    discrepancy: request.discrepancy ?? null,
    note: request.note ? request.note : null,
    final: request.close ?? false,
    overAction: request.overAction ?? null,
  };
}

function sameRequest(entity: ReceiptEntity, request: ReceiptRequest): boolean {
  const wanted = normalise(request);
  // An over receipt is recorded `over` whether or not the request said so.
  const discrepancy = wanted.discrepancy ?? (entity.overAction ? 'over' : null);
  return (
    entity.releaseLineId === wanted.releaseLineId &&
    entity.qty === wanted.qty &&
    entity.discrepancy === discrepancy &&
    entity.note === wanted.note &&
    entity.final === wanted.final &&
    entity.overAction === wanted.overAction &&
    // A count that named no shipment was given one; a replay naming another is a different count.
    (request.shipNoticeId === undefined || request.shipNoticeId === entity.shipNoticeId)
  );
}

/**
 * Check-in at the dock: one counted quantity against one release line. A receipt changes stock,
 * the line, the release, maybe a kanban card, all in one transaction, and exactly once per
 * Idempotency-Key — a double tap, a retry after a lost answer and a race all count once.
 */
export class ReceiptsService {
  constructor(private readonly db: Database) {}

  async receive(request: ReceiptRequest, idempotencyKey: string, actor: AuthenticatedUser): Promise<ReceiveOutcome> {
    // Transactions run one at a time (see serialiseTransactions), so the look-up of the key and
    // the insert cannot interleave with a twin request in this process; the unique index covers
    // another instance.
    try {
      return await this.db.write(async (manager) => {
        const earlier = await this.replay(manager, idempotencyKey, request);
        if (earlier) return earlier;
        return { created: true, body: await this.record(manager, request, idempotencyKey, actor) };
      });
    } catch (error) {
      if (!isUniqueViolation(error)) throw error;
      const first = await this.replay(this.db.manager, idempotencyKey, request);
      if (first) return first;
      throw error;
    }
  }

  private async replay(
    manager: EntityManager,
    idempotencyKey: string,
    request: ReceiptRequest,
  ): Promise<ReceiveOutcome | null> {
    const existing = await manager.findOneBy(ReceiptEntity, { idempotencyKey });
    if (!existing) return null;
    if (!sameRequest(existing, request)) {
      throw new ConflictError(
        'This Idempotency-Key was already used for a different receipt; send a new key for a new count.',
        [{ idempotencyKey, receiptId: existing.id }],
      );
    }
    const line = await manager.findOneByOrFail(ReleaseLineEntity, { id: existing.releaseLineId });
    const release = await manager.findOneByOrFail(ReleaseEntity, { id: line.releaseId });
    const shares = await this.sharesOf(manager, existing.id);
    return {
      created: false,
      body: { receipt: toReceipt(existing, line, release, shares), onHand: existing.onHandAfter },
    };
  }

  /**
   * What a count would do before it is recorded: whether it takes the line over the supplier's
   * tolerance, and where kept excess would go. The check-in shows it so the clerk can choose.
   */
  async check(query: OverCheckQuery): Promise<OverCheckResponse> {
    return this.db.read(async (manager) => {
      const line = await manager.findOneBy(ReleaseLineEntity, { id: query.releaseLineId });
      if (!line) throw new NotFoundError(`No release line with id ${query.releaseLineId}.`);
      const release = await manager.findOneByOrFail(ReleaseEntity, { id: line.releaseId });
      const tolerancePct = await this.toleranceOf(manager, release.supplierCode);
      const checked = this.checkCount(line, query.qty, tolerancePct);
      const others = await this.otherOpenLines(manager, release.supplierCode, line, false);
      const kept = allocateExcess(checked.excessQty, others);
      const byId = new Map(others.map((other) => [other.id, other]));
      return {
        releaseLineId: line.id,
        orderedQty: orderedOf(line),
        receivedQty: line.receivedQty,
        overTolerancePct: tolerancePct,
        limitQty: checked.limitQty,
        over: checked.over,
        excessQty: checked.excessQty,
        keep: {
          appliedTo: kept.shares.map((share) => ({
            releaseLineId: share.lineId,
            releaseNumber: byId.get(share.lineId)!.releaseNumber,
            due: byId.get(share.lineId)!.due,
            qty: share.qty,
            closes: share.closes,
          })),
          unallocatedQty: kept.unallocatedQty,
        },
      };
    });
  }

  private checkCount(line: ReleaseLineEntity, usableQty: number, overTolerancePct: number): OverCheck {
    return overCheck({
      orderedQty: orderedOf(line),
      receivedQty: line.receivedQty,
      countedQty: usableQty,
      overTolerancePct,
    });
  }

  private async toleranceOf(manager: EntityManager, supplierCode: string): Promise<number> {
    return (await manager.findOneBy(SupplierEntity, { code: supplierCode }))?.overTolerancePct ?? 0;
  }

  /**
   * The supplier's other open lines of the part, on releases it was asked for, with what is still
   * to come and when each is expected (the answered arrival once firm, else the need date).
   */
  private async otherOpenLines(
    manager: EntityManager,
    supplierCode: string,
    line: ReleaseLineEntity,
    lock: boolean,
  ): Promise<(OpenSupplyLine & { releaseNumber: string; releaseId: number })[]> {
    const rows: {
      id: number;
      releaseId: number;
      releaseNumber: string;
      status: string;
      qty: number;
      confirmedQty: number | null;
      receivedQty: number;
      needDate: string;
      arrivalDate: string | null;
    }[] = await runSql(
      manager,
      `SELECT l.id, l.release_id AS "releaseId", r.number AS "releaseNumber", r.status, l.qty,
         l.confirmed_qty AS "confirmedQty", l.received_qty AS "receivedQty", l.need_date AS "needDate",
         l.arrival_date AS "arrivalDate"
       FROM release_line l JOIN release r ON r.id = l.release_id
       WHERE r.supplier_code = ? AND l.part_number = ? AND l.id <> ? AND NOT l.closed
         AND r.status IN (${RECEIVABLE_STATUSES.map(() => '?').join(', ')})
       ORDER BY l.id${lock ? forUpdate(manager) : ''}`,
      [supplierCode, line.partNumber, line.id, ...RECEIVABLE_STATUSES],
    );
    return rows.map((row) => {
      const ordered = row.confirmedQty === null ? Number(row.qty) : Number(row.confirmedQty);
      return {
        id: Number(row.id),
        releaseId: Number(row.releaseId),
        releaseNumber: row.releaseNumber,
        due: FIRM_STATUSES.includes(row.status) && row.arrivalDate ? row.arrivalDate : row.needDate,
        remainingQty: roundQty(Math.max(0, ordered - Number(row.receivedQty))),
      };
    });
  }

  private async sharesOf(manager: EntityManager, receiptId: number): Promise<ExcessShare[]> {
    const shares = await manager.find(ReceiptShareEntity, { where: { receiptId }, order: { id: 'ASC' } });
    if (shares.length === 0) return [];
    const lines = await manager.findBy(ReleaseLineEntity, { id: In(shares.map((share) => share.releaseLineId)) });
    const releases = await manager.findBy(ReleaseEntity, { id: In(lines.map((line) => line.releaseId)) });
    const releaseOfLine = new Map(
      lines.map((line) => [line.id, releases.find((release) => release.id === line.releaseId)?.number ?? '']),
    );
    return shares.map((share) => ({
      releaseLineId: share.releaseLineId,
      releaseNumber: releaseOfLine.get(share.releaseLineId) ?? '',
      due: share.due,
      qty: share.qty,
      closed: share.closed,
    }));
  }

  private async record(
    manager: EntityManager,
    request: ReceiptRequest,
    idempotencyKey: string,
    actor: AuthenticatedUser,
  ): Promise<ReceiptResponse> {
    const line = await manager.findOneBy(ReleaseLineEntity, { id: request.releaseLineId });
    if (!line) throw new NotFoundError(`No release line with id ${request.releaseLineId}.`);
    const release = await manager.findOneBy(ReleaseEntity, { id: line.releaseId });
    if (!release) throw new NotFoundError(`No release line with id ${request.releaseLineId}.`);
    if (!RECEIVABLE_STATUSES.includes(release.status as DockStatus)) {
      throw new ConflictError(
        `Release ${release.number} is ${release.status}; only a sent, confirmed, exception, shipped or partly received release takes receipts.`,
        [{ status: release.status }],
      );
    }
    if (line.closed) {
      throw new ConflictError(
        `Line ${line.id} (${line.partNumber}) of release ${release.number} is closed; nothing more can be received on it.`,
        [{ releaseLineId: line.id, receivedQty: line.receivedQty }],
      );
    }
    const part = await manager.findOneBy(PartEntity, { partNumber: line.partNumber });
    if (!part)
      throw new ConflictError(`Part ${line.partNumber} is no longer in the master data; add it back before receiving.`);
    refuseUnfitQty(request.qty, part, ['qty']);

    // Every receipt of this part waits here for the one before it, so two counts can never spread
    // the same excess over the same open lines (SQLite's single writer needs no lock).
    await runSql(manager, `SELECT id FROM part WHERE id = ?${forUpdate(manager)}`, [part.id]);
    const shipNoticeId = await this.shipmentOf(manager, line, release, request.shipNoticeId);

    const stored = normalise(request);
    const usable = addsToOnHand(stored.discrepancy) ? stored.qty : 0;
    const tolerancePct = await this.toleranceOf(manager, release.supplierCode);
    const checked = this.checkCount(line, usable, tolerancePct);
    this.refuseUnfitChoice(checked, stored, line, tolerancePct);
    const overAction = checked.over ? stored.overAction : null;
    const discrepancy = checked.over ? 'over' : stored.discrepancy;

    const others = overAction === 'keep' ? await this.otherOpenLines(manager, release.supplierCode, line, true) : [];
    const kept = allocateExcess(overAction === 'keep' ? checked.excessQty : 0, others);
    const movedAway = overAction === 'return' ? checked.excessQty : roundQty(checked.excessQty - kept.unallocatedQty);
    const returnedQty = overAction === 'return' ? checked.excessQty : 0;

    const onHandBefore = part.onHand;
    const receivedQty = roundQty(line.receivedQty + usable - movedAway);
    const ordered = orderedOf(line);
    const closes = stored.final || receivedQty >= ordered - QTY_EPSILON;

    const receipt = await manager.save(
      manager.create(ReceiptEntity, {
        ...stored,
        shipNoticeId,
        discrepancy,
        overAction,
        excessQty: checked.excessQty,
        idempotencyKey,
        onHandAfter: onHandBefore,
        userEmail: actor.email,
        receivedAt: new Date().toISOString(),
      }),
    );
    const posted = await postMovements(manager, [
      {
        partNumber: part.partNumber,
        qty: usable,
        kind: 'receipt',
        userEmail: actor.email,
        reason: `Release ${release.number}${discrepancy ? ` (${discrepancy})` : ''}`,
        refType: 'release',
        ref: release.number,
      },
      // The goods came in and go back out: both stay in the ledger, the return pointing at its receipt.
      {
        partNumber: part.partNumber,
        qty: -returnedQty,
        kind: 'return',
        userEmail: actor.email,
        reason: `Over-delivery on release ${release.number}, back to the supplier`,
        refType: 'receipt',
        ref: String(receipt.id),
      },
    ]);
    const onHandAfter = posted.at(-1)?.balanceAfter ?? onHandBefore;
    await manager.update(ReceiptEntity, { id: receipt.id }, { onHandAfter });
    receipt.onHandAfter = onHandAfter;

    await manager.update(ReleaseLineEntity, { id: line.id }, { receivedQty, closed: closes });
    if (closes && line.cardId !== null) await this.returnCard(manager, line.cardId, receivedQty > 0, actor.email);
    const shares = await this.applyShares(manager, receipt.id, kept.shares, others, actor.email);

    const previousStatus = release.status;
    const status = await this.releaseStatusAfter(manager, release);
    await manager.update(ReleaseEntity, { id: release.id }, { status });
    await this.moveCardToCounted(manager, line, shipNoticeId);
    // Releases whose lines took kept excess are partly or wholly received too (their cards stay where they are).
    const filled = new Set(kept.shares.map((share) => others.find((other) => other.id === share.lineId)!.releaseId));
    for (const releaseId of filled) {
      const other = await manager.findOneByOrFail(ReleaseEntity, { id: releaseId });
      await manager.update(ReleaseEntity, { id: releaseId }, { status: await this.releaseStatusAfter(manager, other) });
    }

    await recordAudit(manager, {
      actorEmail: actor.email,
      action: 'receive',
      entity: 'receipt',
      entityKey: String(receipt.id),
      changes: {
        releaseNumber: release.number,
        releaseLineId: line.id,
        partNumber: line.partNumber,
        qty: stored.qty,
        shipNoticeId,
        discrepancy,
        final: stored.final,
        onHand: { from: onHandBefore, to: onHandAfter },
        receivedQty: { from: line.receivedQty, to: receivedQty },
        lineClosed: closes,
        ...(overAction && { overAction, excessQty: checked.excessQty }),
        ...(returnedQty > 0 && { returnedQty }),
        ...(shares.length > 0 && {
          appliedTo: shares.map((share) => ({
            releaseNumber: share.releaseNumber,
            releaseLineId: share.releaseLineId,
            qty: share.qty,
          })),
        }),
        ...(status !== previousStatus && { releaseStatus: { from: previousStatus, to: status } }),
      },
    });
    // Stock, received quantities, closed lines, release statuses and card states alone changed
    // above; the receipt, its shares, the notice's dock column and the audit are no planning input.
    await bumpPlanningVersion(manager, 'stock');
    await bumpDockVersion(manager);
    return { receipt: toReceipt(receipt, line, release, shares), onHand: onHandAfter };
  }

  /** An over count needs the clerk's choice and is `over`; a count within the tolerance takes neither. */
  private refuseUnfitChoice(
    checked: OverCheck,
    stored: ReturnType<typeof normalise>,
    line: ReleaseLineEntity,
    tolerancePct: number,
  ): void {
    const allowed = `the ${checked.limitQty} the supplier may send in all (ordered ${orderedOf(line)}, ${tolerancePct} % over allowed, received so far ${line.receivedQty})`;
    const what = `line ${line.id} (${line.partNumber})`;
    if (checked.over && !stored.overAction) {
      throw new RefusedInputError(
        `The count takes ${what} above ${allowed}: choose keep or return for the ${checked.excessQty} extra — keep counts them against later open orders, return sends them back to the supplier.`,
        [
          {
            path: ['overAction'],
            message: `required: keep or return the ${checked.excessQty} above the ordered quantity`,
          },
        ],
        'over_choice_needed',
      );
    }
    if (checked.over && stored.discrepancy && stored.discrepancy !== 'over') {
      throw new RefusedInputError(`The count takes ${what} above ${allowed}: it is over, not ${stored.discrepancy}.`, [
        { path: ['discrepancy'], message: `must be over or empty for a count above ${checked.limitQty} in all` },
      ]);
    }
    if (!checked.over && stored.overAction) {
      throw new RefusedInputError(
        `The count keeps ${what} within ${allowed}: it is received as it is, with nothing to keep or return.`,
        [{ path: ['overAction'], message: `only for a count that takes the line above ${checked.limitQty} in all` }],
      );
    }
    if (!checked.over && stored.discrepancy === 'over') {
      throw new RefusedInputError(`The count keeps ${what} within ${allowed}; over is recorded only above it.`, [
        {
          path: ['discrepancy'],
          message: `over only for a count that takes the line above ${checked.limitQty} in all`,
        },
      ]);
    }
  }

  /** Adds kept excess to the other open lines, closing those it fills, and records each share. */
  private async applyShares(
    manager: EntityManager,
    receiptId: number,
    shares: ReturnType<typeof allocateExcess>['shares'],
    others: Awaited<ReturnType<ReceiptsService['otherOpenLines']>>,
    userEmail: string,
  ): Promise<ExcessShare[]> {
    const applied: ExcessShare[] = [];
    for (const share of shares) {
      const other = others.find((candidate) => candidate.id === share.lineId)!;
      const target = await manager.findOneByOrFail(ReleaseLineEntity, { id: share.lineId });
      await manager.update(
        ReleaseLineEntity,
        { id: target.id },
        { receivedQty: roundQty(target.receivedQty + share.qty), closed: share.closes },
      );
      if (share.closes && target.cardId !== null) await this.returnCard(manager, target.cardId, true, userEmail);
      await manager.insert(ReceiptShareEntity, {
        receiptId,
        releaseLineId: target.id,
        qty: share.qty,
        due: other.due,
        closed: share.closes,
      });
      applied.push({
        releaseLineId: target.id,
        releaseNumber: other.releaseNumber,
        due: other.due,
        qty: share.qty,
        closed: share.closes,
      });
    }
    return applied;
  }

  /**
   * The shipment a count belongs to: the one named (422 when it does not carry this line); when
   * none is named, the oldest notice of the line with something still to count; null when the
   * goods came without a notice.
   */
  private async shipmentOf(
    manager: EntityManager,
    line: ReleaseLineEntity,
    release: ReleaseEntity,
    named: number | null | undefined,
  ): Promise<number | null> {
    if (named === null) return null;
    const carried = await manager.findBy(ShipNoticeLineEntity, { releaseLineId: line.id });
    if (named !== undefined) {
      const notice = await manager.findOneBy(ShipNoticeEntity, { id: named });
      if (!notice || notice.releaseId !== release.id || !carried.some((row) => row.shipNoticeId === named)) {
        throw new RefusedInputError(`Shipment ${named} does not carry line ${line.id} (${line.partNumber}).`, [
          {
            path: ['shipNoticeId'],
            message: `ship notice ${named} has no line ${line.id} of release ${release.number}`,
          },
        ]);
      }
      return named;
    }
    if (carried.length === 0) return null;
    const counted = await manager.findBy(ReceiptEntity, { releaseLineId: line.id });
    const oldestFirst = [...carried].sort((a, b) => a.shipNoticeId - b.shipNoticeId);
    const waiting = oldestFirst.find((row) => {
      const receivedOnIt = counted
        .filter(
          (receipt) =>
            receipt.shipNoticeId === row.shipNoticeId && addsToOnHand(receipt.discrepancy as Discrepancy | null),
        )
        .reduce((total, receipt) => total + receipt.qty, 0);
      return receivedOnIt < row.qty - QTY_EPSILON;
    });
    return waiting?.shipNoticeId ?? null;
  }

  /** The counted card goes to Counted: the shipment's, or the unshipped lines expected on the same day. */
  private async moveCardToCounted(
    manager: EntityManager,
    line: ReleaseLineEntity,
    shipNoticeId: number | null,
  ): Promise<void> {
    if (shipNoticeId !== null) {
      await manager.update(ShipNoticeEntity, { id: shipNoticeId }, { dockColumn: 'counted' });
      return;
    }
    const siblings = await manager.findBy(ReleaseLineEntity, { releaseId: line.releaseId });
    const sameCard = siblings.filter((sibling) => expectedArrival(sibling) === expectedArrival(line));
    await manager.update(
      ReleaseLineEntity,
      { id: In(sameCard.map((sibling) => sibling.id)) },
      { dockColumn: 'counted' },
    );
  }

  /** `received` once every line is closed; `partial` once anything usable arrived or a line closed. */
  private async releaseStatusAfter(manager: EntityManager, release: ReleaseEntity): Promise<string> {
    const lines = await manager.findBy(ReleaseLineEntity, { releaseId: release.id });
    if (lines.every((line) => line.closed)) return 'received';
    if (lines.some((line) => line.closed || line.receivedQty > 0)) return 'partial';
    return release.status;
  }

  /**
   * The card that asked for a closed line is full again, when stock came in on it. A line closed
   * with nothing usable (all short, damaged or the wrong part) sends its card back to empty, so the
   * next release orders it again rather than leaving a full card with no stock behind it. A card
   * already back, or pulled from circulation, is left as it is: the count must not fail over it.
   */
  private async returnCard(manager: EntityManager, cardId: number, stocked: boolean, userEmail: string): Promise<void> {
    const card = await manager.findOneBy(KanbanCardEntity, { id: cardId });
    if (!card || card.retiredAt || !isCardState(card.state) || !canTransition(card.state, 'receive')) return;
    if (stocked) {
      await applyCardEvent(manager, card, 'receive', userEmail);
      return;
    }
    await manager.update(
      KanbanCardEntity,
      { id: card.id },
      { state: 'empty', stateChangedAt: new Date().toISOString(), releaseLineId: null },
    );
  }
}
