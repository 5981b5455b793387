import { In, type EntityManager } from 'typeorm';
import {
  DOCK_COLUMNS,
  DOCK_STATUSES,
  type DockAttachment,
  type DockColumn,
  type DockItem,
  type DockLine,
  type DockStatus,
} from '../../shared/schemas/dock';
import { recordAudit } from '../audit/audit.service';
import { ConflictError, NotFoundError } from '../errors';
import { releaseCards, parseCardKey, type BoardCard } from '../../shared/domain/dock-cards';
import { addsToOnHand, type Discrepancy } from '../../shared/schemas/receipts';
import { ReceiptEntity } from './receipt.entity';
import { ShipNoticeEntity } from '../ship-notices/ship-notice.entity';
import { ShipNoticeLineEntity } from '../ship-notices/ship-notice-line.entity';
import { KanbanCardEntity } from '../loops/kanban-card.entity';
import type { AuthenticatedUser } from '../http/request-user';
import { PartEntity } from '../master-data/part.entity';
import { plantToday } from '../planning/plan-dates';
import { AttachmentEntity } from './attachment.entity';
import { ReleaseLineEntity } from '../releases/release-line.entity';
import { ReleaseEntity } from '../releases/release.entity';
import { SupplierEntity } from '../master-data/supplier.entity';
import { bumpDockVersion, readDockVersion, readPlanningVersion } from '../settings/versions';
import { SerialisedBody } from '../http/serialised-body';
import type { Database } from '../db/database';
import { runSql } from '../db/sql';

/** Release states on the board whatever the day: everything still awaited at the dock. */
const OPEN_STATUSES = DOCK_STATUSES.filter((status) => status !== 'received');

/** Start of the plant's calendar day as an instant, to find what was received "today". */
function startOfDay(now: Date): string {
  const midnight = new Date(now);
  midnight.setHours(0, 0, 0, 0);
  return midnight.toISOString();
}

function isDockColumn(value: string): value is DockColumn {
  return (DOCK_COLUMNS as readonly string[]).includes(value);
}

function isDockStatus(value: string): value is DockStatus {
  return (DOCK_STATUSES as readonly string[]).includes(value);
}

export function toDockAttachment(attachment: AttachmentEntity): DockAttachment {
  return {
    id: attachment.id,
    fileName: attachment.fileName,
    mimeType: attachment.mimeType,
    sizeBytes: attachment.sizeBytes,
    uploadedBy: attachment.uploadedBy,
    uploadedAt: attachment.uploadedAt,
  };
}

/** The receiving board: one card per shipment and per day unshipped lines are expected, and the moves between columns. */
export class DockService {
  /** The last board sent and the versions and day it was built for; one board, so bounded. */
  private board: { key: string; body: SerialisedBody } | null = null;

  constructor(
    private readonly db: Database,
    private readonly now: () => Date = () => new Date(),
  ) {}

  /**
   * The board serialised, kept while nothing on it can have changed: releases, lines, receipts,
   * moves and slips bump the dock version, parts and suppliers the planning version, and the day
   * decides what is overdue or received today. Read in the request's snapshot with the versions,
   * so the body kept is the board of exactly those versions.
   */
  async listBody(): Promise<SerialisedBody> {
    const manager = this.db.manager;
    const now = this.now();
    const dockVersion = await readDockVersion(manager);
    const planningVersion = await readPlanningVersion(manager);
    const key = `${dockVersion}|${planningVersion}|${plantToday(now)}|${startOfDay(now)}`;
    if (this.board?.key === key) return this.board.body;
    const body = SerialisedBody.of(await this.list(now));
    if (!this.db.inWriteUnit) this.board = { key, body };
    return body;
  }

  /** The cards of every open release, and those counted in today, ordered by column then expected day. */
  async list(now = this.now()): Promise<DockItem[]> {
    const manager = this.db.manager;
    const receivedToday: { releaseId: number }[] = await runSql(
      manager,
      `SELECT DISTINCT l.release_id AS "releaseId" FROM receipt r JOIN release_line l ON l.id = r.release_line_id
       WHERE r.received_at >= ?`,
      [startOfDay(now)],
    );
    const receivedIds = receivedToday.map((row) => row.releaseId);
    const releases = await manager.find(ReleaseEntity, {
      where: [
        { status: In(OPEN_STATUSES) },
        ...(receivedIds.length > 0 ? [{ status: 'received', id: In(receivedIds) }] : []),
      ],
    });
    const items = await this.toItems(manager, releases, now);
    return items.sort(
      (a, b) =>
        DOCK_COLUMNS.indexOf(a.column) - DOCK_COLUMNS.indexOf(b.column) ||
        a.arrivalDate.localeCompare(b.arrivalDate) ||
        a.number.localeCompare(b.number) ||
        a.id.localeCompare(b.id),
    );
  }

  /** One card of the board by its key; 404 when there is no such card on the dock. */
  async item(key: string, manager: EntityManager = this.db.manager): Promise<DockItem> {
    const release = await this.releaseOfCard(manager, key);
    const item = (await this.toItems(manager, [release])).find((candidate) => candidate.id === key);
    if (!item) throw new NotFoundError(`Card ${key} is not on the dock board.`);
    return item;
  }

  /**
   * Moves a card to another column. Backwards is allowed (a count to redo, goods put back on
   * the dock), except out of `to_line` once the card is fully counted in: those goods are at the line.
   */
  move(key: string, column: DockColumn, actor: AuthenticatedUser): Promise<DockItem> {
    return this.db.write(async (manager) => {
      const release = await this.releaseOfCard(manager, key);
      if (!isDockStatus(release.status)) {
        throw new ConflictError(
          `Release ${release.number} is ${release.status}; only releases on their way in are on the dock.`,
        );
      }
      const card = (await this.toItems(manager, [release])).find((candidate) => candidate.id === key);
      if (!card) throw new NotFoundError(`Card ${key} is not on the dock board.`);
      const from = card.column;
      if (from === column) return card;
      if (from === 'to_line' && card.lines.every((line) => !line.open)) {
        throw new ConflictError(
          `This ${card.kind === 'shipment' ? 'shipment' : 'delivery'} of release ${release.number} is fully received and at the line; it cannot go back on the dock.`,
          [{ column: from, status: release.status }],
        );
      }
      if (card.shipNoticeId !== null) {
        await manager.update(ShipNoticeEntity, { id: card.shipNoticeId }, { dockColumn: column });
      } else {
        await manager.update(ReleaseLineEntity, { id: In(card.lines.map((line) => line.id)) }, { dockColumn: column });
      }
      await recordAudit(manager, {
        actorEmail: actor.email,
        action: 'dock-move',
        entity: 'release',
        entityKey: release.number,
        changes: { card: key, dockColumn: { from, to: column } },
      });
      await bumpDockVersion(manager);
      return this.item(key, manager);
    });
  }

  private async releaseOfCard(manager: EntityManager, key: string): Promise<ReleaseEntity> {
    const parsed = parseCardKey(key);
    if (!parsed) throw new NotFoundError(`No card ${key} on the dock board.`);
    const releaseId =
      parsed.kind === 'expected'
        ? parsed.releaseId
        : (await manager.findOneBy(ShipNoticeEntity, { id: parsed.shipNoticeId }))?.releaseId;
    const release = releaseId === undefined ? null : await manager.findOneBy(ReleaseEntity, { id: releaseId });
    if (!release) throw new NotFoundError(`No card ${key} on the dock board.`);
    return release;
  }

  private async toItems(manager: EntityManager, releases: ReleaseEntity[], now = this.now()): Promise<DockItem[]> {
    if (releases.length === 0) return [];
    const today = plantToday(now);
    const todayStart = startOfDay(now);
    const releaseIds = releases.map((release) => release.id);
    const lines = await manager.find(ReleaseLineEntity, { where: { releaseId: In(releaseIds) }, order: { id: 'ASC' } });
    const lineIds = lines.map((line) => line.id);
    const notices = await manager.find(ShipNoticeEntity, {
      where: { releaseId: In(releaseIds) },
      order: { id: 'ASC' },
    });
    const partNumbers = [...new Set(lines.map((line) => line.partNumber))];
    const cardIds = lines.flatMap((line) => (line.cardId === null ? [] : [line.cardId]));
    // One after another: a PostgreSQL unit of work is one connection, which takes one query at a time.
    const parts = await manager.findBy(PartEntity, { partNumber: In(partNumbers) });
    const suppliers = await manager.findBy(SupplierEntity, {
      code: In([...new Set(releases.map((release) => release.supplierCode))]),
    });
    const cards = cardIds.length > 0 ? await manager.findBy(KanbanCardEntity, { id: In(cardIds) }) : [];
    const attachments = await manager.find(AttachmentEntity, {
      where: { releaseId: In(releaseIds) },
      order: { id: 'ASC' },
    });
    const noticeLines =
      notices.length > 0
        ? await manager.findBy(ShipNoticeLineEntity, { shipNoticeId: In(notices.map((notice) => notice.id)) })
        : [];
    const receipts = lineIds.length > 0 ? await manager.findBy(ReceiptEntity, { releaseLineId: In(lineIds) }) : [];
    const partByNumber = new Map(parts.map((part) => [part.partNumber, part]));
    const supplierName = new Map(suppliers.map((supplier) => [supplier.code, supplier.name]));
    const cardNumber = new Map(cards.map((card) => [card.id, card.cardNumber]));
    const lineById = new Map(lines.map((line) => [line.id, line]));

    return releases.flatMap((release) => {
      const ownLines = lines.filter((line) => line.releaseId === release.id);
      const ownNotices = notices.filter((notice) => notice.releaseId === release.id);
      const boardCards = releaseCards(
        release.id,
        ownLines.map((line) => ({
          id: line.id,
          orderedQty: line.confirmedQty ?? line.qty,
          closed: line.closed,
          needDate: line.needDate,
          arrivalDate: line.arrivalDate,
          dockColumn: line.dockColumn,
        })),
        ownNotices.map((notice) => ({
          id: notice.id,
          shipDate: notice.shipDate,
          arrivalDate: notice.arrivalDate,
          dockColumn: notice.dockColumn,
          lines: noticeLines
            .filter((line) => line.shipNoticeId === notice.id)
            .map((line) => ({ lineId: line.releaseLineId, qty: line.qty })),
        })),
        receipts
          .filter((receipt) => lineById.get(receipt.releaseLineId)?.releaseId === release.id)
          .map((receipt) => ({
            lineId: receipt.releaseLineId,
            shipNoticeId: receipt.shipNoticeId,
            usableQty: addsToOnHand(receipt.discrepancy as Discrepancy | null) ? receipt.qty : 0,
            today: receipt.receivedAt >= todayStart,
          })),
        DOCK_COLUMNS,
      );
      const noticeById = new Map(ownNotices.map((notice) => [notice.id, notice]));
      return boardCards.map((card: BoardCard): DockItem => {
        const cardLines: DockLine[] = card.lines.map((cardLine) => {
          const line = lineById.get(cardLine.lineId)!;
          const part = partByNumber.get(line.partNumber);
          const kanbanCard = line.cardId === null ? undefined : cardNumber.get(line.cardId);
          return {
            id: line.id,
            partNumber: line.partNumber,
            description: part?.description ?? '',
            uom: part?.uom ?? 'H87',
            qty: cardLine.qty,
            receivedQty: cardLine.receivedQty,
            open: cardLine.open,
            ...(kanbanCard !== undefined && { cardNumber: kanbanCard }),
            needDate: line.needDate,
            hazardous: part?.hazardous ?? false,
            unNumber: part?.unNumber ?? null,
            hazardClass: part?.hazardClass ?? null,
            sdsUrl: part?.sdsUrl ?? null,
            unitWeightKg: part?.unitWeightKg ?? null,
            heavyLift: part?.heavyLift ?? false,
          };
        });
        const notice = card.shipNoticeId === null ? undefined : noticeById.get(card.shipNoticeId);
        const anyOpen = cardLines.some((line) => line.open);
        return {
          id: card.key,
          kind: card.kind,
          releaseId: release.id,
          shipNoticeId: card.shipNoticeId,
          number: release.number,
          supplierCode: release.supplierCode,
          supplierName: supplierName.get(release.supplierCode) ?? release.supplierCode,
          column: isDockColumn(card.column) ? card.column : 'expected',
          status: release.status as DockStatus,
          shipDate: card.shipDate,
          arrivalDate: card.arrivalDate,
          expectedToday: anyOpen && card.arrivalDate === today,
          overdue: anyOpen && card.arrivalDate < today,
          carrier: notice ? notice.carrier : release.carrier,
          trackingNumber: notice ? notice.trackingNumber : release.trackingNumber,
          hazardous: cardLines.some((line) => line.hazardous),
          lines: cardLines,
          attachments: attachments.filter((attachment) => attachment.releaseId === release.id).map(toDockAttachment),
        };
      });
    });
  }
}
