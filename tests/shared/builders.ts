import type { LineRiskPart } from '../../shared/domain/line-risk';
import type { PlanningBomLine, SequenceSlot } from '../../shared/domain/types';

/** A BOM line of tests: no scrap and open effectivity unless `extra` says otherwise. */
export const bomLine = (
  parent: string,
  component: string,
  qtyPer = 1,
  extra: Partial<PlanningBomLine> = {},
): PlanningBomLine & { effectiveFrom: string | null; effectiveTo: string | null } => ({
  parent,
  component,
  qtyPer,
  scrapPct: 0,
  effectiveFrom: null,
  effectiveTo: null,
  ...extra,
});

/** A bought part of the line-risk cases: no lead time, nothing on hand unless `fields` says otherwise. */
export const boughtPart = (partNumber: string, fields: Partial<LineRiskPart> = {}): LineRiskPart => ({
  partNumber,
  source: 'buy',
  leadTimeDays: 0,
  packQty: 1,
  onHand: 0,
  safetyStock: 0,
  ...fields,
});

/** One unit of `model` in the sequence, at place `sequence` of `date`. */
export const sequenceUnit = (date: string, sequence: number, model: string, serial: string): SequenceSlot => ({
  date,
  sequence,
  model,
  serial,
  qty: 1,
});
