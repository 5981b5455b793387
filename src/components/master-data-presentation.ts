import type { z } from 'zod';
import { supplierSchema, UNIT_CODES, UNIT_WORDS } from '@shared/schemas/master-data';
import { supplierEditFields } from '@shared/schemas/master-data-edit';

/** What a form field is called and what it means, said where it is shown or edited. */
export interface FieldWords {
  label: string;
  help: string;
}

/** The part master's fields, in form order, each explained in the plant's words. */
export const PART_FIELD_WORDS = {
  description: { label: 'Description', help: 'What the part is, as people on the floor call it.' },
  uom: {
    label: 'Unit of measure',
    help: 'How the part is counted. Quantities in different units are never added together.',
  },
  source: {
    label: 'Source',
    help: 'Bought from a supplier, made in-house from its own BOM, or an end item (a model built on the line).',
  },
  supplierCode: { label: 'Supplier', help: 'Who a bought part is ordered from. A bought part needs one.' },
  leadTimeDays: {
    label: 'Lead time (working days)',
    help: 'Working days from release to receipt, counted on the plant calendar (weekends and holidays skipped).',
  },
  packQty: {
    label: 'Pack quantity',
    help: 'Parts in one container. Orders are rounded up to whole packs; a kanban card holds one pack.',
  },
  replenishment: {
    label: 'Replenishment',
    help: 'Kanban: an empty card asks for a pack. Scheduled: planned releases are ordered. Empty: not ordered.',
  },
  safetyStock: { label: 'Safety stock', help: 'Stock kept back for surprises; planning orders to keep it on hand.' },
  pointOfUse: { label: 'Point of use', help: 'Where on the line the part is used; kit sheets group by it.' },
  hazardous: {
    label: 'Hazardous material',
    help: 'Shows a handling caution at the dock, on kit sheets and in releases, once per part. Follow local codes and the plant’s own safety practice.',
  },
  unNumber: { label: 'UN number', help: 'Four-digit dangerous-goods number from the safety data sheet, e.g. 2800.' },
  hazardClass: { label: 'Hazard class', help: 'Dangerous-goods class or division, e.g. 8 or 2.1.' },
  sdsUrl: { label: 'Safety data sheet', help: 'Link to the supplier’s safety data sheet (http or https).' },
  unitWeightKg: { label: 'Unit weight (kg)', help: 'Weight of one piece, shown with the heavy-lift caution.' },
  heavyLift: {
    label: 'Heavy lift',
    help: 'One piece is too heavy to lift by hand alone (batteries weigh tens of kilograms): the caution asks for the lifting aid the plant prescribes.',
  },
} satisfies Record<string, FieldWords>;

export type PartFormField = keyof typeof PART_FIELD_WORDS;

/** The scrap convention, said once and shown wherever scrap is shown or edited. */
export const SCRAP_WORDS: FieldWords = {
  label: 'Scrap allowance (%)',
  help: 'Added on each BOM line: the plan orders quantity per × (1 + scrap %). It compounds through the levels: an allowance on a subassembly also multiplies what its components order. A build consumes the quantity per; scrap that really happens is posted on its own.',
};

export const EFFECTIVITY_WORDS: FieldWords = {
  label: 'Effective',
  help: 'The days a line is in the BOM, both ends included; an empty end is open.',
};

export const LOW_LEVEL_CODE_WORDS: FieldWords = {
  label: 'Low-level code',
  help: 'The deepest level at which the part appears in any BOM (0 for a model); planning nets each part once, level by level.',
};

export const UNIT_OPTIONS = UNIT_CODES.map((code) => ({ value: code, label: `${UNIT_WORDS[code]} (${code})` }));

/** Words for the supplier fields known today; a field added to the schema later gets plain words from its name. */
const SUPPLIER_FIELD_WORDS: Record<string, FieldWords> = {
  name: { label: 'Name', help: 'The supplier’s company name as printed on releases.' },
  email: { label: 'Order e-mail', help: 'Where releases and forecasts are sent.' },
  leadTimeDays: {
    label: 'Lead time (working days)',
    help: 'Working days from release to arrival at our dock; a bought part with no lead time of its own takes this one.',
  },
  transitDays: {
    label: 'Transit (working days)',
    help: 'Working days from the supplier shipping to the goods arriving: arrival = ship date + transit.',
  },
  deliveryWeekdays: {
    label: 'Delivery weekdays',
    help: 'Days the supplier delivers; none ticked means every working day. Scheduled needs are brought forward to the last delivery day before them.',
  },
  cycleDays: {
    label: 'Cycle days',
    help: 'Delivery cycle written days–deliveries–delay: working days in one cycle. Leave all three empty to derive the cycle from the weekdays and lead time.',
  },
  deliveriesPerCycle: { label: 'Deliveries per cycle', help: 'How many deliveries arrive in one cycle.' },
  deliveryDelay: {
    label: 'Delivery delay (deliveries)',
    help: 'Deliveries between a kanban card leaving and its container arriving; it must cover the lead time. T = days × (1 + delay) ÷ deliveries.',
  },
  overTolerancePct: {
    label: 'Over-delivery tolerance (%)',
    help: 'How much more than a line asks may be delivered without the receiving clerk deciding.',
  },
  earlyToleranceDays: {
    label: 'Early tolerance (working days)',
    help: 'Arriving up to this many working days before the requested date still counts as on time.',
  },
  lateToleranceDays: {
    label: 'Late tolerance (working days)',
    help: 'Arriving up to this many working days after the requested date still counts as on time.',
  },
};

/** How a form edits a field, read from its zod schema so new schema fields need no new form code. */
export type FieldKind =
  | { kind: 'number'; integer: boolean }
  | { kind: 'text' }
  | { kind: 'flag' }
  | { kind: 'choice'; options: string[] }
  | { kind: 'weekdays' };

export interface SchemaField extends FieldWords {
  field: string;
  nullable: boolean;
  input: FieldKind;
  schema: z.ZodType;
}

interface Def {
  type: string;
  innerType?: z.ZodType;
  element?: z.ZodType;
  entries?: Record<string, string>;
}

const defOf = (schema: z.ZodType): Def => (schema as unknown as { def: Def }).def;

function unwrap(schema: z.ZodType): { inner: z.ZodType; nullable: boolean } {
  let inner = schema;
  let nullable = false;
  for (;;) {
    const def = defOf(inner);
    if (def.type === 'nullable' || def.type === 'optional' || def.type === 'default') {
      nullable ||= def.type !== 'default';
      inner = def.innerType as z.ZodType;
    } else {
      return { inner, nullable };
    }
  }
}

function kindOf(schema: z.ZodType): FieldKind {
  const def = defOf(schema);
  if (def.type === 'number') {
    // No limits for the box: a clamp would change what was typed; the field's schema rule says what is wrong.
    return { kind: 'number', integer: (schema as z.ZodNumber).isInt };
  }
  if (def.type === 'boolean') return { kind: 'flag' };
  if (def.type === 'enum') return { kind: 'choice', options: Object.values(def.entries ?? {}) };
  // The one list field: ISO 8601 weekday numbers.
  if (def.type === 'array') return { kind: 'weekdays' };
  return { kind: 'text' };
}

function wordsFromName(field: string): FieldWords {
  const spaced = field.replace(/[A-Z]/g, (letter) => ` ${letter.toLowerCase()}`);
  return { label: spaced.charAt(0).toUpperCase() + spaced.slice(1), help: '' };
}

/** The supplier form's fields, in schema order: one entry per field the supplier schema has. */
export function supplierFormFields(): SchemaField[] {
  const shape = supplierSchema.shape as Record<string, z.ZodType>;
  return supplierEditFields().map((field) => {
    const { inner, nullable } = unwrap(shape[field]);
    return {
      field,
      ...(SUPPLIER_FIELD_WORDS[field] ?? wordsFromName(field)),
      nullable,
      input: kindOf(inner),
      schema: shape[field],
    };
  });
}

/** A supplier's delivery cycle as written days–deliveries–delay; a dash when none is set (it is derived). */
export function deliveryCycleText(supplier: {
  cycleDays: number | null;
  deliveriesPerCycle: number | null;
  deliveryDelay: number | null;
}): string {
  const { cycleDays, deliveriesPerCycle, deliveryDelay } = supplier;
  if (cycleDays === null && deliveriesPerCycle === null && deliveryDelay === null) return '—';
  return [cycleDays, deliveriesPerCycle, deliveryDelay].map((value) => value ?? '?').join('–');
}
