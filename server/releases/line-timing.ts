import { In, type EntityManager } from 'typeorm';
import { toWorkingCalendar, type WorkingCalendar } from '../../shared/domain/calendar';
import { arrivalOf, shipWindow, type ShipWindow } from '../../shared/domain/supplier-timing';
import { readCalendar } from '../calendar/calendar.service';
import { SupplierEntity } from '../master-data/supplier.entity';

/** Supplier terms and the plant calendar, read once for every line a request describes or answers. */
export interface LineTiming {
  /** The ship dates that arrive inside the on-time window of a line of this supplier. */
  windowOf(supplierCode: string, needDate: string): ShipWindow;
  /** When a shipment of this supplier leaving on `shipDate` reaches our dock. */
  arrivalOf(supplierCode: string, shipDate: string): string;
  transitDaysOf(supplierCode: string): number;
}

export async function readLineTiming(manager: EntityManager, supplierCodes: readonly string[]): Promise<LineTiming> {
  const calendar: WorkingCalendar = toWorkingCalendar(await readCalendar(manager));
  const codes = [...new Set(supplierCodes)];
  const suppliers = codes.length ? await manager.find(SupplierEntity, { where: { code: In(codes) } }) : [];
  const byCode = new Map(suppliers.map((supplier) => [supplier.code, supplier]));
  // A supplier removed since its release was sent is read as having no transit and the default window.
  const termsOf = (code: string) => byCode.get(code) ?? { transitDays: 0, earlyToleranceDays: 1 };
  return {
    windowOf: (code, needDate) => shipWindow(needDate, termsOf(code), termsOf(code).earlyToleranceDays, calendar),
    arrivalOf: (code, shipDate) => arrivalOf(shipDate, termsOf(code), calendar),
    transitDaysOf: (code) => termsOf(code).transitDays,
  };
}
