import { BomCycleError, computePlan, grossDemandByDay, PlanInputError } from '../../shared/domain/plan';
import type { PlanResult } from '../../shared/domain/types';
import type { DemandResponse, PlanResponse } from '../../shared/schemas/horizon';
import { BadRequestError, ConflictError, NotFoundError } from '../errors';
import { SupplierEntity } from '../master-data/supplier.entity';
import { PerPlanningVersion } from './per-version';
import { loadPlanInputs, type PlanInputs } from './plan-inputs';
import { resolveHorizon } from './plan-dates';
import type { Database } from '../db/database';
import { SerialisedBody } from '../http/serialised-body';

interface CachedPlan {
  inputs: PlanInputs;
  result: PlanResult;
}

const MAX_CACHED_HORIZONS = 8;
/** Demand bodies per horizon and supplier filter. */
const MAX_CACHED_BODIES = 32;

/**
 * Serves plans from a cache keyed by the planning data version: inputs are read and the engine
 * run again only after something that feeds the plan has changed.
 */
export class PlanningService {
  private readonly plans = new Map<string, CachedPlan>();
  private readonly demandBodies = new Map<string, SerialisedBody>();
  /** Counts planning versions seen, so a body built from an older one is not kept. */
  private generation = 0;
  private readonly inputs: PerPlanningVersion<PlanInputs>;

  constructor(private readonly db: Database) {
    this.inputs = new PerPlanningVersion(db, loadPlanInputs, () => {
      this.plans.clear();
      this.demandBodies.clear();
      this.generation += 1;
    });
  }

  /** The plan over a horizon (defaults: next working day, 20 working days). */
  async plan(from?: string, to?: string): Promise<CachedPlan & { from: string; to: string }> {
    const inputs = await this.inputs.get();
    const horizon = resolveHorizon(inputs.calendar, from, to);
    const key = `${horizon.from}|${horizon.to}`;
    let cached = this.plans.get(key);
    if (!cached) {
      cached = { inputs, result: this.run(inputs, horizon.from, horizon.to) };
      if (this.plans.size >= MAX_CACHED_HORIZONS) this.plans.delete(this.plans.keys().next().value!);
      this.plans.set(key, cached);
    }
    return { ...cached, ...horizon };
  }

  async partPlan(partNumber: string, from?: string, to?: string): Promise<PlanResponse> {
    const { inputs, result } = await this.plan(from, to);
    const part = inputs.parts.find((candidate) => candidate.partNumber === partNumber);
    const plan = result.parts.get(partNumber);
    if (!part || !plan) throw new NotFoundError(`No part ${partNumber}.`);
    return {
      part: {
        partNumber: part.partNumber,
        description: part.description,
        uom: part.uom,
        source: part.source,
        supplierCode: part.supplierCode ?? null,
        leadTimeDays: part.leadTimeDays,
        packQty: part.packQty,
        onHand: part.onHand,
        safetyStock: part.safetyStock,
        lowLevelCode: plan.lowLevelCode,
      },
      buckets: plan.buckets,
      pastDue: plan.pastDue,
    };
  }

  async demand(options: { from?: string; to?: string; supplierCode?: string }): Promise<DemandResponse> {
    const { inputs, result } = await this.plan(options.from, options.to);
    if (
      options.supplierCode &&
      !(await this.db.manager.getRepository(SupplierEntity).existsBy({ code: options.supplierCode }))
    ) {
      throw new NotFoundError(`No supplier ${options.supplierCode}.`);
    }
    return {
      ...grossDemandByDay(result, inputs.parts, { supplierCode: options.supplierCode }),
      sequenceEnds: inputs.sequence.at(-1)?.date ?? null,
    };
  }

  /**
   * The demand report serialised, kept until the planning version changes: a repeated request
   * sends the same bytes instead of rebuilding and re-serialising the report.
   */
  async demandBody(options: { from?: string; to?: string; supplierCode?: string }): Promise<SerialisedBody> {
    const generation = this.generation;
    const { from, to } = await this.plan(options.from, options.to);
    const key = `${from}|${to}|${options.supplierCode ?? ''}`;
    const cached = this.demandBodies.get(key);
    if (cached && !this.db.inWriteUnit) return cached;
    const body = SerialisedBody.of(await this.demand(options));
    // Kept only if no newer planning version arrived while it was built.
    if (!this.db.inWriteUnit && generation === this.generation) {
      if (this.demandBodies.size >= MAX_CACHED_BODIES) this.demandBodies.delete(this.demandBodies.keys().next().value!);
      this.demandBodies.set(key, body);
    }
    return body;
  }

  private run(inputs: PlanInputs, from: string, to: string): PlanResult {
    try {
      return computePlan({ ...inputs, from, to });
    } catch (error) {
      if (error instanceof BomCycleError) throw new ConflictError(`The BOM cannot be planned: ${error.message}.`);
      if (error instanceof PlanInputError) throw new BadRequestError(error.message);
      throw error;
    }
  }
}
