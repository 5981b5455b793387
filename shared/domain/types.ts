/** ISO calendar date `YYYY-MM-DD`; every domain date is a plant-local day, never a timestamp. */
export type IsoDate = string;

/** Plant calendar: ISO weekday numbers (1 = Monday … 7 = Sunday) that are worked, plus holidays. */
export interface PlantCalendar {
  workingWeekdays: number[];
  holidays: IsoDate[];
}

export type PartSource = 'buy' | 'make' | 'end_item';
export type Replenishment = 'kanban' | 'scheduled';

/** What the engine needs to know about a part; persistence carries more. */
export interface PlanningPart {
  partNumber: string;
  source: PartSource;
  supplierCode?: string | null;
  /** Working days from release to receipt. */
  leadTimeDays: number;
  /** Planned receipts are rounded up to whole packs of this size. */
  packQty: number;
  onHand: number;
  safetyStock: number;
}

/** One BOM line; the effectivity window is inclusive at both ends, open when null. */
export interface PlanningBomLine {
  parent: string;
  component: string;
  qtyPer: number;
  /** Scrap allowance in percent: ordering plans qtyPer × (1 + scrapPct / 100); a build consumes qtyPer (scrap is posted when it happens). */
  scrapPct: number;
  effectiveFrom?: IsoDate | null;
  effectiveTo?: IsoDate | null;
}

/** One slot of the build sequence: a unit of `model` built on `date` at position `sequence`. */
export interface SequenceSlot {
  date: IsoDate;
  sequence: number;
  model: string;
  serial: string;
  qty: number;
}

/** An open release line or other firm order expected on `date`. */
export interface ScheduledReceipt {
  partNumber: string;
  date: IsoDate;
  qty: number;
}

export interface PlanInput {
  parts: PlanningPart[];
  bom: PlanningBomLine[];
  sequence: SequenceSlot[];
  scheduledReceipts: ScheduledReceipt[];
  calendar: PlantCalendar;
  /** First bucket; on-hand counts at its start, and unbuilt sequence slots dated before it are due in it. */
  from: IsoDate;
  /** Last bucket (inclusive). */
  to: IsoDate;
}

/** One working-day bucket of the gross-to-net record (field names as published by GET /api/plan). */
export interface PlanBucket {
  date: IsoDate;
  gross: number;
  scheduledReceipts: number;
  projectedAvailable: number;
  net: number;
  plannedReceipt: number;
  plannedRelease: number;
}

export interface PastDueRelease {
  date: IsoDate;
  qty: number;
}

export interface PartPlan {
  partNumber: string;
  lowLevelCode: number;
  buckets: PlanBucket[];
  pastDue: PastDueRelease[];
}

export interface PlanResult {
  /** Working days from `from` to `to`, the bucket dates shared by every part. */
  days: IsoDate[];
  parts: Map<string, PartPlan>;
}
