import { addCalendarDays, addWorkingDays, nextWorkingDay } from '../shared/domain/calendar';
import type { IsoDate, PlantCalendar } from '../shared/domain/types';
import { demoShutdowns, type PlantShutdown } from './scenario-calendar';
import { dailyGrossDemand } from './scenario-demand';
import { BOUGHT, ENGINEERING_CHANGE, MADE, MODELS, FS20W, FS26W, FS32R, FS40R } from './scenario-parts';
import { buildSequence, type ModelQuota } from './scenario-sequence';
import { SHORT_COVER_DAYS, coveringStock, madeStock, openingCoverDays, shortStock } from './scenario-stock';
import { demoSuppliers, demoUsers } from './scenario-suppliers';
import type { DemoBomLine, DemoPart, DemoScenario } from './scenario-types';

export type * from './scenario-types';

/** Working days of build sequence the demo holds. */
export const SEQUENCE_DAYS = 30;
/** Working days before the sequence whose units are already built, so the stock ledger has history. */
export const HISTORY_DAYS = 15;

const WORKING_WEEKDAYS = [1, 2, 3, 4, 5];

/*
 * Daily model mixes of roughly 24 units, cycled over the working days. Six days average exactly
 * 8 / 8 / 5 / 3, so weekly demand is steady while single days still move a little.
 */
const DAILY_MIXES: number[][] = [
  [8, 8, 5, 3],
  [9, 7, 5, 3],
  [8, 8, 4, 4],
  [8, 9, 5, 3],
  [7, 8, 5, 3],
  [8, 8, 6, 2],
];

function quotasForDay(dayIndex: number): ModelQuota[] {
  const mix = DAILY_MIXES[dayIndex % DAILY_MIXES.length];
  return [FS20W, FS26W, FS32R, FS40R].map((model, index) => ({ model, qty: mix[index] }));
}

/** The plant calendar with its shutdown days, and the working days of the sequence from the first build day. */
function demoCalendar(seedDay: IsoDate): { calendar: PlantCalendar; shutdowns: PlantShutdown[]; days: IsoDate[] } {
  const shutdowns = demoShutdowns(seedDay);
  const calendar: PlantCalendar = {
    workingWeekdays: [...WORKING_WEEKDAYS],
    holidays: shutdowns.map((shutdown) => shutdown.date),
  };
  const start = nextWorkingDay(seedDay, calendar);
  const days = Array.from({ length: SEQUENCE_DAYS }, (_, index) => addWorkingDays(start, index, calendar));
  return { calendar, shutdowns, days };
}

/** BOM lines read off the catalogue, with the engineering change's effectivity on its two lines. */
function demoBom(changeDate: IsoDate): DemoBomLine[] {
  const entries = [
    ...MADE.map((entry) => ({ ...entry, scrapPct: 0 })),
    ...BOUGHT.map((entry) => ({ ...entry, scrapPct: entry.scrapPct ?? 0 })),
  ];
  const { parent: changedParent, oldComponent, newComponent } = ENGINEERING_CHANGE;
  return entries.flatMap((entry) =>
    Object.entries(entry.usedOn).map(([parent, qtyPer]): DemoBomLine => {
      const isChanged = parent === changedParent;
      return {
        parent,
        component: entry.partNumber,
        qtyPer,
        scrapPct: entry.scrapPct,
        effectiveFrom: isChanged && entry.partNumber === newComponent ? changeDate : null,
        effectiveTo: isChanged && entry.partNumber === oldComponent ? addCalendarDays(changeDate, -1) : null,
      };
    }),
  );
}

/** Part master with opening stock sized from the demo's own demand. */
function demoParts(demand: Map<string, number[]>, supplierLeadTimes: Map<string, number>): DemoPart[] {
  const perDay = (partNumber: string): number[] => demand.get(partNumber) ?? [];
  const endItems = MODELS.map((model): DemoPart => ({
    partNumber: model.partNumber,
    description: model.description,
    uom: 'H87',
    source: 'end_item',
    supplierCode: null,
    leadTimeDays: 0,
    packQty: 1,
    onHand: 0,
    replenishment: null,
    safetyStock: 0,
    pointOfUse: null,
    hazardous: false,
  }));
  const made = MADE.map((entry): DemoPart => ({
    partNumber: entry.partNumber,
    description: entry.description,
    uom: 'H87',
    source: 'make',
    supplierCode: null,
    leadTimeDays: entry.leadTimeDays,
    packQty: entry.supermarket?.packQty ?? 1,
    onHand: madeStock(perDay(entry.partNumber), entry.leadTimeDays),
    replenishment: entry.supermarket ? 'kanban' : null,
    safetyStock: 0,
    pointOfUse: entry.pointOfUse,
    hazardous: false,
  }));
  const bought = BOUGHT.map((entry): DemoPart => {
    const shortDays = SHORT_COVER_DAYS[entry.partNumber];
    const onHand =
      shortDays === undefined
        ? coveringStock(
            perDay(entry.partNumber),
            openingCoverDays(entry.partNumber, entry.replenishment ?? null),
            entry.packQty,
          )
        : shortStock(perDay(entry.partNumber), shortDays);
    return {
      partNumber: entry.partNumber,
      description: entry.description,
      uom: entry.uom ?? 'H87',
      source: 'buy',
      supplierCode: entry.supplierCode,
      leadTimeDays: supplierLeadTimes.get(entry.supplierCode) ?? 0,
      packQty: entry.packQty,
      onHand,
      replenishment: entry.replenishment,
      safetyStock: entry.safetyStock ?? 0,
      pointOfUse: entry.pointOfUse,
      hazardous: entry.hazardous ?? false,
      ...entry.safety,
    };
  });
  return [...endItems, ...made, ...bought];
}

/**
 * The invented floor-scrubber plant: calendar, suppliers, parts, BOM, a 30-working-day level
 * sequence from `seedDay` (or the next working day) and demo sign-ins. Pure and deterministic:
 * the same `seedDay` always yields the same data.
 */
export function buildDemoScenario(seedDay: IsoDate): DemoScenario {
  const { calendar, shutdowns, days } = demoCalendar(seedDay);
  const bom = demoBom(days[ENGINEERING_CHANGE.workingDaysFromStart]);
  const sequence = buildSequence(days, quotasForDay);
  // The history continues the same level mix backwards, so past days look like the days ahead.
  const historyDays = Array.from({ length: HISTORY_DAYS }, (_, index) =>
    addWorkingDays(days[0], index - HISTORY_DAYS, calendar),
  );
  const history = buildSequence(historyDays, (dayIndex) => quotasForDay(dayIndex + SEQUENCE_DAYS));
  const suppliers = demoSuppliers();
  const supplierLeadTimes = new Map(suppliers.map((supplier) => [supplier.code, supplier.leadTimeDays]));
  const parts = demoParts(dailyGrossDemand(bom, sequence, days), supplierLeadTimes);
  return { calendar, shutdowns, suppliers, parts, bom, sequence, history, users: demoUsers() };
}
