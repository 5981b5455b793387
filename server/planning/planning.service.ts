import { BomCycleError, computePlan, grossDemandByDay, PlanInputError } from '../../shared/domain/plan';
import type { PlanResult } from '../../shared/domain/types';
import {
  pageOfDemandTable,
  sortDemandRows,
  summariseDemandTable,
  type DailyDemandRow,
  type DemandTableQuery,
  type DemandTableSummary,
} from '../../shared/domain/demand-table';
import type { DemandResponse, DemandTableResponse, PlanResponse } from '../../shared/schemas/horizon';
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
/** Demand reports kept as objects for the table pages: tens of megabytes each on a large plant. */
const MAX_CACHED_REPORTS = 4;

/** Searches (and their sorted rows) kept per demand report: a buyer pages and sorts one search at a time. */
const MAX_CACHED_SEARCHES = 8;

type DemandOptions = { from?: string; to?: string; supplierCode?: string };

/** A search over one demand report, and its rows in each order asked for so far. */
interface SearchedTable {
  summary: DemandTableSummary;
  sorted: Map<string, readonly DailyDemandRow[]>;
}

/** Keeps `value` under `key`, dropping the oldest entry when the cache is full. */
function remember<T>(cache: Map<string, T>, max: number, key: string, value: T): void {
  if (cache.size >= max) cache.delete(cache.keys().next().value!);
  cache.set(key, value);
}

/**
 * Serves plans from a cache keyed by the planning data version: inputs are read and the engine
 * run again only after something that feeds the plan has changed.
 */
export class PlanningService {
  private readonly plans = new Map<string, CachedPlan>();
  private readonly demandBodies = new Map<string, SerialisedBody>();
  private readonly demandReports = new Map<string, DemandResponse>();
  private readonly searchedTables = new WeakMap<DemandResponse, Map<string, SearchedTable>>();
  /** Counts planning versions seen, so a body built from an older one is not kept. */
  private generation = 0;
  private readonly inputs: PerPlanningVersion<PlanInputs>;

  constructor(private readonly db: Database) {
    this.inputs = new PerPlanningVersion(db, loadPlanInputs, () => {
      this.plans.clear();
      this.demandBodies.clear();
      this.demandReports.clear();
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
      remember(this.plans, MAX_CACHED_HORIZONS, key, cached);
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

  async demand(options: DemandOptions): Promise<DemandResponse> {
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
  async demandBody(options: DemandOptions): Promise<SerialisedBody> {
    return this.cachedDemand(options, this.demandBodies, MAX_CACHED_BODIES, async () => {
      return SerialisedBody.of(await this.demand(options));
    });
  }

  /** One page of the demand table, cut from the report kept for this horizon and supplier. */
  async demandTable(options: DemandOptions, query: DemandTableQuery): Promise<DemandTableResponse> {
    const report = await this.cachedDemand(options, this.demandReports, MAX_CACHED_REPORTS, () => this.demand(options));
    let searches = this.searchedTables.get(report);
    if (!searches) this.searchedTables.set(report, (searches = new Map()));
    const searchKey = `${query.bucket}|${query.stackBy}|${query.search?.trim().toLowerCase() ?? ''}`;
    let searched = searches.get(searchKey);
    if (!searched) {
      searched = { summary: summariseDemandTable(report, query), sorted: new Map() };
      remember(searches, MAX_CACHED_SEARCHES, searchKey, searched);
    }
    const sortKey = `${query.sort?.prop ?? ''}|${query.sort?.order ?? ''}`;
    let sorted = searched.sorted.get(sortKey);
    if (!sorted) searched.sorted.set(sortKey, (sorted = sortDemandRows(searched.summary.matchedRows, query.sort)));
    return { ...pageOfDemandTable(searched.summary, query, sorted), sequenceEnds: report.sequenceEnds };
  }

  /** What `build` makes of the demand over a horizon, kept until the planning version changes. */
  private async cachedDemand<T>(
    options: DemandOptions,
    cache: Map<string, T>,
    max: number,
    build: () => Promise<T>,
  ): Promise<T> {
    const generation = this.generation;
    const { from, to } = await this.plan(options.from, options.to);
    const key = `${from}|${to}|${options.supplierCode ?? ''}`;
    const cached = cache.get(key);
    if (cached && !this.db.inWriteUnit) return cached;
    const value = await build();
    // Kept only if no newer planning version arrived while it was built.
    if (!this.db.inWriteUnit && generation === this.generation) remember(cache, max, key, value);
    return value;
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
