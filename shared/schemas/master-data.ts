import { z } from 'zod';
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

export const supplierSchema = z.object({
  code,
  name: z.string().trim().min(1).max(120),
  email: z.email().max(254),
  leadTimeDays: z.number().int().min(0).max(365),
  cycleDays: z.number().int().min(1).max(60),
  deliveriesPerCycle: z.number().int().min(1).max(60),
  deliveryDelay: z.number().int().min(0).max(60),
});
export type Supplier = z.infer<typeof supplierSchema>;

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
export const versionedCalendarSchema = calendarSchema.extend(versionField);
export type VersionedCalendar = z.infer<typeof versionedCalendarSchema>;
