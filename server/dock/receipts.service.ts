import { In, QueryFailedError, type EntityManager } from 'typeorm';
import { canTransition, isCardState } from '../../shared/domain/card-cycle';
import { QTY_EPSILON, roundQty } from '../../shared/domain/quantity';
import { RECEIVABLE_STATUSES, type DockStatus } from '../../shared/schemas/dock';
import {
  addsToOnHand,
  type Discrepancy,
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
import { postMovements } from '../stock/stock-ledger';
import { ReleaseLineEntity } from '../releases/release-line.entity';
import { ReleaseEntity } from '../releases/release.entity';
import { bumpPlanningVersion } from '../settings/versions';
import { ReceiptEntity } from './receipt.entity';
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

function toReceipt(entity: ReceiptEntity, line: ReleaseLineEntity, release: ReleaseEntity): Receipt {
  const discrepancy = entity.discrepancy as Discrepancy | null;
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
    addedToOnHand: addsToOnHand(discrepancy) ? entity.qty : 0,
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
  };
}

function sameRequest(entity: ReceiptEntity, request: ReceiptRequest): boolean {
  const wanted = normalise(request);
  return (
    entity.releaseLineId === wanted.releaseLineId &&
    entity.qty === wanted.qty &&
    entity.discrepancy === wanted.discrepancy &&
    entity.note === wanted.note &&
    entity.final === wanted.final &&
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
    return { created: false, body: { receipt: toReceipt(existing, line, release), onHand: existing.onHandAfter } };
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

    const shipNoticeId = await this.shipmentOf(manager, line, release, request.shipNoticeId);
    const stored = normalise(request);
    const usable = addsToOnHand(stored.discrepancy) ? stored.qty : 0;
    const onHandBefore = part.onHand;
    const receivedQty = roundQty(line.receivedQty + usable);
    const ordered = line.confirmedQty ?? line.qty;
    const closes = stored.final || receivedQty >= ordered - QTY_EPSILON;

    const [movement] = await postMovements(manager, [
      {
        partNumber: part.partNumber,
        qty: usable,
        kind: 'receipt',
        userEmail: actor.email,
        reason: `Release ${release.number}${stored.discrepancy ? ` (${stored.discrepancy})` : ''}`,
        refType: 'release',
        ref: release.number,
      },
    ]);
    const onHandAfter = movement?.balanceAfter ?? onHandBefore;
    await manager.update(ReleaseLineEntity, { id: line.id }, { receivedQty, closed: closes });
    if (closes && line.cardId !== null) await this.returnCard(manager, line.cardId, receivedQty > 0, actor.email);

    const previousStatus = release.status;
    const status = await this.releaseStatusAfter(manager, release);
    await manager.update(ReleaseEntity, { id: release.id }, { status });
    await this.moveCardToCounted(manager, line, shipNoticeId);

    const receipt = await manager.save(
      manager.create(ReceiptEntity, {
        ...stored,
        shipNoticeId,
        idempotencyKey,
        onHandAfter,
        userEmail: actor.email,
        receivedAt: new Date().toISOString(),
      }),
    );
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
        discrepancy: stored.discrepancy,
        final: stored.final,
        onHand: { from: onHandBefore, to: onHandAfter },
        receivedQty: { from: line.receivedQty, to: receivedQty },
        lineClosed: closes,
        ...(status !== previousStatus && { releaseStatus: { from: previousStatus, to: status } }),
      },
    });
    await bumpPlanningVersion(manager);
    await bumpDockVersion(manager);
    return { receipt: toReceipt(receipt, line, release), onHand: onHandAfter };
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
