import { forecastZone, plannedUntil } from '../../shared/domain/supplier-forecast';
import type { OverAction } from '../../shared/domain/over-receipt';
import type { Discrepancy } from '../../shared/schemas/receipts';
import type { ReceivingClaim, SupplierForecast } from '../../shared/schemas/supplier-account';
import { readCalendar } from '../calendar/calendar.service';
import type { Database } from '../db/database';
import { ReceiptEntity } from '../dock/receipt.entity';
import { NotFoundError } from '../errors';
import { SupplierEntity } from '../master-data/supplier.entity';
import { plantToday } from '../planning/plan-dates';
import type { PlanningService } from '../planning/planning.service';
import { ReleaseLineEntity } from '../releases/release-line.entity';
import { ReleaseEntity } from '../releases/release.entity';
import { readSequenceSettings } from '../sequence/sequence-settings';
import { frozenUntil } from '../sequence/sequence-window';

/** What one supplier sees of its own business: the demand ahead for its parts and what the dock recorded against it. */
export class SupplierAccountService {
  constructor(
    private readonly db: Database,
    private readonly planning: PlanningService,
    private readonly clock: () => Date = () => new Date(),
  ) {}

  /** Gross demand of the supplier's parts by working day, each day zoned firm, planned or forecast. */
  async forecast(supplierCode: string, range: { from?: string; to?: string }): Promise<SupplierForecast> {
    const supplier = await this.supplier(supplierCode);
    const demand = await this.planning.demand({ ...range, supplierCode });
    const { inputs } = await this.planning.plan(range.from, range.to);
    const manager = this.db.manager;
    const calendar = await readCalendar(manager);
    const today = plantToday(this.clock());
    const frozen = frozenUntil(today, (await readSequenceSettings(manager)).frozenWindowDays, calendar);
    const partsByNumber = new Map(inputs.parts.map((part) => [part.partNumber, part]));

    return {
      supplierCode: supplier.code,
      supplierName: supplier.name,
      today,
      frozenUntil: frozen,
      days: demand.days,
      sequenceEnds: demand.sequenceEnds,
      parts: demand.rows.map((row) => {
        const part = partsByNumber.get(row.partNumber);
        const leadTimeDays = part?.leadTimeDays ?? 0;
        const limits = { frozenUntil: frozen, plannedUntil: plannedUntil(today, leadTimeDays, calendar) };
        return {
          partNumber: row.partNumber,
          description: part?.description ?? '',
          uom: part?.uom ?? '',
          leadTimeDays,
          plannedUntil: limits.plannedUntil,
          total: row.total,
          days: demand.days.map((date) => ({ date, qty: row.byDay[date] ?? 0, zone: forecastZone(date, limits) })),
        };
      }),
    };
  }

  /** Receipts the dock recorded short, over, damaged or as the wrong part against the supplier's releases, newest first. */
  async claims(supplierCode: string): Promise<ReceivingClaim[]> {
    await this.supplier(supplierCode);
    const rows = await this.db.manager
      .createQueryBuilder(ReceiptEntity, 'receipt')
      .innerJoin(ReleaseLineEntity, 'line', 'line.id = receipt.releaseLineId')
      .innerJoin(ReleaseEntity, 'release', 'release.id = line.releaseId')
      // Aliases given apart so TypeORM quotes them: PostgreSQL folds bare ones to lower case.
      .select('receipt.id', 'receiptId')
      .addSelect('receipt.qty', 'qty')
      .addSelect('receipt.discrepancy', 'discrepancy')
      .addSelect('receipt.overAction', 'overAction')
      .addSelect('receipt.excessQty', 'excessQty')
      .addSelect('receipt.note', 'note')
      .addSelect('receipt.receivedAt', 'receivedAt')
      .addSelect('line.partNumber', 'partNumber')
      .addSelect('line.qty', 'lineQty')
      .addSelect('release.number', 'releaseNumber')
      .where('release.supplierCode = :supplierCode', { supplierCode })
      .andWhere('receipt.discrepancy IS NOT NULL')
      .orderBy('receipt.receivedAt', 'DESC')
      .addOrderBy('receipt.id', 'DESC')
      .limit(500)
      .getRawMany<
        Omit<ReceivingClaim, 'discrepancy' | 'overAction'> & { discrepancy: Discrepancy; overAction: OverAction | null }
      >();
    return rows.map((row) => ({ ...row, receiptId: Number(row.receiptId), excessQty: Number(row.excessQty) }));
  }

  private async supplier(code: string): Promise<SupplierEntity> {
    const supplier = await this.db.manager.findOne(SupplierEntity, { where: { code } });
    if (!supplier) throw new NotFoundError(`No supplier ${code}.`);
    return supplier;
  }
}
