import type { EntityManager } from 'typeorm';
import type { IsoDate } from '../../shared/domain/types';
import { releasesChanged } from './release-events';
import { ReleaseLineEntity } from './release-line.entity';
import { ReleaseEntity } from './release.entity';

/** One line of an order already open with a supplier. */
export interface OpenOrderLine {
  supplierCode: string;
  partNumber: string;
  qty: number;
  dueDate: string;
  reference: string;
}

/** The key an open-order line is matched on when a file is loaded again. */
export function openOrderLineKey(line: Pick<OpenOrderLine, 'supplierCode' | 'reference' | 'partNumber' | 'dueDate'>) {
  return [line.supplierCode, line.reference, line.partNumber, line.dueDate].join('\u0000');
}

/** Longest release number the release table holds. */
export const RELEASE_NUMBER_MAX = 30;

/** Release number of an open order: `O-` + supplier + `-` + reference, e.g. `O-PFK-PO-4711`. */
export function openOrderNumber(supplierCode: string, reference: string): string {
  return `O-${supplierCode}-${reference}`;
}

/**
 * Loads orders already open with suppliers as releases the supplier has confirmed (nothing is
 * e-mailed: the supplier has the order). One release per supplier and reference; its lines are
 * matched by part and due date, so loading the same file again changes nothing. Lines not in the
 * file are left as they are. Open lines count as scheduled receipts and can be received at the dock.
 */
export async function upsertOpenOrders(manager: EntityManager, lines: readonly OpenOrderLine[], today: IsoDate) {
  const releases = new Map<string, ReleaseEntity>();
  for (const line of lines) {
    const number = openOrderNumber(line.supplierCode, line.reference);
    let release = releases.get(number) ?? (await manager.findOneBy(ReleaseEntity, { number }));
    if (!release) {
      release = await manager.save(
        manager.create(ReleaseEntity, {
          number,
          supplierCode: line.supplierCode,
          releaseDate: today,
          reference: line.reference,
          status: 'confirmed',
          sentAt: null,
          confirmedAt: null,
          carrier: null,
          trackingNumber: null,
          supplierNote: null,
        }),
      );
    }
    releases.set(number, release);
    const existing = await manager.findOneBy(ReleaseLineEntity, {
      releaseId: release.id,
      partNumber: line.partNumber,
      needDate: line.dueDate,
      origin: 'open_order',
    });
    if (existing) {
      if (existing.qty !== line.qty) {
        await manager.update(
          ReleaseLineEntity,
          { id: existing.id },
          { qty: line.qty, closed: existing.receivedQty >= line.qty },
        );
      }
      continue;
    }
    await manager.insert(ReleaseLineEntity, {
      releaseId: release.id,
      partNumber: line.partNumber,
      qty: line.qty,
      needDate: line.dueDate,
      origin: 'open_order',
      cardId: null,
      confirmedQty: null,
      shipDate: null,
      receivedQty: 0,
      closed: false,
    });
  }
  if (lines.length > 0) await releasesChanged(manager);
}

/** What has been received on each open-order line on file, keyed as the import matches lines. */
export async function receivedOnOpenOrders(manager: EntityManager): Promise<Map<string, number>> {
  const rows: { supplierCode: string; reference: string; partNumber: string; dueDate: string; received: number }[] =
    await manager
      .createQueryBuilder(ReleaseLineEntity, 'line')
      .innerJoin(ReleaseEntity, 'release', 'release.id = line.releaseId')
      .select('release.supplierCode', 'supplierCode')
      .addSelect('release.reference', 'reference')
      .addSelect('line.partNumber', 'partNumber')
      .addSelect('line.needDate', 'dueDate')
      .addSelect('line.receivedQty', 'received')
      .where('line.origin = :origin', { origin: 'open_order' })
      .getRawMany();
  return new Map(rows.map((row) => [openOrderLineKey(row), Number(row.received)]));
}
