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

/** The receiving board: releases on their way in, one card each, and the moves between columns. */
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
    const [dockVersion, planningVersion] = await Promise.all([readDockVersion(manager), readPlanningVersion(manager)]);
    const key = `${dockVersion}|${planningVersion}|${plantToday(now)}|${startOfDay(now)}`;
    if (this.board?.key === key) return this.board.body;
    const body = new SerialisedBody(await this.list(now));
    if (!this.db.inWriteUnit) this.board = { key, body };
    return body;
  }

  /** Every open release, and those received today, ordered by column then need date. */
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
    const items = await this.toItems(manager, releases, plantToday(now));
    return items.sort(
      (a, b) =>
        DOCK_COLUMNS.indexOf(a.column) - DOCK_COLUMNS.indexOf(b.column) ||
        a.needDate.localeCompare(b.needDate) ||
        a.number.localeCompare(b.number),
    );
  }

  /** One card of the board by release id; 404 when there is no such release or it is not on the dock. */
  async item(releaseId: number, manager: EntityManager = this.db.manager): Promise<DockItem> {
    const release = await manager.findOneBy(ReleaseEntity, { id: releaseId });
    if (!release) throw new NotFoundError(`No release with id ${releaseId}.`);
    if (!isDockStatus(release.status))
      throw new NotFoundError(`Release ${release.number} is ${release.status}; it is not on the dock.`);
    const [item] = await this.toItems(manager, [release], plantToday(this.now()));
    return item;
  }

  /**
   * Moves a card to another column. Backwards is allowed (a count to redo, goods put back on
   * the dock), except out of `to_line` once everything is received: those goods are at the line.
   */
  move(releaseId: number, column: DockColumn, actor: AuthenticatedUser): Promise<DockItem> {
    return this.db.write(async (manager) => {
      const release = await manager.findOneBy(ReleaseEntity, { id: releaseId });
      if (!release) throw new NotFoundError(`No release with id ${releaseId}.`);
      if (!isDockStatus(release.status)) {
        throw new ConflictError(
          `Release ${release.number} is ${release.status}; only releases on their way in are on the dock.`,
        );
      }
      const from = release.dockColumn;
      if (from === column) return this.item(releaseId, manager);
      if (from === 'to_line' && release.status === 'received') {
        throw new ConflictError(
          `Release ${release.number} is fully received and at the line; it cannot go back on the dock.`,
          [{ column: from, status: release.status }],
        );
      }
      await manager.update(ReleaseEntity, { id: release.id }, { dockColumn: column });
      await recordAudit(manager, {
        actorEmail: actor.email,
        action: 'dock-move',
        entity: 'release',
        entityKey: release.number,
        changes: { dockColumn: { from, to: column } },
      });
      await bumpDockVersion(manager);
      return this.item(releaseId, manager);
    });
  }

  private async toItems(manager: EntityManager, releases: ReleaseEntity[], today: string): Promise<DockItem[]> {
    if (releases.length === 0) return [];
    const releaseIds = releases.map((release) => release.id);
    const lines = await manager.find(ReleaseLineEntity, { where: { releaseId: In(releaseIds) }, order: { id: 'ASC' } });
    const partNumbers = [...new Set(lines.map((line) => line.partNumber))];
    const cardIds = lines.flatMap((line) => (line.cardId === null ? [] : [line.cardId]));
    const [parts, suppliers, cards, attachments] = await Promise.all([
      manager.findBy(PartEntity, { partNumber: In(partNumbers) }),
      manager.findBy(SupplierEntity, { code: In([...new Set(releases.map((release) => release.supplierCode))]) }),
      cardIds.length > 0 ? manager.findBy(KanbanCardEntity, { id: In(cardIds) }) : Promise.resolve([]),
      manager.find(AttachmentEntity, { where: { releaseId: In(releaseIds) }, order: { id: 'ASC' } }),
    ]);
    const partByNumber = new Map(parts.map((part) => [part.partNumber, part]));
    const supplierName = new Map(suppliers.map((supplier) => [supplier.code, supplier.name]));
    const cardNumber = new Map(cards.map((card) => [card.id, card.cardNumber]));

    return releases.map((release) => {
      const ownLines: DockLine[] = lines
        .filter((line) => line.releaseId === release.id)
        .map((line) => {
          const part = partByNumber.get(line.partNumber);
          const card = line.cardId === null ? undefined : cardNumber.get(line.cardId);
          return {
            id: line.id,
            partNumber: line.partNumber,
            description: part?.description ?? '',
            uom: part?.uom ?? 'H87',
            qty: line.qty,
            confirmedQty: line.confirmedQty,
            receivedQty: line.receivedQty,
            open: !line.closed,
            ...(card !== undefined && { cardNumber: card }),
            needDate: line.needDate,
            hazardous: part?.hazardous ?? false,
            unNumber: part?.unNumber ?? null,
            hazardClass: part?.hazardClass ?? null,
            sdsUrl: part?.sdsUrl ?? null,
            unitWeightKg: part?.unitWeightKg ?? null,
            heavyLift: part?.heavyLift ?? false,
          };
        });
      const openLines = ownLines.filter((line) => line.open);
      const needDates = (openLines.length > 0 ? openLines : ownLines).map((line) => line.needDate).sort();
      const needDate = needDates[0] ?? release.releaseDate;
      return {
        id: release.id,
        number: release.number,
        supplierCode: release.supplierCode,
        supplierName: supplierName.get(release.supplierCode) ?? release.supplierCode,
        column: isDockColumn(release.dockColumn) ? release.dockColumn : 'expected',
        status: release.status as DockStatus,
        needDate,
        expectedToday: needDate === today,
        overdue: openLines.length > 0 && needDate < today,
        carrier: release.carrier,
        trackingNumber: release.trackingNumber,
        hazardous: ownLines.some((line) => line.hazardous),
        lines: ownLines,
        attachments: attachments.filter((attachment) => attachment.releaseId === release.id).map(toDockAttachment),
      };
    });
  }
}
