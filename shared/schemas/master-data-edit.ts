import { z } from 'zod';
import { describeCellIssue } from './imports';
import { isoDateSchema, partNumberSchema, partSchema, supplierSchema } from './master-data';

/*
 * Edits of one part, supplier or BOM are checked with the very schemas and sentences of the CSV
 * import, so a form and a file are refused for the same reasons in the same words.
 */

/** A field the edit got wrong, with the sentence the import would show for the same cell. */
export interface FieldIssue {
  path: (string | number)[];
  message: string;
}

export type EditCheck<T> = { ok: true; value: T } | { ok: false; issues: FieldIssue[] };

function valueAt(record: unknown, path: readonly PropertyKey[]): unknown {
  let value: unknown = record;
  for (const key of path) value = (value as Record<PropertyKey, unknown> | undefined)?.[key];
  return value;
}

/** Parses a record with `schema`, turning each zod issue into the import's sentence for that field. */
export function checkRecord<T>(schema: z.ZodType<T>, record: unknown): EditCheck<T> {
  const result = schema.safeParse(record);
  if (result.success) return { ok: true, value: result.data };
  return {
    ok: false,
    issues: result.error.issues.map((issue) => {
      const raw = valueAt(record, issue.path);
      const path = issue.path.map((key) => (typeof key === 'symbol' ? String(key) : key));
      return {
        path,
        message: raw === undefined || raw === null ? missingMessage(issue, raw) : describeCellIssue(issue, raw),
      };
    }),
  };
}

function missingMessage(issue: z.core.$ZodIssue, raw: unknown): string {
  return issue.code === 'invalid_type' ? 'is required' : describeCellIssue(issue, raw);
}

/** The part master a form edits: everything but the part number (the address) and on-hand (the ledger's). */
export type PartEdit = Omit<z.infer<typeof partSchema>, 'partNumber' | 'onHand'>;

/** Body of `PUT /api/parts/:partNumber`; fields are checked by `checkRecord(partSchema, …)` in the service. */
export const partEditBodySchema = z.record(z.string(), z.unknown());

/** Body of `PUT /api/suppliers/:code`: every field of the supplier schema but the code. */
export const supplierEditBodySchema = z.record(z.string(), z.unknown());

/** Fields of a supplier a form edits, in schema order; the code is the address and not edited. */
export function supplierEditFields(): string[] {
  return Object.keys(supplierSchema.shape).filter((field) => field !== 'code');
}

export const partNumberParamsSchema = z.object({ partNumber: partNumberSchema });
export const supplierCodeParamsSchema = z.object({ code: supplierSchema.shape.code });
export const bomParentParamsSchema = z.object({ parent: partNumberSchema });
export const bomDateQuerySchema = z.object({ date: isoDateSchema.optional() });

/** Body of `PUT /api/bom/:parent`: the parent's whole single-level BOM (it replaces every line). */
export const bomEditBodySchema = z.object({ lines: z.array(z.record(z.string(), z.unknown())).max(2000) });

/**
 * An engineering change: from `effectiveFrom` the parent uses `replacement` instead of
 * `component`; the old line ends the day before. The replacement may be the same part with a
 * new quantity per or scrap allowance.
 */
export const engineeringChangeSchema = z.object({
  component: partNumberSchema,
  replacement: partNumberSchema,
  qtyPer: z.number().positive(),
  scrapPct: z.number().min(0).max(100),
  effectiveFrom: isoDateSchema,
});
export type EngineeringChange = z.infer<typeof engineeringChangeSchema>;

export const bomTreeNodeSchema = z
  .object({
    lineId: z.number().int(),
    component: z.string(),
    description: z.string(),
    uom: z.string(),
    qtyPer: z.number(),
    scrapPct: z.number(),
    effectiveFrom: z.string().nullable(),
    effectiveTo: z.string().nullable(),
    lowLevelCode: z.number().int(),
    level: z.number().int(),
    extendedQty: z.number(),
    get children(): z.ZodArray<typeof bomTreeNodeSchema> {
      return z.array(bomTreeNodeSchema);
    },
  })
  .meta({ id: 'BomTreeNode' });

/** One line of a multi-level BOM, with its quantity per one unit of the top parent. */
export interface BomTreeNode {
  lineId: number;
  component: string;
  description: string;
  uom: string;
  qtyPer: number;
  scrapPct: number;
  effectiveFrom: string | null;
  effectiveTo: string | null;
  lowLevelCode: number;
  /** 1 for the parent's own components, 2 for theirs… */
  level: number;
  /** Quantity per one top parent, with every scrap allowance on the way compounded. */
  extendedQty: number;
  children: BomTreeNode[];
}

export const bomTreeSchema = z.object({
  parent: z.string(),
  description: z.string(),
  uom: z.string(),
  lowLevelCode: z.number().int(),
  /** The date the tree is effective on; null when every line is shown whatever its dates. */
  date: z.string().nullable(),
  lines: z.array(bomTreeNodeSchema),
});
export type BomTree = z.infer<typeof bomTreeSchema>;

export const whereUsedSchema = z.object({
  partNumber: z.string(),
  /** Lines naming the part as a component (every date unless a date was asked for). */
  parents: z.array(
    z.object({
      lineId: z.number().int(),
      parent: z.string(),
      description: z.string(),
      qtyPer: z.number(),
      scrapPct: z.number(),
      effectiveFrom: z.string().nullable(),
      effectiveTo: z.string().nullable(),
    }),
  ),
  /** End items that reach the part through any number of levels. */
  endItems: z.array(z.string()),
});
export type WhereUsed = z.infer<typeof whereUsedSchema>;

export const partDetailSchema = z.object({
  part: partSchema,
  lowLevelCode: z.number().int(),
  supplierName: z.string().nullable(),
  loop: z.object({ id: z.number().int(), containerQty: z.number(), activeCards: z.number().int() }).nullable(),
});
export type PartDetail = z.infer<typeof partDetailSchema>;
