import { BomCycleError } from '../../shared/domain/bom';
import { addCalendarDays } from '../../shared/domain/calendar';
import { toDayNumber } from '../../shared/domain/date';
import {
  computeLineRisk,
  MAX_LINE_RISK_CALENDAR_DAYS,
  type LineRiskInput,
  type LineRiskResult,
} from '../../shared/domain/line-risk';
import { PlanInputError } from '../../shared/domain/plan-model';
import {
  SLOTS_PER_SHORTAGE,
  UNITS_PER_REPORT,
  type LineRiskReport,
  type ShortageDto,
} from '../../shared/schemas/line-risk';
import type { Database } from '../db/database';
import { BadRequestError, ConflictError, NotFoundError } from '../errors';
import type { LoopsService } from '../loops/loops.service';
import { plantToday, resolveHorizon } from '../planning/plan-dates';
import { PerPlanningVersion } from '../planning/per-version';
import { readSequenceSettings } from '../sequence/sequence-settings';
import { loadLineRiskInputs, type LineRiskInputs } from './line-risk-inputs';

const MAX_CACHED_RESULTS = 8;

interface Horizon {
  from?: string;
  to?: string;
}

interface Computed {
  result: LineRiskResult;
  inputs: LineRiskInputs;
}

/**
 * Serves the line risk from a cache keyed by the planning data version (like the plan): inputs
 * are read again only after something that feeds planning has changed, and a result is computed
 * once per horizon, day and frozen window. Reports list the first units and slots; the rest are
 * paged, so a large plant's answer stays small.
 */
export class LineRiskService {
  private readonly results = new Map<string, Computed>();
  private readonly inputs: PerPlanningVersion<LineRiskInputs>;

  constructor(
    private readonly db: Database,
    loops: LoopsService,
    private readonly today: () => string = plantToday,
  ) {
    this.inputs = new PerPlanningVersion(
      db,
      async (manager) => loadLineRiskInputs(manager, await loops.listLoops()),
      () => this.results.clear(),
    );
  }

  /** The report for the screen (defaults: next working day, 20 working days). */
  async report(horizon: Horizon = {}): Promise<LineRiskReport> {
    const { result, inputs } = await this.compute(horizon);
    return {
      from: result.from,
      to: result.to,
      today: result.today,
      days: result.days,
      frozenWindowDays: result.frozenWindowDays,
      frozenUntil: result.frozenUntil,
      unitsInHorizon: result.unitsInHorizon,
      unitsBuilt: result.unitsBuilt,
      unitsAtRisk: result.unitsAtRisk.slice(0, UNITS_PER_REPORT),
      unitsAtRiskCount: result.unitsAtRisk.length,
      shortages: result.shortages.map((shortage) => toShortage(shortage, inputs)),
    };
  }

  /** GET /api/shortages: the short parts alone. */
  async shortages(horizon: Horizon = {}): Promise<ShortageDto[]> {
    return (await this.report(horizon)).shortages;
  }

  /** Units at risk beyond the first page. */
  async units(horizon: Horizon, offset: number, limit: number) {
    const { result } = await this.compute(horizon);
    return { total: result.unitsAtRisk.length, units: result.unitsAtRisk.slice(offset, offset + limit) };
  }

  /** Every unit that lacks one part, beyond the first ones the report lists. */
  async slots(partNumber: string, horizon: Horizon, offset: number, limit: number) {
    const { result } = await this.compute(horizon);
    const shortage = result.shortages.find((candidate) => candidate.partNumber === partNumber);
    if (!shortage) throw new NotFoundError(`${partNumber} is not short in this horizon.`);
    return { total: shortage.slotsAtRisk.length, slots: shortage.slotsAtRisk.slice(offset, offset + limit) };
  }

  /** What the browser needs to run the same engine for a what-if before a change is saved. */
  async engineInput(horizon: Horizon = {}): Promise<LineRiskInput> {
    const inputs = await this.inputs.get();
    return { ...this.engineInputOf(inputs, await this.resolve(inputs, horizon)) };
  }

  private async compute(horizon: Horizon): Promise<Computed> {
    const inputs = await this.inputs.get();
    const options = await this.resolve(inputs, horizon);
    const key = `${options.from}|${options.to}|${options.today}|${options.frozenWindowDays}`;
    let computed = this.results.get(key);
    if (!computed) {
      computed = { result: this.run(this.engineInputOf(inputs, options)), inputs };
      if (this.results.size >= MAX_CACHED_RESULTS) this.results.delete(this.results.keys().next().value!);
      this.results.set(key, computed);
    }
    return computed;
  }

  private async resolve(inputs: LineRiskInputs, horizon: Horizon) {
    const resolved = resolveHorizon(inputs.calendar, horizon.from, horizon.to);
    if (toDayNumber(resolved.to) > toDayNumber(addCalendarDays(resolved.from, MAX_LINE_RISK_CALENDAR_DAYS - 1))) {
      throw new BadRequestError(`The horizon may span at most ${MAX_LINE_RISK_CALENDAR_DAYS} calendar days.`, [
        { path: ['to'], message: `must be within ${MAX_LINE_RISK_CALENDAR_DAYS} days of from` },
      ]);
    }
    const { frozenWindowDays } = await readSequenceSettings(this.db.manager);
    return { ...resolved, today: this.today(), frozenWindowDays };
  }

  private engineInputOf(
    inputs: LineRiskInputs,
    options: { from: string; to: string; today: string; frozenWindowDays: number },
  ): LineRiskInput {
    return {
      parts: inputs.parts,
      bom: inputs.bom,
      sequence: inputs.sequence,
      firmReceipts: inputs.firmReceipts,
      loops: inputs.loops,
      calendar: inputs.calendar,
      ...options,
    };
  }

  private run(input: LineRiskInput): LineRiskResult {
    try {
      return computeLineRisk(input);
    } catch (error) {
      if (error instanceof BomCycleError) throw new ConflictError(`The BOM cannot be exploded: ${error.message}.`);
      if (error instanceof PlanInputError) throw new BadRequestError(error.message);
      throw error;
    }
  }
}

/** A short part as published, with what the screen shows beside the figures. */
function toShortage(shortage: LineRiskResult['shortages'][number], inputs: LineRiskInputs): ShortageDto {
  const part = inputs.parts.find((candidate) => candidate.partNumber === shortage.partNumber);
  const details = inputs.details.get(shortage.partNumber);
  return {
    partNumber: shortage.partNumber,
    firstShortDate: shortage.firstShortDate,
    shortQty: shortage.shortQty,
    slotsAtRisk: shortage.slotsAtRisk.slice(0, SLOTS_PER_SHORTAGE),
    slotsAtRiskCount: shortage.slotsAtRisk.length,
    action: shortage.action,
    needBy: shortage.needBy,
    releaseBy: shortage.releaseBy,
    leadTimeDays: shortage.leadTimeDays,
    loop: shortage.loop,
    description: part?.description ?? '',
    uom: part?.uom ?? 'H87',
    supplierCode: shortage.supplierCode,
    supplierName: details?.supplierName ?? null,
    hazardous: details?.hazardous ?? false,
    onHand: shortage.onHand,
    firmReceiptQty: shortage.firmReceiptQty,
    daysUntilImpact: shortage.daysUntilImpact,
    inFrozenWindow: shortage.inFrozenWindow,
    rescue: shortage.rescue,
  };
}
