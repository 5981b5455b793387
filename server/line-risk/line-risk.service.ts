import { BomCycleError } from '../../shared/domain/bom';
import { addCalendarDays } from '../../shared/domain/calendar';
import { toDayNumber } from '../../shared/domain/date';
import { MAX_LINE_RISK_CALENDAR_DAYS, walkLineRisk, type LineRiskInput } from '../../shared/domain/line-risk';
import { PlanInputError } from '../../shared/domain/plan-model';
import type { LineRiskReport, ShortageDto } from '../../shared/schemas/line-risk';
import type { Database } from '../db/database';
import { BadRequestError, ConflictError, NotFoundError } from '../errors';
import { SerialisedBody } from '../http/serialised-body';
import type { LoopsService } from '../loops/loops.service';
import { plantToday, resolveHorizon } from '../planning/plan-dates';
import { PerPlanningVersion } from '../planning/per-version';
import { readSequenceSettings } from '../sequence/sequence-settings';
import {
  PLANNING_PIECES,
  readPlanningPieceVersions,
  type PlanningPiece,
  type PlanningPieceVersions,
} from '../settings/versions';
import { keepEqualRows } from './changed-rows';
import { loadLineRiskInputs, type LineRiskInputs } from './line-risk-inputs';
import { LineRiskRunner, LineRiskWorkerError } from './line-risk-runner';
import { toReport } from './line-risk-report';
import { summarise } from './line-risk-summary';

const MAX_CACHED_RESULTS = 8;

interface Horizon {
  from?: string;
  to?: string;
}

/** One result: the report as the worker sent it (bytes), or as objects when computed in place; each made from the other on demand. */
interface Computed {
  key: string;
  report?: LineRiskReport;
  reportBody?: SerialisedBody;
  /** Where the shortages start in reportBody's bytes, when the worker made them. */
  shortagesAt?: number;
  shortagesBody?: SerialisedBody;
}

/**
 * Serves the line risk from a cache keyed by the planning data version (like the plan): inputs
 * are read again only after something that feeds planning has changed, and a result is computed
 * once per horizon, day and frozen window, in a worker thread so other requests go on meanwhile.
 * Many changes that feed planning (a draft release, a forecast) leave the line risk's own inputs
 * as they were: its results then stand. Reports list the first units and slots; the rest are
 * paged, so a large plant's answer stays small.
 */
export class LineRiskService {
  private readonly results = new Map<string, Promise<Computed>>();
  private readonly inputs: PerPlanningVersion<LineRiskInputs>;
  private readonly runner = new LineRiskRunner();
  /** Counts the inputs results were computed from; part of every key, so a result of older ones is never served. */
  private generation = 0;
  /**
   * The inputs last read outside a write unit, with the piece versions they were read at; and the
   * inputs the results in `results` come from.
   */
  private lastRead: { inputs: LineRiskInputs; versions: PlanningPieceVersions } | null = null;
  private resultsOf: LineRiskInputs | null = null;

  constructor(
    private readonly db: Database,
    loops: LoopsService,
    private readonly today: () => string = plantToday,
  ) {
    this.inputs = new PerPlanningVersion(db, async (manager) => {
      const loopList = await loops.listLoops();
      // Read inside a write unit, they may be uncommitted: used once, never kept.
      if (db.inWriteUnit) return loadLineRiskInputs(manager, loopList);
      // A change reads again only the pieces it touched: after a BOM edit a large plant's part
      // master, sequence and calendar stand, and after changes of stock alone only stock is read.
      // The versions are read in this one snapshot with the inputs, so they match them.
      const versions = await readPlanningPieceVersions(manager);
      const before = this.lastRead;
      const reuse = before ? { before: before.inputs, standing: standingPieces(before.versions, versions) } : undefined;
      const read = await loadLineRiskInputs(manager, loopList, new Date(), reuse);
      this.lastRead = { inputs: keepUnchanged(read, before?.inputs ?? null), versions };
      return this.lastRead.inputs;
    });
  }

  /** The report for the screen (defaults: next working day, 20 working days). */
  async report(horizon: Horizon = {}): Promise<LineRiskReport> {
    const computed = await this.compute(horizon);
    computed.report ??= JSON.parse(computed.reportBody!.json.toString('utf8')) as LineRiskReport;
    return computed.report;
  }

  /** The report serialised once per result, for GET /api/line-risk. */
  async reportBody(horizon: Horizon = {}): Promise<SerialisedBody> {
    const computed = await this.compute(horizon);
    computed.reportBody ??= SerialisedBody.of(computed.report);
    return computed.reportBody;
  }

  /** GET /api/shortages: the short parts alone, serialised once per result. */
  async shortagesBody(horizon: Horizon = {}): Promise<SerialisedBody> {
    const computed = await this.compute(horizon);
    if (!computed.shortagesBody) {
      const { reportBody, shortagesAt } = computed;
      computed.shortagesBody =
        reportBody && shortagesAt !== undefined
          ? new SerialisedBody(reportBody.json.subarray(shortagesAt, reportBody.json.length - 1))
          : SerialisedBody.of(computed.report!.shortages);
    }
    return computed.shortagesBody;
  }

  /** The short parts alone. */
  async shortages(horizon: Horizon = {}): Promise<ShortageDto[]> {
    return (await this.report(horizon)).shortages;
  }

  /** Units at risk beyond the first page. */
  async units(horizon: Horizon, offset: number, limit: number) {
    return this.page(horizon, (key) => this.runner.units(key, offset, limit));
  }

  /** Every unit that lacks one part, beyond the first ones the report lists. */
  async slots(partNumber: string, horizon: Horizon, offset: number, limit: number) {
    const page = await this.page(horizon, (key) => this.runner.slots(key, partNumber, offset, limit));
    if (!page) throw new NotFoundError(`${partNumber} is not short in this horizon.`);
    return page;
  }

  /** What the browser needs to run the same engine for a what-if before a change is saved. */
  async engineInput(horizon: Horizon = {}): Promise<LineRiskInput> {
    const inputs = await this.inputs.get();
    return { ...this.engineInputOf(inputs, await this.resolve(inputs, horizon)) };
  }

  /** Stops the worker thread (server shutdown, tests). */
  close(): Promise<void> {
    return this.runner.close();
  }

  /** A page from the worker's full result; computed again if the worker lost it (it restarted). */
  private async page<T>(horizon: Horizon, read: (key: string) => Promise<T | undefined>): Promise<T> {
    for (let attempt = 0; ; attempt += 1) {
      const { key } = await this.compute(horizon);
      const page = await read(key);
      if (page !== undefined || attempt > 0) return page as T;
      this.results.delete(key);
    }
  }

  private async compute(horizon: Horizon): Promise<Computed> {
    const inputs = await this.inputs.get();
    const options = await this.resolve(inputs, horizon);
    if (this.db.inWriteUnit) {
      // Inputs read inside a write unit may be uncommitted: computed here, for this unit alone.
      try {
        const run = walkLineRisk(this.engineInputOf(inputs, options));
        return { key: '', report: toReport(summarise(run), inputs.details, inputs.awaiting) };
      } catch (error) {
        throw asHttpError(error);
      }
    }
    if (inputs !== this.resultsOf) {
      this.forget();
      this.resultsOf = inputs;
    }
    const key = `${this.generation}|${options.from}|${options.to}|${options.today}|${options.frozenWindowDays}`;
    let computed = this.results.get(key);
    if (!computed) {
      computed = this.runner
        .compute(key, inputs, options)
        .then(({ json, gzip, etag, shortagesAt }) => ({
          key,
          reportBody: new SerialisedBody(asBuffer(json), etag, asBuffer(gzip)),
          shortagesAt,
        }))
        .catch((error: unknown) => {
          throw asHttpError(error);
        });
      computed.catch(() => this.results.delete(key));
      if (this.results.size >= MAX_CACHED_RESULTS) {
        const oldest = this.results.keys().next().value!;
        this.results.delete(oldest);
        this.runner.drop(oldest);
      }
      this.results.set(key, computed);
    }
    return computed;
  }

  private forget(): void {
    for (const key of this.results.keys()) this.runner.drop(key);
    this.results.clear();
    this.generation += 1;
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
}

/** An engine error (raised here or in the worker) as the HTTP answer it deserves; others as they are. */
function asHttpError(error: unknown): unknown {
  const kind =
    error instanceof BomCycleError
      ? 'cycle'
      : error instanceof PlanInputError
        ? 'input'
        : error instanceof LineRiskWorkerError
          ? error.kind
          : 'other';
  const message = error instanceof Error ? error.message : String(error);
  if (kind === 'cycle') return new ConflictError(`The BOM cannot be exploded: ${message}.`);
  if (kind === 'input') return new BadRequestError(message);
  return error;
}

/** The pieces whose version stands between two reads. */
function standingPieces(before: PlanningPieceVersions, now: PlanningPieceVersions): Set<PlanningPiece> {
  return new Set(PLANNING_PIECES.filter((piece) => before[piece] === now[piece]));
}

/**
 * The inputs just read, with each piece equal to the one read before replaced by that one, and in
 * a list that changed each row equal to the one before replaced by it; the inputs read before
 * themselves when nothing differs.
 */
function keepUnchanged(read: LineRiskInputs, before: LineRiskInputs | null): LineRiskInputs {
  if (!before) return read;
  const kept: LineRiskInputs = { ...read };
  let changed = false;
  for (const name of Object.keys(read) as (keyof LineRiskInputs)[]) {
    const piece = keepEqualRows<unknown>(before[name], read[name]);
    (kept as unknown as Record<string, unknown>)[name] = piece;
    if (piece !== before[name]) changed = true;
  }
  return changed ? kept : before;
}

/** Bytes that came from the worker, as a Buffer over the same memory. */
function asBuffer(bytes: Uint8Array): Buffer {
  return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
}
