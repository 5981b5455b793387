import type { PlanningBomLine } from '../../shared/domain/types';

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
