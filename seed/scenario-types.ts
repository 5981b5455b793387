import type { Supplier } from '../shared/schemas/master-data';
import type { IsoDate, PartSource, PlantCalendar, Replenishment } from '../shared/domain/types';

/** UN/ECE Recommendation 20 unit codes used by the demo: piece, kilogram, metre, litre. */
export type DemoUom = 'H87' | 'KGM' | 'MTR' | 'LTR';

export type DemoRole = 'admin' | 'planner' | 'buyer' | 'receiving' | 'line' | 'viewer' | 'supplier';

export type DemoSupplier = Supplier;

export interface DemoPart {
  partNumber: string;
  description: string;
  uom: DemoUom;
  source: PartSource;
  supplierCode: string | null;
  leadTimeDays: number;
  packQty: number;
  onHand: number;
  replenishment: Replenishment | null;
  safetyStock: number;
  pointOfUse: string | null;
  hazardous: boolean;
  unNumber?: string | null;
  hazardClass?: string | null;
  sdsUrl?: string | null;
  unitWeightKg?: number | null;
  heavyLift?: boolean;
}

export interface DemoBomLine {
  parent: string;
  component: string;
  qtyPer: number;
  scrapPct: number;
  effectiveFrom: IsoDate | null;
  effectiveTo: IsoDate | null;
}

export interface DemoSequenceSlot {
  date: IsoDate;
  sequence: number;
  model: string;
  serial: string;
  qty: 1;
}

export interface DemoUser {
  email: string;
  name: string;
  role: DemoRole;
  supplierCode: string | null;
}

/** The whole invented demo data set, plain data ready to persist. */
export interface DemoScenario {
  calendar: PlantCalendar;
  /** The calendar's holidays with their names. */
  shutdowns: { date: IsoDate; name: string }[];
  suppliers: DemoSupplier[];
  parts: DemoPart[];
  bom: DemoBomLine[];
  sequence: DemoSequenceSlot[];
  /** Units of the working days before the sequence starts, already built. */
  history: DemoSequenceSlot[];
  users: DemoUser[];
}
