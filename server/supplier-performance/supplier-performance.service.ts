import { In } from 'typeorm';
import {
  addMonths,
  firstDayOf,
  lastDayOf,
  monthOf,
  monthSpan,
  supplierPerformance,
  type PerformanceLine,
  type PerformanceRelease,
  type YearMonth,
} from '../../shared/domain/supplier-performance';
import { addsToOnHand, type Discrepancy } from '../../shared/schemas/receipts';
import {
  DEFAULT_PERFORMANCE_MONTHS,
  MAX_PERFORMANCE_MONTHS,
  type PerformanceQuery,
  type SupplierMonthPerformanceDto,
} from '../../shared/schemas/supplier-performance';
import { BadRequestError, NotFoundError } from '../errors';
import { plantToday } from '../planning/plan-dates';
import { ReceiptShareEntity } from '../dock/receipt-share.entity';
import { ReceiptEntity } from '../dock/receipt.entity';
import { ReleaseLineEntity } from '../releases/release-line.entity';
import { ReleaseEntity } from '../releases/release.entity';
import { SupplierEntity } from '../master-data/supplier.entity';
import { readCalendar } from '../calendar/calendar.service';
import type { Database } from '../db/database';

/** Fills in and checks the month range: defaults to the last six months through the current one. */
export function resolveMonths(
  query: Pick<PerformanceQuery, 'from' | 'to'>,
  today: string,
): { from: YearMonth; to: YearMonth } {
  const to = query.to ?? (query.from && query.from > monthOf(today) ? query.from : monthOf(today));
  const from = query.from ?? addMonths(to, -(DEFAULT_PERFORMANCE_MONTHS - 1));
  const span = monthSpan(from, to);
  if (span < 1) throw new BadRequestError('to is before from.', [{ path: ['to'], message: 'must not be before from' }]);
  if (span > MAX_PERFORMANCE_MONTHS) {
    throw new BadRequestError(`The range spans ${span} months; ask for at most ${MAX_PERFORMANCE_MONTHS}.`, [
      { path: ['to'], message: `must be at most ${MAX_PERFORMANCE_MONTHS} months after from` },
    ]);
  }
  return { from, to };
}

interface LineRow {
  id: number;
  releaseId: number;
  qty: number;
  needDate: string;
  requestedQty: number | null;
  requestedDate: string | null;
  confirmedQty: number | null;
  arrivalDate: string | null;
  supplierCode: string;
}

/** Reads releases, lines and receipts of a range and measures each supplier's months. */
export class SupplierPerformanceService {
  constructor(
    private readonly db: Database,
    private readonly clock: () => Date = () => new Date(),
  ) {}

  async performance(query: PerformanceQuery): Promise<SupplierMonthPerformanceDto[]> {
    const now = this.clock();
    const today = plantToday(now);
    const { from, to } = resolveMonths(query, today);
    const manager = this.db.manager;

    const suppliers = await manager.find(SupplierEntity, query.supplier ? { where: { code: query.supplier } } : {});
    if (query.supplier && suppliers.length === 0) throw new NotFoundError(`No supplier ${query.supplier}.`);
    const names = new Map(suppliers.map((supplier) => [supplier.code, supplier.name]));

    // Only what can land in the range: requested dates of the range's months, up to the day before today.
    const requestedDate = 'COALESCE(line.requestedDate, line.needDate)';
    const lineQuery = manager
      .createQueryBuilder(ReleaseLineEntity, 'line')
      .innerJoin(ReleaseEntity, 'release', 'release.id = line.releaseId')
      .select('line.id', 'id')
      .addSelect('line.releaseId', 'releaseId')
      .addSelect('line.qty', 'qty')
      .addSelect('line.needDate', 'needDate')
      .addSelect('line.requestedQty', 'requestedQty')
      .addSelect('line.requestedDate', 'requestedDate')
      .addSelect('line.confirmedQty', 'confirmedQty')
      .addSelect('line.arrivalDate', 'arrivalDate')
      .addSelect('release.supplierCode', 'supplierCode')
      .where('release.status != :cancelled', { cancelled: 'cancelled' })
      .andWhere(`${requestedDate} BETWEEN :first AND :last`, { first: firstDayOf(from), last: lastDayOf(to) })
      .andWhere(`${requestedDate} < :today`, { today });
    if (query.supplier) lineQuery.andWhere('release.supplierCode = :supplier', { supplier: query.supplier });
    const rows = await lineQuery.getRawMany<LineRow>();

    const receiptsByLine = new Map<number, PerformanceLine['receipts'][number][]>();
    const add = (lineId: number, receipt: PerformanceLine['receipts'][number]) => {
      const list = receiptsByLine.get(lineId) ?? [];
      list.push(receipt);
      receiptsByLine.set(lineId, list);
    };
    const lineIds = rows.map((row) => row.id);
    // SQLite allows a limited number of bound parameters per statement.
    for (let start = 0; start < lineIds.length; start += 500) {
      const slice = lineIds.slice(start, start + 500);
      const receipts = await manager.find(ReceiptEntity, { where: { releaseLineId: In(slice) } });
      const sharesIn = await manager.find(ReceiptShareEntity, { where: { releaseLineId: In(slice) } });
      const fromIds = [...new Set(sharesIn.map((share) => share.receiptId))];
      const keptIds = receipts.filter((receipt) => receipt.overAction === 'keep').map((receipt) => receipt.id);
      const sharedFrom = fromIds.length > 0 ? await manager.findBy(ReceiptEntity, { id: In(fromIds) }) : [];
      const sharesOut = keptIds.length > 0 ? await manager.findBy(ReceiptShareEntity, { receiptId: In(keptIds) }) : [];
      for (const receipt of receipts) {
        // An over receipt delivers on its own line only what stayed there: excess returned or
        // applied to other lines is not this line's.
        const returned = receipt.overAction === 'return' ? receipt.excessQty : 0;
        const applied = sharesOut
          .filter((share) => share.receiptId === receipt.id)
          .reduce((sum, share) => sum + share.qty, 0);
        add(receipt.releaseLineId, {
          qty: receipt.qty - returned - applied,
          receivedOn: plantToday(new Date(receipt.receivedAt)),
          usable: addsToOnHand(receipt.discrepancy as Discrepancy | null),
        });
      }
      // Kept excess delivered a later line on the day it arrived (early, most likely).
      for (const share of sharesIn) {
        const from = sharedFrom.find((receipt) => receipt.id === share.receiptId);
        if (from)
          add(share.releaseLineId, { qty: share.qty, receivedOn: plantToday(new Date(from.receivedAt)), usable: true });
      }
    }

    const lines: PerformanceLine[] = rows.map((row) => ({
      supplierCode: row.supplierCode,
      requestedQty: row.requestedQty ?? row.qty,
      requestedDate: row.requestedDate ?? row.needDate,
      // An answered line's promise: the confirmed quantity, arriving on the answered arrival (or the need date it accepted).
      promise:
        row.confirmedQty === null ? null : { qty: row.confirmedQty, arrivalDate: row.arrivalDate ?? row.needDate },
      receipts: receiptsByLine.get(row.id) ?? [],
    }));
    const tolerances = new Map(
      suppliers.map((supplier) => [
        supplier.code,
        { earlyToleranceDays: supplier.earlyToleranceDays, lateToleranceDays: supplier.lateToleranceDays },
      ]),
    );
    const calendar = await readCalendar(manager);

    const releases = await this.releasesOf(rows);

    return supplierPerformance({ from, to, today, calendar, tolerances, lines, releases }).map(
      ({ supplierCode, ...figures }) => ({
        supplierCode,
        supplierName: names.get(supplierCode) ?? supplierCode,
        ...figures,
      }),
    );
  }

  /** Sent releases with their earliest need date, for the releases whose lines fell in the range. */
  private async releasesOf(rows: readonly { releaseId: number }[]): Promise<PerformanceRelease[]> {
    const ids = [...new Set(rows.map((row) => row.releaseId))];
    const releases: PerformanceRelease[] = [];
    for (let start = 0; start < ids.length; start += 500) {
      const chunk = ids.slice(start, start + 500);
      const found = await this.db.manager
        .createQueryBuilder(ReleaseEntity, 'release')
        .innerJoin(ReleaseLineEntity, 'line', 'line.releaseId = release.id')
        .select('release.supplierCode', 'supplierCode')
        .addSelect('release.sentAt', 'sentAt')
        .addSelect('release.confirmedAt', 'confirmedAt')
        .addSelect('MIN(COALESCE(line.requestedDate, line.needDate))', 'firstNeedDate')
        .where('release.id IN (:...ids)', { ids: chunk })
        .groupBy('release.id')
        .getRawMany<PerformanceRelease>();
      releases.push(...found);
    }
    return releases;
  }
}
