import { addCalendarDays, addWorkingDays, isWorkingDay } from '../../shared/domain/calendar';
import type {
  PlanInput,
  PlanningBomLine,
  PlanningPart,
  PlantCalendar,
  ScheduledReceipt,
  SequenceSlot,
} from '../../shared/domain/types';

/*
 * A deterministic synthetic plant for timing the planning engine: 2,000 parts, 12 models whose
 * structures have 150 lines on three levels below the model, 60 working days of 40 units a day.
 * Every number comes from a seeded generator, so two runs plan exactly the same input.
 */

export interface PlanFixtureOptions {
  seed?: number;
  /**
   * Size of the plant against the benchmark plant (1): parts × scale; models, BOM lines per model
   * and units a day × √scale. Scale 4 and 16 are 8,000 and 32,000 parts, 24 and 48 models, 300 and
   * 600-line structures, 80 and 160 units a day.
   */
  scale?: number;
  partCount?: number;
  models?: number;
  workingDays?: number;
  unitsPerDay?: number;
  /** First day of the sequence; the default keeps every run on the same dates. */
  from?: string;
}

/** mulberry32: a small, well-mixed 32-bit generator; returns floats in [0, 1). */
export function seededRandom(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const SUBASSEMBLIES_PER_MODEL = 8;
const DIRECT_BOUGHT_LINES = 22;
const BOUGHT_LINES_PER_SUBASSEMBLY = 9;
const BOUGHT_LINES_PER_SUBSUBASSEMBLY = 5;
const SUPPLIERS = 12;
const COMMON_PARTS = 200;
const PACK_SIZES = [1, 1, 5, 10, 10, 25, 50, 100, 200];

const pad = (value: number, width: number): string => String(value).padStart(width, '0');

/** Generates the benchmark plant: parts, BOM, sequence, open receipts, calendar and horizon. */
export function generatePlanFixture(options: PlanFixtureOptions = {}): PlanInput {
  const random = seededRandom(options.seed ?? 20260302);
  const scale = options.scale ?? 1;
  const root = Math.sqrt(scale);
  const partCount = options.partCount ?? 2000 * scale;
  const modelCount = options.models ?? Math.round(12 * root);
  const workingDays = options.workingDays ?? 60;
  const unitsPerDay = options.unitsPerDay ?? Math.round(40 * root);
  const subassembliesPerModel = Math.round(SUBASSEMBLIES_PER_MODEL * root);
  const directBoughtLines = Math.round(DIRECT_BOUGHT_LINES * root);
  const pick = <T>(list: readonly T[]): T => list[Math.floor(random() * list.length)];
  const between = (low: number, high: number): number => low + Math.floor(random() * (high - low + 1));

  const calendar: PlantCalendar = {
    workingWeekdays: [1, 2, 3, 4, 5],
    holidays: ['2026-04-03', '2026-04-06', '2026-05-01', '2026-05-14', '2026-05-25'],
  };
  const from = options.from ?? '2026-03-02';
  const to = addWorkingDays(from, workingDays - 1, calendar);

  const parts: PlanningPart[] = [];
  const models: string[] = [];
  for (let m = 1; m <= modelCount; m += 1) {
    const partNumber = `MDL-${pad(m, 2)}`;
    models.push(partNumber);
    parts.push({ partNumber, source: 'end_item', leadTimeDays: 0, packQty: 1, onHand: 0, safetyStock: 0 });
  }
  const makeCount = modelCount * subassembliesPerModel * 2;
  const boughtCount = partCount - modelCount - makeCount;
  const bought: string[] = [];
  for (let b = 1; b <= boughtCount; b += 1) {
    const partNumber = `BUY-${pad(b, 4)}`;
    bought.push(partNumber);
    parts.push({
      partNumber,
      source: 'buy',
      supplierCode: `SUP-${pad(between(1, SUPPLIERS), 2)}`,
      leadTimeDays: between(1, 10),
      packQty: pick(PACK_SIZES),
      onHand: between(0, 400),
      safetyStock: random() < 0.3 ? between(10, 60) : 0,
    });
  }

  // Common parts (fasteners, labels) appear in many models; the rest are mostly model-specific.
  const boughtComponent = (): string =>
    random() < 0.35
      ? bought[Math.floor(random() * COMMON_PARTS)]
      : bought[COMMON_PARTS + Math.floor(random() * (boughtCount - COMMON_PARTS))];
  const quantityPer = (): number => (random() < 0.15 ? pick([0.25, 0.5, 1.5, 2.75]) : between(1, 4));

  const bom: PlanningBomLine[] = [];
  const addLine = (parent: string, component: string): void => {
    const line: PlanningBomLine = {
      parent,
      component,
      qtyPer: quantityPer(),
      scrapPct: random() < 0.2 ? pick([1, 2, 5]) : 0,
    };
    // About one line in thirty carries an engineering change inside the horizon.
    if (random() < 0.033) {
      const changeDate = addCalendarDays(from, between(5, 80));
      bom.push({ ...line, effectiveTo: addCalendarDays(changeDate, -1) });
      bom.push({ ...line, component: boughtComponent(), effectiveFrom: changeDate });
      return;
    }
    bom.push(line);
  };

  for (let m = 0; m < modelCount; m += 1) {
    const model = models[m];
    for (let s = 1; s <= subassembliesPerModel; s += 1) {
      const subassembly = `SUB-${pad(m + 1, 2)}-${pad(s, 2)}`;
      const subSubassembly = `SSA-${pad(m + 1, 2)}-${pad(s, 2)}`;
      parts.push({
        partNumber: subassembly,
        source: 'make',
        leadTimeDays: between(1, 3),
        packQty: 1,
        onHand: between(0, 20),
        safetyStock: 0,
      });
      parts.push({
        partNumber: subSubassembly,
        source: 'make',
        leadTimeDays: between(1, 2),
        packQty: 1,
        onHand: between(0, 20),
        safetyStock: 0,
      });
      bom.push({ parent: model, component: subassembly, qtyPer: 1, scrapPct: 0 });
      bom.push({ parent: subassembly, component: subSubassembly, qtyPer: 1, scrapPct: 0 });
      for (let k = 0; k < BOUGHT_LINES_PER_SUBASSEMBLY; k += 1) addLine(subassembly, boughtComponent());
      for (let k = 0; k < BOUGHT_LINES_PER_SUBSUBASSEMBLY; k += 1) addLine(subSubassembly, boughtComponent());
    }
    for (let k = 0; k < directBoughtLines; k += 1) addLine(model, boughtComponent());
  }

  // A level mix with some noise, from the first day of the horizon (units before it are built).
  const sequence: SequenceSlot[] = [];
  let serial = 1;
  let day = from;
  while (day <= to) {
    if (isWorkingDay(day, calendar)) {
      for (let position = 1; position <= unitsPerDay; position += 1) {
        const model = random() < 0.8 ? models[position % modelCount] : pick(models);
        sequence.push({ date: day, sequence: position, model, serial: `SN${pad(serial, 7)}`, qty: 1 });
        serial += 1;
      }
    }
    day = addCalendarDays(day, 1);
  }

  const scheduledReceipts: ScheduledReceipt[] = [];
  for (let r = 0; r < 400; r += 1) {
    scheduledReceipts.push({
      partNumber: pick(bought),
      date: addCalendarDays(from, between(-3, 20)),
      qty: between(1, 20) * 10,
    });
  }

  return { parts, bom, sequence, scheduledReceipts, calendar, from, to };
}
