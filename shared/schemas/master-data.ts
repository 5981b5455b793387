import { z } from 'zod';
import { cycleContradiction, type SupplierTerms } from '../domain/supplier-timing';
import { plainText } from './text';
import { versionField } from './version';

export const isoDateSchema = z.iso.date({ message: 'a date as YYYY-MM-DD' });
const code = z
  .string()
  .trim()
  .min(1)
  .max(20)
  .regex(/^[A-Za-z0-9._-]+$/, 'letters, digits, . _ - only');
export const partNumberSchema = z
  .string()
  .trim()
  .min(1)
  .max(40)
  .regex(/^[A-Za-z0-9._/-]+$/, 'letters, digits, . _ / - only');

export const PART_SOURCES = ['buy', 'make', 'end_item'] as const;
export const REPLENISHMENT_METHODS = ['kanban', 'scheduled'] as const;
/** UN/ECE Recommendation 20 codes the plant uses; extend when a new unit shows up. */
export const UNIT_CODES = ['H87', 'KGM', 'MTR', 'LTR', 'MTK', 'SET', 'PR'] as const;

/** Short words for the unit codes, as printed on screens and card labels. */
export const UNIT_WORDS: Record<string, string> = {
  H87: 'pcs',
  KGM: 'kg',
  MTR: 'm',
  LTR: 'L',
  MTK: 'm²',
  SET: 'sets',
  PR: 'pairs',
};

/** Words for one of a countable unit; measures (kg, m, L, m²) read the same for one. */
const ONE_UNIT_WORDS: Record<string, string> = { H87: 'pc', SET: 'set', PR: 'pair' };

/** The unit as people say it (`pcs`, `kg`, `sets`; `pc` for one piece); an unknown code as it is. */
export function unitWord(uom: string, qty?: number): string {
  if (qty === 1 && ONE_UNIT_WORDS[uom]) return ONE_UNIT_WORDS[uom];
  return UNIT_WORDS[uom] ?? uom;
}

const weekday = z.number().int().min(1).max(7);

/**
 * A supplier and its terms (see shared/domain/supplier-timing.ts for how they fit together): lead
 * time from release to arrival at our dock and transit from shipping to arrival, both in working
 * days; the weekdays it delivers; the delivery cycle days–deliveries–delay (delay counted in
 * deliveries), all three or none (none: derived); the over-delivery it may make without asking;
 * the on-time window around the requested arrival date.
 */
export const supplierSchema = z
  .object({
    code,
    name: plainText(120),
    email: z.email('an e-mail address like orders@example.com').max(254),
    leadTimeDays: z.number().int().min(0).max(365),
    transitDays: z.number().int().min(0).max(60),
    deliveryWeekdays: z
      .array(weekday)
      .max(7)
      .refine((days) => new Set(days).size === days.length, 'each weekday once'),
    cycleDays: z.number().int().min(1).max(60).nullable(),
    deliveriesPerCycle: z.number().int().min(1).max(60).nullable(),
    deliveryDelay: z.number().int().min(0).max(60).nullable(),
    overTolerancePct: z.number().min(0).max(100),
    earlyToleranceDays: z.number().int().min(0).max(30),
    lateToleranceDays: z.number().int().min(0).max(30),
  })
  .superRefine((supplier, context) => {
    const cycle = [supplier.cycleDays, supplier.deliveriesPerCycle, supplier.deliveryDelay];
    const given = cycle.filter((value) => value !== null).length;
    if (given !== 0 && given !== 3) {
      context.addIssue({
        code: 'custom',
        path: ['cycleDays'],
        message: 'give the delivery cycle whole (days, deliveries and delay) or leave all three empty',
      });
      return;
    }
    if (supplier.transitDays > supplier.leadTimeDays) {
      context.addIssue({
        code: 'custom',
        path: ['transitDays'],
        message: `transit (${supplier.transitDays} working days) cannot be longer than the lead time (${supplier.leadTimeDays})`,
      });
    }
    const contradiction = cycleContradiction(supplierTerms(supplier));
    if (contradiction) context.addIssue({ code: 'custom', path: ['deliveryDelay'], message: contradiction });
  });
export type Supplier = z.infer<typeof supplierSchema>;

/** Receiving tolerances a supplier gets unless it is given its own: nothing over, one working day early, none late. */
export const SUPPLIER_DEFAULT_TOLERANCES = {
  overTolerancePct: 0,
  earlyToleranceDays: 1,
  lateToleranceDays: 0,
} as const;

/** Terms a supplier gets when a file or form leaves them out: no transit, every working day, a derived cycle. */
export const SUPPLIER_DEFAULT_TERMS = {
  transitDays: 0,
  deliveryWeekdays: [] as number[],
  cycleDays: null,
  deliveriesPerCycle: null,
  deliveryDelay: null,
  ...SUPPLIER_DEFAULT_TOLERANCES,
} satisfies Partial<Supplier>;

/** The timing terms of a supplier record, as the shared timing rules take them. */
export function supplierTerms(
  supplier: Pick<
    Supplier,
    'leadTimeDays' | 'transitDays' | 'deliveryWeekdays' | 'cycleDays' | 'deliveriesPerCycle' | 'deliveryDelay'
  >,
): SupplierTerms {
  const { cycleDays, deliveriesPerCycle, deliveryDelay } = supplier;
  return {
    leadTimeDays: supplier.leadTimeDays,
    transitDays: supplier.transitDays,
    deliveryWeekdays: supplier.deliveryWeekdays,
    cycle:
      cycleDays !== null && deliveriesPerCycle !== null && deliveryDelay !== null
        ? { days: cycleDays, deliveries: deliveriesPerCycle, delay: deliveryDelay }
        : null,
  };
}

export const partSchema = z
  .object({
    partNumber: partNumberSchema,
    description: z.string().trim().min(1).max(200),
    uom: z.enum(UNIT_CODES),
    source: z.enum(PART_SOURCES),
    supplierCode: code.nullable(),
    leadTimeDays: z.number().int().min(0).max(365),
    packQty: z.number().positive(),
    onHand: z.number().min(0),
    replenishment: z.enum(REPLENISHMENT_METHODS).nullable(),
    safetyStock: z.number().min(0),
    pointOfUse: z.string().trim().max(40).nullable(),
    hazardous: z.boolean(),
    // Safety data: optional, so files and forms written before it existed still load.
    unNumber: z
      .string()
      .trim()
      .regex(/^(UN)?\d{4}$/i, 'four digits, e.g. 2794')
      .transform((value) => value.replace(/^UN/i, ''))
      .nullable()
      .optional(),
    hazardClass: z
      .string()
      .trim()
      .regex(/^[1-9](\.[1-6])?[A-Z]?$/, 'a class or division such as 8 or 2.1')
      .nullable()
      .optional(),
    sdsUrl: z
      .url({ protocol: /^https?$/, message: 'a web link (http or https)' })
      .max(500)
      .nullable()
      .optional(),
    unitWeightKg: z.number().positive().max(100_000).nullable().optional(),
    heavyLift: z.boolean().optional(),
  })
  .refine((part) => part.source !== 'buy' || !!part.supplierCode, {
    path: ['supplierCode'],
    message: 'a bought part needs a supplier',
  });
export type Part = z.infer<typeof partSchema>;

export const bomLineSchema = z
  .object({
    parent: partNumberSchema,
    component: partNumberSchema,
    qtyPer: z.number().positive(),
    scrapPct: z.number().min(0).max(100),
    effectiveFrom: isoDateSchema.nullable(),
    effectiveTo: isoDateSchema.nullable(),
  })
  .refine((line) => line.parent !== line.component, { path: ['component'], message: 'a part cannot contain itself' })
  .refine((line) => !line.effectiveFrom || !line.effectiveTo || line.effectiveFrom <= line.effectiveTo, {
    path: ['effectiveTo'],
    message: 'effective_to is before effective_from',
  });
export type BomLine = z.infer<typeof bomLineSchema>;

export const sequenceEntrySchema = z.object({
  date: isoDateSchema,
  sequence: z.number().int().min(1).max(9999),
  model: partNumberSchema,
  serial: z.string().trim().min(1).max(40),
  qty: z.number().int().min(1).max(1000),
});
export type SequenceEntry = z.infer<typeof sequenceEntrySchema>;

export const calendarSchema = z.object({
  workingWeekdays: z
    .array(z.number().int().min(1).max(7))
    .min(1, 'at least one working weekday')
    .refine((days) => new Set(days).size === days.length, 'each weekday once'),
  holidays: z.array(isoDateSchema).refine((days) => new Set(days).size === days.length, 'each holiday once'),
});
export type Calendar = z.infer<typeof calendarSchema>;

/** Longest holiday name ("Plant shutdown, year end"). */
export const HOLIDAY_NAME_MAX = 80;

/** PUT /api/calendar: the calendar, with names for holidays that have one (a holiday left out keeps its name). */
export const calendarUpdateSchema = calendarSchema
  .extend({
    holidayNames: z
      .record(isoDateSchema, z.string().trim().max(HOLIDAY_NAME_MAX, `at most ${HOLIDAY_NAME_MAX} characters`))
      .optional(),
  })
  .superRefine((calendar, context) => {
    for (const date of Object.keys(calendar.holidayNames ?? {})) {
      if (!calendar.holidays.includes(date)) {
        context.addIssue({
          code: 'custom',
          path: ['holidayNames', date],
          message: 'names a day that is not a holiday',
        });
      }
    }
  });
export type CalendarUpdate = z.infer<typeof calendarUpdateSchema>;
export const versionedCalendarSchema = calendarSchema.extend(versionField).extend({
  /** Names of the holidays that have one (the demo's plant shutdown days), by date; kept when a holiday stays. */
  holidayNames: z.record(isoDateSchema, z.string()).optional(),
});
export type VersionedCalendar = z.infer<typeof versionedCalendarSchema>;
