import { In, type EntityManager } from 'typeorm';
import type {
  ShipNotice,
  ShipNoticeRequest,
  ShipNoticeResponse,
  ShippingView,
} from '../../shared/schemas/ship-notices';
import { recordAudit } from '../audit/audit.service';
import type { Database } from '../db/database';
import { ConflictError, NotFoundError, RefusedInputError } from '../errors';
import type { AuthenticatedUser } from '../http/request-user';
import { oncePerKey } from '../http/idempotency';
import { applyCardEvent } from '../loops/card-events';
import { KanbanCardEntity } from '../loops/kanban-card.entity';
import { canTransition, isCardState } from '../../shared/domain/card-cycle';
import { typedQtyProblem } from '../../shared/domain/typed-quantity';
import { PartEntity } from '../master-data/part.entity';
import { SupplierEntity } from '../master-data/supplier.entity';
import { plantToday } from '../planning/plan-dates';
import { readLineTiming } from '../releases/line-timing';
import { releasesChanged } from '../releases/release-events';
import { ReleaseLineEntity } from '../releases/release-line.entity';
import { ReleaseEntity } from '../releases/release.entity';
import { ShipNoticeLineEntity } from './ship-notice-line.entity';
import { ShipNoticeEntity } from './ship-notice.entity';
import { releaseIdOfShippingLink } from './shipping-links';
import { formatDay } from '../../shared/format/dates';

/** Release states a shipment may be announced in: answered, and not yet fully received or called off. */
const SHIPPABLE = ['confirmed', 'exception', 'shipped', 'partial'];

/** Who sends a notice: a signed-in supplier account, or the holder of the release's shipping link. */
export type ShipNoticeSender = { user: AuthenticatedUser } | { token: string };

/** The most that may still be announced on a line: what is open plus the supplier's over tolerance. */
export function maxShippable(line: { qty: number; receivedQty: number }, shipped: number, overTolerancePct: number) {
  const allowed = line.qty * (1 + overTolerancePct / 100);
  return Math.max(0, allowed - Math.max(shipped, line.receivedQty));
}

/** The notices of a set of releases, oldest first, by release id. */
export async function readShipNotices(
  manager: EntityManager,
  releases: ReleaseEntity[],
): Promise<Map<number, ShipNotice[]>> {
  const byRelease = new Map<number, ShipNotice[]>();
  if (releases.length === 0) return byRelease;
  const notices = await manager.find(ShipNoticeEntity, {
    where: { releaseId: In(releases.map((release) => release.id)) },
    order: { id: 'ASC' },
  });
  const noticeLines = notices.length
    ? await manager.find(ShipNoticeLineEntity, {
        where: { shipNoticeId: In(notices.map((notice) => notice.id)) },
        order: { id: 'ASC' },
      })
    : [];
  const lineIds = [...new Set(noticeLines.map((line) => line.releaseLineId))];
  const releaseLines = lineIds.length ? await manager.findBy(ReleaseLineEntity, { id: In(lineIds) }) : [];
  const partOf = new Map(releaseLines.map((line) => [line.id, line.partNumber]));
  const numberOf = new Map(releases.map((release) => [release.id, release.number]));
  for (const notice of notices) {
    const list = byRelease.get(notice.releaseId) ?? [];
    list.push({
      id: notice.id,
      releaseNumber: numberOf.get(notice.releaseId)!,
      shipDate: notice.shipDate,
      arrivalDate: notice.arrivalDate,
      carrier: notice.carrier,
      trackingNumber: notice.trackingNumber,
      createdAt: notice.createdAt,
      lines: noticeLines
        .filter((line) => line.shipNoticeId === notice.id)
        .map((line) => ({
          lineId: line.releaseLineId,
          partNumber: partOf.get(line.releaseLineId) ?? '',
          qty: line.qty,
        })),
    });
    byRelease.set(notice.releaseId, list);
  }
  return byRelease;
}

export class ShipNoticesService {
  constructor(private readonly db: Database) {}

  /** The ship-notice form of a release behind a shipping link (404 unknown or expired). */
  async viewByToken(token: string): Promise<ShippingView> {
    const release = await this.releaseOf(this.db.manager, { token });
    return this.view(this.db.manager, release);
  }

  /** The ship-notice form of a release for a signed-in supplier (another supplier's is 404). */
  async viewForUser(number: string, user: AuthenticatedUser): Promise<ShippingView> {
    const release = await this.releaseOf(this.db.manager, { user }, number);
    return this.view(this.db.manager, release);
  }

  /**
   * Records one shipment once per Idempotency-Key: its lines, carrier, tracking and arrival (ship
   * date plus transit). The release becomes `shipped` when every open line is fully announced,
   * `partial` otherwise; a kanban card whose line is fully announced goes `shipped`.
   */
  async send(
    sender: ShipNoticeSender,
    number: string | null,
    body: ShipNoticeRequest,
    key: string,
  ): Promise<{ created: boolean; body: ShipNoticeResponse }> {
    return this.db.write(async (manager) => {
      const release = await this.releaseOf(manager, sender, number);
      return oncePerKey(manager, `ship-notice:${release.number}`, key, body, () =>
        this.record(manager, release, body, 'user' in sender ? sender.user.email : `supplier:${release.supplierCode}`),
      );
    });
  }

  private async record(
    manager: EntityManager,
    release: ReleaseEntity,
    body: ShipNoticeRequest,
    actor: string,
  ): Promise<ShipNoticeResponse> {
    if (!SHIPPABLE.includes(release.status)) {
      throw new ConflictError(
        `Release ${release.number} is ${release.status}: a shipment can be announced once the release is answered and until it is received.`,
        [{ status: release.status }],
      );
    }
    const today = plantToday();
    if (body.shipDate < today) {
      throw new RefusedInputError('A ship date cannot be in the past.', [
        {
          path: ['shipDate'],
          message: `the ship date ${formatDay(body.shipDate)} is before today (${formatDay(today)})`,
        },
      ]);
    }
    const lines = await manager.findBy(ReleaseLineEntity, { releaseId: release.id });
    const lineById = new Map(lines.map((line) => [line.id, line]));
    const shipped = await this.shippedByLine(manager, lines);
    const supplier = await manager.findOneBy(SupplierEntity, { code: release.supplierCode });
    const overPct = supplier?.overTolerancePct ?? 0;
    const uomOf = await this.unitsOf(manager, lines);

    const problems = body.lines.flatMap((asked, index) => {
      const line = lineById.get(asked.lineId);
      if (!line)
        return [
          { path: ['lines', index, 'lineId'], message: `line ${asked.lineId} is not on release ${release.number}` },
        ];
      if (line.closed)
        return [{ path: ['lines', index, 'qty'], message: `line ${line.id} (${line.partNumber}) is already closed` }];
      const uom = uomOf.get(line.partNumber);
      const unfit = uom === undefined ? null : typedQtyProblem(asked.qty, uom, 'positive');
      if (unfit)
        return [
          { path: ['lines', index, 'qty'], message: `line ${line.id} (${line.partNumber}): ${unfit.toLowerCase()}` },
        ];
      const most = maxShippable(line, shipped.get(line.id) ?? 0, overPct);
      if (asked.qty > most + 1e-9) {
        return [
          {
            path: ['lines', index, 'qty'],
            message: `line ${line.id} (${line.partNumber}): ${asked.qty} is more than the ${most} still open${overPct > 0 ? ` with the ${overPct} % over tolerance` : ''}`,
          },
        ];
      }
      return [];
    });
    if (problems.length > 0) {
      throw new RefusedInputError(`The ship notice does not fit release ${release.number}.`, problems);
    }

    const timing = await readLineTiming(manager, [release.supplierCode]);
    const arrivalDate = timing.arrivalOf(release.supplierCode, body.shipDate);
    const createdAt = new Date().toISOString();
    const notice = await manager.save(
      manager.create(ShipNoticeEntity, {
        releaseId: release.id,
        shipDate: body.shipDate,
        arrivalDate,
        carrier: body.carrier,
        trackingNumber: body.trackingNumber,
        createdAt,
        createdBy: actor,
      }),
    );
    await manager.insert(
      ShipNoticeLineEntity,
      body.lines.map((line) => ({ shipNoticeId: notice.id, releaseLineId: line.lineId, qty: line.qty })),
    );
    for (const line of body.lines) shipped.set(line.lineId, (shipped.get(line.lineId) ?? 0) + line.qty);

    const fullyShipped = (line: ReleaseLineEntity) => (shipped.get(line.id) ?? 0) + 1e-9 >= line.qty - line.receivedQty;
    const status = lines.filter((line) => !line.closed).every(fullyShipped) ? 'shipped' : 'partial';
    await manager.update(ReleaseEntity, { id: release.id }, { status });
    await this.shipCards(
      manager,
      lines.filter((line) => body.lines.some((asked) => asked.lineId === line.id) && fullyShipped(line)),
      actor,
    );

    await recordAudit(manager, {
      actorEmail: actor,
      action: 'ship-notice',
      entity: 'release',
      entityKey: release.number,
      changes: {
        before: release.status,
        after: status,
        shipNoticeId: notice.id,
        shipDate: body.shipDate,
        arrivalDate,
        carrier: body.carrier,
        trackingNumber: body.trackingNumber,
        lines: body.lines.map((line) => ({ ...line, partNumber: lineById.get(line.lineId)!.partNumber })),
      },
    });
    await releasesChanged(manager);
    const [described] = (await readShipNotices(manager, [release])).get(release.id)!.filter((n) => n.id === notice.id);
    return { notice: described!, releaseStatus: status };
  }

  /** A card waits on the road once its whole line is announced; a card moved by hand is left alone. */
  private async shipCards(manager: EntityManager, lines: ReleaseLineEntity[], actor: string): Promise<void> {
    const cardIds = lines.map((line) => line.cardId).filter((id): id is number => id !== null);
    if (cardIds.length === 0) return;
    const cards = await manager.findBy(KanbanCardEntity, { id: In(cardIds) });
    for (const card of cards) {
      if (card.retiredAt || !isCardState(card.state) || !canTransition(card.state, 'ship')) continue;
      await applyCardEvent(manager, card, 'ship', actor);
    }
  }

  /** The unit of measure of each line's part, by part number. */
  private async unitsOf(manager: EntityManager, lines: ReleaseLineEntity[]): Promise<Map<string, string>> {
    const partNumbers = [...new Set(lines.map((line) => line.partNumber))];
    const parts = partNumbers.length ? await manager.findBy(PartEntity, { partNumber: In(partNumbers) }) : [];
    return new Map(parts.map((part) => [part.partNumber, part.uom]));
  }

  private async shippedByLine(manager: EntityManager, lines: ReleaseLineEntity[]): Promise<Map<number, number>> {
    const shipped = new Map<number, number>();
    if (lines.length === 0) return shipped;
    const rows = await manager.findBy(ShipNoticeLineEntity, { releaseLineId: In(lines.map((line) => line.id)) });
    for (const row of rows) shipped.set(row.releaseLineId, (shipped.get(row.releaseLineId) ?? 0) + row.qty);
    return shipped;
  }

  private async releaseOf(
    manager: EntityManager,
    sender: ShipNoticeSender,
    number?: string | null,
  ): Promise<ReleaseEntity> {
    if ('token' in sender) {
      const releaseId = await releaseIdOfShippingLink(manager, sender.token);
      const release = releaseId !== null ? await manager.findOneBy(ReleaseEntity, { id: releaseId }) : null;
      if (!release)
        throw new NotFoundError('This ship-notice link is not known or has expired. Ask the buyer for help.');
      if (number && release.number !== number) throw new NotFoundError(`No release ${number}.`);
      return release;
    }
    const release = number ? await manager.findOneBy(ReleaseEntity, { number }) : null;
    if (!release || release.supplierCode !== sender.user.supplierCode) throw new NotFoundError(`No release ${number}.`);
    return release;
  }

  private async view(manager: EntityManager, release: ReleaseEntity): Promise<ShippingView> {
    const lines = await manager.find(ReleaseLineEntity, {
      where: { releaseId: release.id },
      order: { needDate: 'ASC', partNumber: 'ASC', id: 'ASC' },
    });
    const shipped = await this.shippedByLine(manager, lines);
    const supplier = await manager.findOneBy(SupplierEntity, { code: release.supplierCode });
    const partNumbers = [...new Set(lines.map((line) => line.partNumber))];
    const parts = partNumbers.length ? await manager.findBy(PartEntity, { partNumber: In(partNumbers) }) : [];
    const partOf = new Map(parts.map((part) => [part.partNumber, part]));
    return {
      releaseNumber: release.number,
      supplierName: supplier?.name ?? release.supplierCode,
      status: release.status,
      today: plantToday(),
      transitDays: supplier?.transitDays ?? 0,
      lines: lines
        .filter((line) => !line.closed)
        .map((line) => ({
          id: line.id,
          partNumber: line.partNumber,
          description: partOf.get(line.partNumber)?.description ?? '',
          uom: partOf.get(line.partNumber)?.uom ?? 'H87',
          qty: line.qty,
          shippedQty: shipped.get(line.id) ?? 0,
          maxQty: maxShippable(line, shipped.get(line.id) ?? 0, supplier?.overTolerancePct ?? 0),
          needDate: line.needDate,
          arrivalDate: line.arrivalDate,
        })),
      notices: (await readShipNotices(manager, [release])).get(release.id) ?? [],
    };
  }
}
