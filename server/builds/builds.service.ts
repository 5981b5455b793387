import { In, type EntityManager } from 'typeorm';
import { backflush, bomByParent, type BackflushPart, type BomByParent } from '../../shared/domain/backflush';
import { isEffective } from '../../shared/domain/bom';
import { roundQty } from '../../shared/domain/quantity';
import type { IsoDate, PartSource, PlanningBomLine } from '../../shared/domain/types';
import type { BuildResponse, CloseDayResponse, CloseDaySettings, Kit } from '../../shared/schemas/builds';
import { recordAudit } from '../audit/audit.service';
import { bumpPlanningVersion } from '../settings/versions';
import type { Database } from '../db/database';
import { chunks } from '../db/upsert';
import { ConflictError, ForbiddenError, NotFoundError } from '../errors';
import { oncePerKey, type IdempotentOutcome } from '../http/idempotency';
import type { AuthenticatedUser } from '../http/request-user';
import { BomLineEntity } from '../master-data/bom-line.entity';
import { PartEntity } from '../master-data/part.entity';
import { plantToday } from '../planning/plan-dates';
import { SequenceEntryEntity } from '../sequence/sequence-entry.entity';
import { readSetting, writeSetting } from '../settings/settings';
import { postMovements, type NewMovement, type PostedMovement } from '../stock/stock-ledger';
import { StockMovementEntity } from '../stock/stock-movement.entity';

/** A line operator may undo a unit they reported themselves within this long; a planner any time. */
export const LINE_UNDO_MINUTES = 30;
export const CLOSE_DAY_TIME = 'builds.closeDayTime';
export const CLOSE_DAY_LAST = 'builds.lastClosedDate';

/** What backflushing needs, read once per unit of work: the BOM by parent, part sources, made-part stock. */
interface BackflushContext {
  bom: BomByParent;
  parts: Map<string, BackflushPart>;
  subassemblyStock: Map<string, number>;
}

// Raw selects: a large plant has tens of thousands of lines and parts, and entity hydration would
// cost more than the backflush itself.
async function backflushContext(manager: EntityManager): Promise<BackflushContext> {
  const lines: PlanningBomLine[] = await manager.query(
    `SELECT parent, component, qty_per AS "qtyPer", scrap_pct AS "scrapPct", effective_from AS "effectiveFrom",
     effective_to AS "effectiveTo" FROM bom_line`,
  );
  const parts: { partNumber: string; source: string; onHand: number }[] = await manager.query(
    'SELECT part_number AS "partNumber", source, on_hand AS "onHand" FROM part',
  );
  return {
    bom: bomByParent(lines),
    parts: new Map(parts.map((part) => [part.partNumber, { source: part.source as PartSource }])),
    subassemblyStock: new Map(
      parts.filter((part) => part.source !== 'buy' && part.onHand > 0).map((part) => [part.partNumber, part.onHand]),
    ),
  };
}

/**
 * Net quantity per part, in part-number order. `rank` (from partNumberRanks) saves collating the
 * same part numbers again for every unit of a day.
 */
function summarise(
  movements: readonly { partNumber: string; qty: number }[],
  rank?: ReadonlyMap<string, number>,
): { partNumber: string; qty: number }[] {
  const byPart = new Map<string, number>();
  for (const movement of movements)
    byPart.set(movement.partNumber, roundQty((byPart.get(movement.partNumber) ?? 0) + movement.qty));
  const sorted = rank
    ? [...byPart].sort(([a], [b]) => rank.get(a)! - rank.get(b)!)
    : [...byPart].sort(([a], [b]) => a.localeCompare(b));
  return sorted.map(([partNumber, qty]) => ({ partNumber, qty }));
}

/** Each part number's place in part-number order, collated once. */
function partNumberRanks(partNumbers: Iterable<string>): Map<string, number> {
  return new Map(
    [...new Set(partNumbers)].sort((a, b) => a.localeCompare(b)).map((partNumber, index) => [partNumber, index]),
  );
}

/**
 * Units reported built at the end of the line: each build backflushes the unit's components once,
 * a reversal puts them back, a day can be closed in one go, and each unit has its kit.
 */
export class BuildsService {
  constructor(
    private readonly db: Database,
    private readonly today: () => IsoDate = plantToday,
  ) {}

  /** Reports one unit built, once per Idempotency-Key; a unit already built is a 409 `already_built`. */
  build(serial: string, key: string, actor: AuthenticatedUser): Promise<IdempotentOutcome<BuildResponse>> {
    return this.db.write((manager) =>
      oncePerKey(manager, 'build', key, { serial }, async () => {
        const entry = await this.findEntry(manager, serial);
        const [result] = await this.buildEntries(manager, [entry], await backflushContext(manager), actor);
        await recordAudit(manager, {
          actorEmail: actor.email,
          action: 'build',
          entity: 'sequence-unit',
          entityKey: serial,
          changes: { date: entry.date, model: entry.model, builtAt: result.builtAt, movements: result.movements },
        });
        return result;
      }),
    );
  }

  /** Undoes a build: the opposite movements go back on stock and the unit is planned again. */
  reverse(serial: string, reason: string, actor: AuthenticatedUser): Promise<BuildResponse> {
    return this.db.write(async (manager) => {
      const entry = await this.findEntry(manager, serial);
      if (entry.status !== 'built') {
        throw new ConflictError(
          `Unit ${serial} is ${entry.status}, not built; there is nothing to undo.`,
          [],
          'not_built',
        );
      }
      if (actor.role === 'line') this.assertOwnRecentBuild(entry, actor, await this.builtBy(manager, serial));
      const netBySerial = await manager
        .createQueryBuilder(StockMovementEntity, 'movement')
        .select('movement.partNumber', 'partNumber')
        .addSelect('SUM(movement.qty)', 'qty')
        .where('movement.refType = :refType AND movement.ref = :ref', { refType: 'serial', ref: serial })
        .andWhere('movement.kind IN (:...kinds)', { kinds: ['backflush', 'build-reversal'] })
        .groupBy('movement.partNumber')
        .getRawMany<{ partNumber: string; qty: number | string }>();
      const movements: NewMovement[] = netBySerial.map((row) => ({
        partNumber: row.partNumber,
        qty: -Number(row.qty),
        kind: 'build-reversal',
        userEmail: actor.email,
        reason,
        refType: 'serial',
        ref: serial,
      }));
      const posted = await postMovements(manager, movements);
      await manager.update(
        SequenceEntryEntity,
        { id: entry.id },
        { status: 'planned', builtAt: null, startedAt: null },
      );
      // The unit is in the sequence again: more than stock changed.
      await bumpPlanningVersion(manager, 'sequence');
      await recordAudit(manager, {
        actorEmail: actor.email,
        action: 'reverse-build',
        entity: 'sequence-unit',
        entityKey: serial,
        changes: { date: entry.date, reason, movements: summarise(posted) },
      });
      return { serial, status: 'planned', builtAt: null, movements: summarise(posted) };
    });
  }

  /** Marks every unit of the day not yet built as built, in build order, in one unit of work. */
  closeDay(date: IsoDate, actor: AuthenticatedUser | null): Promise<CloseDayResponse> {
    return this.db.write(async (manager) => {
      const entries = await manager.find(SequenceEntryEntity, {
        where: { date, status: In(['planned', 'started']) },
        order: { sequence: 'ASC' },
      });
      const results = await this.buildEntries(manager, entries, await backflushContext(manager), actor);
      const built = results.map((result) => result.serial);
      const summary = summarise(results.flatMap((result) => result.movements));
      await recordAudit(manager, {
        actorEmail: actor?.email ?? 'job:close-day',
        action: 'close-day',
        entity: 'sequence',
        entityKey: date,
        changes: { days: [date], built, movements: summary.length },
      });
      return { date, built, movements: summary };
    });
  }

  /** The components to bring to the line for a unit: its model's BOM effective on its build date, by point of use. */
  async kit(serial: string): Promise<Kit> {
    const manager = this.db.manager;
    const entry = await this.findEntry(manager, serial);
    return (await this.kitsOf(manager, [entry]))[0];
  }

  /** The kits of every unit of a day, in build order. */
  async dayKits(date: IsoDate): Promise<Kit[]> {
    const manager = this.db.manager;
    const entries = await manager.find(SequenceEntryEntity, { where: { date }, order: { sequence: 'ASC' } });
    return this.kitsOf(manager, entries);
  }

  /** The kit was issued: the unit is started (a built unit stays built). */
  start(serial: string, actor: AuthenticatedUser): Promise<BuildResponse> {
    return this.db.write(async (manager) => {
      const entry = await this.findEntry(manager, serial);
      if (entry.status === 'planned') {
        const startedAt = new Date().toISOString();
        await manager.update(
          SequenceEntryEntity,
          { id: entry.id, status: 'planned' },
          { status: 'started', startedAt },
        );
        await recordAudit(manager, {
          actorEmail: actor.email,
          action: 'start',
          entity: 'sequence-unit',
          entityKey: serial,
        });
        // The sequence is a planning input; open boards and line-end screens show the new status.
        await bumpPlanningVersion(manager, 'sequence');
        entry.status = 'started';
      }
      return { serial, status: entry.status, builtAt: entry.builtAt, movements: [] };
    });
  }

  async closeDaySettings(): Promise<CloseDaySettings> {
    return { closeDayTime: (await readSetting<string | null>(this.db.manager, CLOSE_DAY_TIME, null)) || null };
  }

  updateCloseDaySettings(settings: CloseDaySettings, actor: AuthenticatedUser): Promise<CloseDaySettings> {
    return this.db.write(async (manager) => {
      const before = (await readSetting<string | null>(manager, CLOSE_DAY_TIME, null)) || null;
      // An empty setting is "off": settings hold values, not nulls.
      await writeSetting(manager, CLOSE_DAY_TIME, settings.closeDayTime ?? '');
      await recordAudit(manager, {
        actorEmail: actor.email,
        action: 'update',
        entity: 'setting',
        entityKey: CLOSE_DAY_TIME,
        changes: { before, after: settings.closeDayTime },
      });
      return settings;
    });
  }

  /**
   * Backflushes the units in the order given (they share subassembly stock as the line does) and
   * marks them built, with one posting of all their movements: a day of 160 units is one ledger
   * write, not 160.
   */
  private async buildEntries(
    manager: EntityManager,
    entries: readonly SequenceEntryEntity[],
    context: BackflushContext,
    actor: AuthenticatedUser | null,
  ): Promise<BuildResponse[]> {
    const built = entries.find((entry) => entry.status === 'built');
    if (built) {
      throw new ConflictError(
        `Unit ${built.serial} was already reported built${built.builtAt ? ` at ${built.builtAt}` : ''}; nothing was consumed again.`,
        [{ serial: built.serial, builtAt: built.builtAt }],
        'already_built',
      );
    }
    const buildDate = this.today();
    const consumption = entries.map((entry) =>
      backflush(entry.model, entry.qty, buildDate, context.bom, context.parts, context.subassemblyStock),
    );
    // Each unit's movements in part-number order, the part numbers collated once for the whole day.
    const rank = partNumberRanks(consumption.flatMap((consumed) => [...consumed.keys()]));
    const movements: NewMovement[] = [];
    entries.forEach((entry, index) => {
      const consumed = [...consumption[index]].sort(([a], [b]) => rank.get(a)! - rank.get(b)!);
      for (const [partNumber, qty] of consumed) {
        movements.push({
          partNumber,
          qty: -qty,
          kind: 'backflush',
          userEmail: actor?.email ?? null,
          reason: `Built ${entry.serial} (${entry.model})`,
          refType: 'serial',
          ref: entry.serial,
        });
      }
    });
    const posted = await postMovements(manager, movements);
    const builtAt = new Date().toISOString();
    // Conditional on the status read, so two requests racing for one unit consume it once.
    let affected = 0;
    for (const chunk of chunks(entries.map((entry) => entry.id))) {
      const result = await manager.update(
        SequenceEntryEntity,
        { id: In(chunk), status: In(['planned', 'started']) },
        { status: 'built', builtAt },
      );
      affected += result.affected ?? 0;
    }
    if (affected !== entries.length)
      throw new ConflictError('A unit changed while it was being reported built; look again.');
    // The built units leave the sequence still to build: more than stock changed.
    if (entries.length > 0) await bumpPlanningVersion(manager, 'sequence');
    const bySerial = new Map<string, PostedMovement[]>();
    for (const movement of posted) {
      const list = bySerial.get(movement.ref!);
      if (list) list.push(movement);
      else bySerial.set(movement.ref!, [movement]);
    }
    return entries.map((entry) => ({
      serial: entry.serial,
      status: 'built',
      builtAt,
      movements: summarise(bySerial.get(entry.serial) ?? [], rank),
    }));
  }

  private async kitsOf(manager: EntityManager, entries: SequenceEntryEntity[]): Promise<Kit[]> {
    if (entries.length === 0) return [];
    const models = [...new Set(entries.map((entry) => entry.model))];
    const lines = await manager.find(BomLineEntity, { where: { parent: In(models) } });
    const partNumbers = [...new Set([...models, ...lines.map((line) => line.component)])];
    const parts = await manager.find(PartEntity, { where: { partNumber: In(partNumbers) } });
    const partByNumber = new Map(parts.map((part) => [part.partNumber, part]));
    return entries.map((entry) => {
      const groups = new Map<string | null, Kit['pointsOfUse'][number]['lines']>();
      for (const line of lines) {
        if (line.parent !== entry.model || !isEffective(line, entry.date)) continue;
        const part = partByNumber.get(line.component);
        const pointOfUse = part?.pointOfUse ?? null;
        const group = groups.get(pointOfUse) ?? [];
        group.push({
          partNumber: line.component,
          description: part?.description ?? '',
          uom: part?.uom ?? 'H87',
          qty: roundQty(line.qtyPer * entry.qty),
          source: part?.source ?? 'buy',
          hazardous: Boolean(part?.hazardous),
          unNumber: part?.unNumber ?? null,
          hazardClass: part?.hazardClass ?? null,
          sdsUrl: part?.sdsUrl ?? null,
          unitWeightKg: part?.unitWeightKg ?? null,
          heavyLift: Boolean(part?.heavyLift),
        });
        groups.set(pointOfUse, group);
      }
      const pointsOfUse = [...groups]
        .sort(([a], [b]) => (a === null ? 1 : b === null ? -1 : a.localeCompare(b)))
        .map(([pointOfUse, group]) => ({
          pointOfUse,
          lines: group.sort((a, b) => a.partNumber.localeCompare(b.partNumber)),
        }));
      return {
        serial: entry.serial,
        model: entry.model,
        modelDescription: partByNumber.get(entry.model)?.description ?? '',
        date: entry.date,
        sequence: entry.sequence,
        status: entry.status,
        pointsOfUse,
      };
    });
  }

  private async findEntry(manager: EntityManager, serial: string): Promise<SequenceEntryEntity> {
    const entry = await manager.findOneBy(SequenceEntryEntity, { serial });
    if (!entry) throw new NotFoundError(`No unit with serial ${serial} in the sequence.`);
    return entry;
  }

  private async builtBy(manager: EntityManager, serial: string): Promise<string | null> {
    const movement = await manager.findOne(StockMovementEntity, {
      where: { refType: 'serial', ref: serial, kind: 'backflush' },
      order: { id: 'DESC' },
    });
    return movement?.userEmail ?? null;
  }

  private assertOwnRecentBuild(entry: SequenceEntryEntity, actor: AuthenticatedUser, builtBy: string | null): void {
    const minutesAgo = entry.builtAt ? (Date.now() - new Date(entry.builtAt).getTime()) / 60_000 : Infinity;
    if (builtBy !== actor.email || minutesAgo > LINE_UNDO_MINUTES) {
      throw new ForbiddenError(
        `At the line you can undo only a unit you reported yourself in the last ${LINE_UNDO_MINUTES} minutes; ask the planner to undo ${entry.serial}.`,
      );
    }
  }
}
