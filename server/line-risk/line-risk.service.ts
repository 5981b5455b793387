import { addCalendarDays } from '../../shared/domain/calendar';
import { BomCycleError } from '../../shared/domain/bom';
import { toDayNumber } from '../../shared/domain/date';
import { computeLineRisk, MAX_LINE_RISK_CALENDAR_DAYS, type LineRiskResult } from '../../shared/domain/line-risk';
import { PlanInputError } from '../../shared/domain/plan-model';
import type { LineRiskReport, ShortageDto } from '../../shared/schemas/line-risk';
import { BadRequestError, ConflictError } from '../errors';
import { plantToday, resolveHorizon } from '../planning/plan-dates';
import { readSequenceSettings } from '../sequence/sequence-settings';
import { readPlanningVersion } from '../settings/versions';
import { loadLineRiskInputs, type LineRiskInputs } from './line-risk-inputs';
import type { Database } from '../db/database';

const MAX_CACHED_REPORTS = 8;

/**
 * Serves the line risk from a cache keyed by the planning data version (like the plan): inputs
 * are read again only after something that feeds planning has changed, and a report is computed
 * once per horizon, day and frozen window.
 */
export class LineRiskService {
  private version = -1;
  private inputs: Promise<LineRiskInputs> | null = null;
  private readonly reports = new Map<string, LineRiskReport>();

  constructor(
    private readonly db: Database,
    private readonly today: () => string = plantToday,
  ) {}

  /** The whole report for the screen (defaults: next working day, 20 working days). */
  async report(from?: string, to?: string): Promise<LineRiskReport> {
    const inputs = await this.currentInputs();
    const horizon = resolveHorizon(inputs.calendar, from, to);
    if (toDayNumber(horizon.to) > toDayNumber(addCalendarDays(horizon.from, MAX_LINE_RISK_CALENDAR_DAYS - 1))) {
      throw new BadRequestError(`The horizon may span at most ${MAX_LINE_RISK_CALENDAR_DAYS} calendar days.`, [
        { path: ['to'], message: `must be within ${MAX_LINE_RISK_CALENDAR_DAYS} days of from` },
      ]);
    }
    const today = this.today();
    const { frozenWindowDays } = await readSequenceSettings(this.db.manager);
    const key = `${horizon.from}|${horizon.to}|${today}|${frozenWindowDays}`;
    let report = this.reports.get(key);
    if (!report) {
      report = toReport(this.run(inputs, { ...horizon, today, frozenWindowDays }), inputs);
      if (this.reports.size >= MAX_CACHED_REPORTS) this.reports.delete(this.reports.keys().next().value!);
      this.reports.set(key, report);
    }
    return report;
  }

  /** GET /api/shortages: the short parts alone. */
  async shortages(from?: string, to?: string): Promise<ShortageDto[]> {
    return (await this.report(from, to)).shortages;
  }

  /**
   * The inputs at the current planning version, read once per version and shared. Inside a write
   * unit they may hold uncommitted changes, so they are read for that unit alone, never cached.
   */
  private async currentInputs(): Promise<LineRiskInputs> {
    if (this.db.inWriteUnit) return loadLineRiskInputs(this.db.manager);
    const version = await readPlanningVersion(this.db.manager);
    if (version !== this.version || !this.inputs) {
      this.version = version;
      this.reports.clear();
      const loading = this.db.read(async (manager) => ({
        version: await readPlanningVersion(manager),
        inputs: await loadLineRiskInputs(manager),
      }));
      this.inputs = loading.then((loaded) => {
        this.version = loaded.version;
        return loaded.inputs;
      });
      this.inputs.catch(() => {
        this.inputs = null;
      });
    }
    return this.inputs;
  }

  private run(
    inputs: LineRiskInputs,
    options: { from: string; to: string; today: string; frozenWindowDays: number },
  ): LineRiskResult {
    try {
      return computeLineRisk({
        parts: inputs.parts,
        bom: inputs.bom,
        sequence: inputs.sequence,
        firmReceipts: inputs.firmReceipts,
        calendar: inputs.calendar,
        ...options,
      });
    } catch (error) {
      if (error instanceof BomCycleError) throw new ConflictError(`The BOM cannot be exploded: ${error.message}.`);
      if (error instanceof PlanInputError) throw new BadRequestError(error.message);
      throw error;
    }
  }
}

/** Adds what the screen shows beside the figures: description, unit, supplier name, hazard. */
function toReport(result: LineRiskResult, inputs: LineRiskInputs): LineRiskReport {
  const parts = new Map(inputs.parts.map((part) => [part.partNumber, part]));
  return {
    from: result.from,
    to: result.to,
    today: result.today,
    days: result.days,
    frozenWindowDays: result.frozenWindowDays,
    frozenUntil: result.frozenUntil,
    unitsInHorizon: result.unitsInHorizon,
    unitsBuilt: result.unitsBuilt,
    unitsAtRisk: result.unitsAtRisk,
    shortages: result.shortages.map((shortage) => {
      const part = parts.get(shortage.partNumber);
      const details = inputs.details.get(shortage.partNumber);
      return {
        partNumber: shortage.partNumber,
        firstShortDate: shortage.firstShortDate,
        shortQty: shortage.shortQty,
        slotsAtRisk: shortage.slotsAtRisk,
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
    }),
  };
}
