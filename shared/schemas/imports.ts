import { z } from 'zod';
import { issueWords } from './issue-words';
import {
  bomLineSchema,
  isoDateSchema,
  partSchema,
  sequenceEntrySchema,
  SUPPLIER_DEFAULT_TERMS,
  supplierSchema,
} from './master-data';

export const IMPORT_KINDS = ['suppliers', 'parts', 'bom', 'schedule', 'on-hand', 'open-orders'] as const;
export type ImportKind = (typeof IMPORT_KINDS)[number];
export const importKindSchema = z.enum(IMPORT_KINDS);

/** Largest CSV file an import accepts. */
export const IMPORT_MAX_BYTES = 5 * 1024 * 1024;

/**
 * Header of each CSV kind: `columns` in published order (parts adds the optional `hazardous` and safety data),
 * `required` the columns that must be in the header and filled on every row. Other columns may be
 * left out of the header: existing records then keep their value and new ones take the default.
 */
export const IMPORT_LAYOUTS = {
  suppliers: {
    columns: [
      'code',
      'name',
      'email',
      'lead_time_days',
      'cycle_days',
      'deliveries_per_cycle',
      'delivery_delay',
      'transit_days',
      'delivery_weekdays',
      'over_tolerance_pct',
      'early_tolerance_days',
      'late_tolerance_days',
    ],
    required: ['code', 'name', 'email', 'lead_time_days'],
  },
  parts: {
    columns: [
      'part_number',
      'description',
      'uom',
      'source',
      'supplier_code',
      'lead_time_days',
      'pack_qty',
      'on_hand',
      'replenishment',
      'safety_stock',
      'point_of_use',
      'hazardous',
      'un_number',
      'hazard_class',
      'sds_url',
      'unit_weight_kg',
      'heavy_lift',
    ],
    required: ['part_number', 'description', 'source'],
  },
  bom: {
    columns: ['parent', 'component', 'qty_per', 'scrap_pct', 'effective_from', 'effective_to'],
    required: ['parent', 'component', 'qty_per'],
  },
  schedule: {
    columns: ['date', 'sequence', 'model', 'serial', 'qty'],
    required: ['date', 'sequence', 'model', 'serial'],
  },
  'on-hand': {
    columns: ['part_number', 'on_hand'],
    required: ['part_number', 'on_hand'],
  },
  'open-orders': {
    columns: ['supplier_code', 'part_number', 'qty', 'due_date', 'reference'],
    required: ['supplier_code', 'part_number', 'qty', 'due_date', 'reference'],
  },
} as const satisfies Record<ImportKind, { columns: readonly string[]; required: readonly string[] }>;

export type ImportLayout = { columns: readonly string[]; required: readonly string[] };

/**
 * What an empty optional cell means. Two cells depend on the row rather than a constant: a bought
 * part's empty `lead_time_days` takes its supplier's lead time (made parts and end items 0), and an
 * empty `on_hand` keeps an existing part's count (0 for a new part) so a master-data refresh
 * never wipes stock. Empty effectivity dates leave that end of the window open.
 */
export const IMPORT_DEFAULTS = {
  // An empty delivery cycle is derived from the delivery weekdays and the lead time.
  suppliers: {
    cycle_days: null,
    deliveries_per_cycle: null,
    delivery_delay: null,
    transit_days: SUPPLIER_DEFAULT_TERMS.transitDays,
    delivery_weekdays: SUPPLIER_DEFAULT_TERMS.deliveryWeekdays,
    over_tolerance_pct: SUPPLIER_DEFAULT_TERMS.overTolerancePct,
    early_tolerance_days: SUPPLIER_DEFAULT_TERMS.earlyToleranceDays,
    late_tolerance_days: SUPPLIER_DEFAULT_TERMS.lateToleranceDays,
  },
  parts: {
    uom: 'H87',
    supplier_code: null,
    pack_qty: 1,
    replenishment: null,
    safety_stock: 0,
    point_of_use: null,
    hazardous: false,
    un_number: null,
    hazard_class: null,
    sds_url: null,
    unit_weight_kg: null,
    heavy_lift: false,
  },
  bom: { scrap_pct: 0, effective_from: null, effective_to: null },
  schedule: { qty: 1 },
  'on-hand': {},
  'open-orders': {},
} as const;

/** One problem of an import: `row` is the file's line number (header = 1), `column` its CSV header. */
export const importRowErrorSchema = z.object({ row: z.number().int(), column: z.string(), message: z.string() });
export type ImportRowError = z.infer<typeof importRowErrorSchema>;

export const importResultSchema = z.object({ imported: z.number().int().min(0) });
export type ImportResult = z.infer<typeof importResultSchema>;

type CellOutcome<T> = { ok: true; value: T } | { ok: false; message: string };
type CellParser<T> = (raw: string) => CellOutcome<T>;

const NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)$/;
const TRUE_WORDS = ['true', 'yes', '1'];
const FALSE_WORDS = ['false', 'no', '0'];

/** Turns a zod issue about one cell (or one domain field) into a sentence a buyer can act on. */
export function describeCellIssue(issue: z.core.$ZodIssue, raw: unknown): string {
  const shown = typeof raw === 'string' ? `'${raw}'` : String(raw);
  switch (issue.code) {
    case 'invalid_type':
      return issue.expected === 'int' ? `${shown} is not a whole number` : `${shown} is not valid here`;
    case 'too_small':
    case 'too_big':
      return issueWords(issue);
    case 'invalid_value':
      return `${shown} is not one of ${issue.values.map(String).join(', ')}`;
    case 'invalid_format':
      if (issue.format === 'email') return `${shown} is not an e-mail address`;
      if (issue.format === 'date') return `${shown} is not a real date (YYYY-MM-DD)`;
      return `${shown}: ${issue.message}`;
    default:
      return issue.message;
  }
}

function checkWith<T>(field: z.ZodType<T>, value: unknown, raw: string): CellOutcome<T> {
  const result = field.safeParse(value);
  if (result.success) return { ok: true, value: result.data };
  return { ok: false, message: describeCellIssue(result.error.issues[0], raw) };
}

// Nullable domain fields are given a non-empty string here, so their output is never null.
const text =
  (field: z.ZodType<string | null>): CellParser<string> =>
  (raw) =>
    checkWith(field, raw, raw) as CellOutcome<string>;

const choice =
  <T extends string>(field: z.ZodType<T | null>): CellParser<T> =>
  (raw) =>
    checkWith(field, raw, raw) as CellOutcome<T>;

const numberIn =
  (field: z.ZodType<number>): CellParser<number> =>
  (raw) =>
    NUMBER.test(raw) ? checkWith(field, Number(raw), raw) : { ok: false, message: `'${raw}' is not a number` };

const isoDate: CellParser<string> = (raw) => checkWith(isoDateSchema, raw, raw);

const WEEKDAY_NAMES = ['mon', 'tue', 'wed', 'thu', 'fri', 'sat', 'sun'];

/** Delivery weekdays as ISO numbers (1 = Monday) or three-letter names, separated by semicolons: `1;4` or `Mon;Thu`. */
const weekdays: CellParser<number[]> = (raw) => {
  const days: number[] = [];
  for (const token of raw.split(/[;\s]+/).filter(Boolean)) {
    const day = /^[1-7]$/.test(token) ? Number(token) : WEEKDAY_NAMES.indexOf(token.slice(0, 3).toLowerCase()) + 1;
    if (day === 0) return { ok: false, message: `'${token}' is not a weekday (1–7 from Monday, or Mon…Sun)` };
    if (days.includes(day)) return { ok: false, message: `'${token}' is named twice` };
    days.push(day);
  }
  return { ok: true, value: days.sort((a, b) => a - b) };
};

const flag: CellParser<boolean> = (raw) => {
  const word = raw.toLowerCase();
  if (TRUE_WORDS.includes(word)) return { ok: true, value: true };
  if (FALSE_WORDS.includes(word)) return { ok: true, value: false };
  return { ok: false, message: `'${raw}' is not true/false, yes/no or 1/0` };
};

/*
 * A cell arrives as the trimmed string, or undefined when its column is not in the header.
 * Required cells must be filled; optional ones come out undefined when empty, and the importer
 * decides between the default and the existing value.
 */
function requiredCell<T>(parse: CellParser<T>) {
  return z
    .string()
    .optional()
    .transform((raw, context): T => {
      if (raw === undefined || raw === '') {
        context.addIssue({ code: 'custom', message: 'is required' });
        return z.NEVER;
      }
      const outcome = parse(raw);
      if (!outcome.ok) {
        context.addIssue({ code: 'custom', message: outcome.message });
        return z.NEVER;
      }
      return outcome.value;
    });
}

function optionalCell<T>(parse: CellParser<T>) {
  return z
    .string()
    .optional()
    .transform((raw, context): T | undefined => {
      if (raw === undefined || raw === '') return undefined;
      const outcome = parse(raw);
      if (!outcome.ok) {
        context.addIssue({ code: 'custom', message: outcome.message });
        return z.NEVER;
      }
      return outcome.value;
    });
}

const supplier = supplierSchema.shape;
const part = partSchema.shape;
const bomLine = bomLineSchema.shape;
const sequenceEntry = sequenceEntrySchema.shape;

export const supplierRowSchema = z.object({
  code: requiredCell(text(supplier.code)),
  name: requiredCell(text(supplier.name)),
  email: requiredCell(text(supplier.email)),
  lead_time_days: requiredCell(numberIn(supplier.leadTimeDays)),
  cycle_days: optionalCell(numberIn(supplier.cycleDays.unwrap())),
  deliveries_per_cycle: optionalCell(numberIn(supplier.deliveriesPerCycle.unwrap())),
  delivery_delay: optionalCell(numberIn(supplier.deliveryDelay.unwrap())),
  transit_days: optionalCell(numberIn(supplier.transitDays)),
  delivery_weekdays: optionalCell(weekdays),
  over_tolerance_pct: optionalCell(numberIn(supplier.overTolerancePct)),
  early_tolerance_days: optionalCell(numberIn(supplier.earlyToleranceDays)),
  late_tolerance_days: optionalCell(numberIn(supplier.lateToleranceDays)),
});

export const partRowSchema = z.object({
  part_number: requiredCell(text(part.partNumber)),
  description: requiredCell(text(part.description)),
  uom: optionalCell(choice(part.uom)),
  source: requiredCell(choice(part.source)),
  supplier_code: optionalCell(text(supplier.code)),
  lead_time_days: optionalCell(numberIn(part.leadTimeDays)),
  pack_qty: optionalCell(numberIn(part.packQty)),
  on_hand: optionalCell(numberIn(part.onHand)),
  replenishment: optionalCell(choice(part.replenishment)),
  safety_stock: optionalCell(numberIn(part.safetyStock)),
  point_of_use: optionalCell(text(part.pointOfUse)),
  hazardous: optionalCell(flag),
  un_number: optionalCell(text(part.unNumber.unwrap())),
  hazard_class: optionalCell(text(part.hazardClass.unwrap())),
  sds_url: optionalCell(text(part.sdsUrl.unwrap())),
  unit_weight_kg: optionalCell(numberIn(part.unitWeightKg.unwrap().unwrap())),
  heavy_lift: optionalCell(flag),
});

export const bomRowSchema = z.object({
  parent: requiredCell(text(bomLine.parent)),
  component: requiredCell(text(bomLine.component)),
  qty_per: requiredCell(numberIn(bomLine.qtyPer)),
  scrap_pct: optionalCell(numberIn(bomLine.scrapPct)),
  effective_from: optionalCell(isoDate),
  effective_to: optionalCell(isoDate),
});

export const scheduleRowSchema = z.object({
  date: requiredCell(isoDate),
  sequence: requiredCell(numberIn(sequenceEntry.sequence)),
  model: requiredCell(text(sequenceEntry.model)),
  serial: requiredCell(text(sequenceEntry.serial)),
  qty: optionalCell(numberIn(sequenceEntry.qty)),
});

export const onHandRowSchema = z.object({
  part_number: requiredCell(text(part.partNumber)),
  on_hand: requiredCell(numberIn(part.onHand)),
});

/** An order reference as suppliers write it on paperwork: a purchase order number and the like. */
export const orderReferenceSchema = z
  .string()
  .trim()
  .min(1)
  .max(40)
  .regex(/^[A-Za-z0-9._/-]+$/, 'letters, digits, . _ / - only');

/** Most an open order line may ask for; more is a typo. */
export const MAX_OPEN_ORDER_QTY = 1_000_000_000;

export const openOrderRowSchema = z.object({
  supplier_code: requiredCell(text(supplier.code)),
  part_number: requiredCell(text(part.partNumber)),
  qty: requiredCell(numberIn(z.number().positive().max(MAX_OPEN_ORDER_QTY))),
  due_date: requiredCell(isoDate),
  reference: requiredCell(text(orderReferenceSchema)),
});

/** CSV column of a camelCase domain field (`leadTimeDays` → `lead_time_days`). */
export function columnOfField(field: string): string {
  return field.replace(/[A-Z]/g, (letter) => `_${letter.toLowerCase()}`);
}
