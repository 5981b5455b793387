import { Between, In, type EntityManager } from 'typeorm';
import { addWorkingDays, nextWorkingDay, workingDaysBetween } from '../../shared/domain/calendar';
import { toDayNumber } from '../../shared/domain/date';
import type { IsoDate } from '../../shared/domain/types';
import {
  DEFAULT_BOARD_WORKING_DAYS,
  type AddSequenceUnitRequest,
  type ResequenceRequest,
  type ResequenceResponse,
  type SequenceBoard,
  type SequenceDay,
  type SequenceQuery,
  type SequenceSettings,
  type VersionedSequenceSettings,
  type SequenceUnit,
} from '../../shared/schemas/sequence';
import { AuditEventEntity } from '../audit/audit-event.entity';
import { recordAudit } from '../audit/audit.service';
import { UserEntity } from '../users/user.entity';
import { readCalendar } from '../calendar/calendar.service';
import { dayLoad, unitChangeProblem } from '../../shared/domain/sequence';
import { BadRequestError, ConflictError, NotFoundError } from '../errors';
import { PartEntity } from '../master-data/part.entity';
import { plantToday } from '../planning/plan-dates';
import { bumpPlanningVersion } from '../settings/versions';
import { SequenceEntryEntity } from './sequence-entry.entity';
import { readSequenceSettings, writeSequenceSettings } from './sequence-settings';
import { listDates, SequenceRules } from './sequence-window';
import { formatDay, formatTime } from '../../shared/format/dates';
import type { Database } from '../db/database';
import { assertCurrent, versionOf, withVersion } from '../http/versions';

/** The board shows at most a year at once; more is a slip of the year digit. */
const MAX_BOARD_CALENDAR_DAYS = 366;

interface Actor {
  email: string;
}

interface Move {
  serial: string;
  model: string;
  from: { date: string; sequence: number };
  to: { date: string; sequence: number };
}

function toUnit(entry: SequenceEntryEntity): SequenceUnit {
  return {
    id: entry.id,
    date: entry.date,
    sequence: entry.sequence,
    model: entry.model,
    serial: entry.serial,
    qty: entry.qty,
    status: entry.status,
    builtAt: entry.builtAt,
  };
}

function sameOrder(left: readonly string[], right: readonly string[]): boolean {
  return left.length === right.length && left.every((serial, index) => serial === right[index]);
}

function groupByDate(entries: SequenceEntryEntity[]): Map<string, SequenceEntryEntity[]> {
  const byDate = new Map<string, SequenceEntryEntity[]>();
  for (const entry of [...entries].sort((a, b) => a.date.localeCompare(b.date) || a.sequence - b.sequence)) {
    const day = byDate.get(entry.date) ?? [];
    day.push(entry);
    byDate.set(entry.date, day);
  }
  return byDate;
}

/** The version of a day's order: its serials and quantities, in build order. */
function dayVersion(entries: readonly SequenceEntryEntity[]): string {
  return versionOf([...entries].sort((a, b) => a.sequence - b.sequence).map((entry) => [entry.serial, entry.qty]));
}

/** Who last changed one of these days of the sequence, and when (from the audit trail). */
async function lastSequenceChange(
  manager: EntityManager,
  dates: IsoDate[],
): Promise<{ by: string; at: string; action: string } | null> {
  const recent = await manager.find(AuditEventEntity, {
    where: { entity: In(['sequence', 'sequence-unit', 'import']) },
    order: { id: 'DESC' },
    take: 100,
  });
  const event = recent.find((candidate) => {
    const changes = candidate.changes as { days?: string[]; date?: string } | null;
    const touched = [...(changes?.days ?? []), ...(changes?.date ? [changes.date] : [])];
    return touched.some((date) => dates.includes(date)) || candidate.entityKey === 'schedule';
  });
  if (!event) return null;
  const user = event.actorEmail ? await manager.findOneBy(UserEntity, { email: event.actorEmail }) : null;
  return { by: user?.name ?? event.actorEmail ?? 'Cardloop', at: event.at, action: event.action };
}

function frozenWindowError(rules: SequenceRules, dates: IsoDate[]): ConflictError {
  return new ConflictError(
    rules.frozenMessage(dates),
    dates.map((date) => ({ date, past: rules.isPast(date) })),
    'frozen_window',
  );
}

function overCapacityError(overloaded: { date: string; load: number; capacity: number }[]): ConflictError {
  const sentences = overloaded.map(
    ({ date, load, capacity }) =>
      `${listDates([date])} would hold ${load} units, over the daily capacity of ${capacity}`,
  );
  return new ConflictError(`${sentences.join('; ')}.`, overloaded, 'over_capacity');
}

/**
 * The planner's build sequence: the board by day, resequencing by drag, adding and removing
 * units. Every change runs in one transaction with its audit event and bumps the planning
 * version, so plans and open screens pick it up.
 */
export class SequenceService {
  constructor(
    private readonly db: Database,
    private readonly today: () => IsoDate = plantToday,
  ) {}

  private async rules(manager: EntityManager): Promise<SequenceRules> {
    return new SequenceRules(await readCalendar(manager), await readSequenceSettings(manager), this.today());
  }

  private describeDay(rules: SequenceRules, date: IsoDate, entries: SequenceEntryEntity[]): SequenceDay {
    const units = entries.map(toUnit);
    return {
      date,
      working: rules.isWorking(date),
      frozen: rules.isFrozen(date),
      past: rules.isPast(date),
      capacity: rules.settings.dailyCapacity,
      load: dayLoad(units),
      units,
      version: dayVersion(entries),
    };
  }

  /**
   * Refuses a change made on a stale board: a day whose order changed since the planner's board
   * showed it answers 409 `stale` with the day as it is now and who changed it last.
   */
  private async assertDaysCurrent(
    manager: EntityManager,
    rules: SequenceRules,
    basedOn: { date: IsoDate; version: string }[],
    loaded: SequenceEntryEntity[],
  ): Promise<void> {
    if (basedOn.length === 0) return;
    const dates = [...new Set(basedOn.map((day) => day.date))];
    const missing = dates.filter((date) => !loaded.some((entry) => entry.date === date));
    const extra = missing.length > 0 ? await manager.find(SequenceEntryEntity, { where: { date: In(missing) } }) : [];
    const byDate = groupByDate([...loaded.filter((entry) => dates.includes(entry.date)), ...extra]);
    const stale = basedOn
      .filter((day) => dayVersion(byDate.get(day.date) ?? []) !== day.version)
      .map((day) => day.date);
    if (stale.length === 0) return;
    const lastChange = await lastSequenceChange(manager, stale);
    const who = lastChange ? ` ${lastChange.by} changed it at ${formatTime(lastChange.at)}.` : '';
    throw new ConflictError(
      `${listDates(stale)} changed since your board was loaded.${who} The board shows it as it is now; make your move again.`,
      [{ days: stale.map((date) => this.describeDay(rules, date, byDate.get(date) ?? [])), lastChange }],
      'stale',
    );
  }

  /** GET /api/sequence: every working day in the range, plus any non-working day still holding units. */
  async board(query: SequenceQuery): Promise<SequenceBoard> {
    const manager = this.db.manager;
    const rules = await this.rules(manager);
    const from = query.from ?? rules.today;
    const to =
      query.to ??
      addWorkingDays(
        nextWorkingDay(from, rules.working),
        (query.days ?? DEFAULT_BOARD_WORKING_DAYS) - 1,
        rules.working,
      );
    if (to < from)
      throw new BadRequestError('to is before from.', [{ path: ['to'], message: 'must not be before from' }]);
    if (toDayNumber(to) - toDayNumber(from) > MAX_BOARD_CALENDAR_DAYS) {
      throw new BadRequestError(`Show at most ${MAX_BOARD_CALENDAR_DAYS} days at once.`, [
        { path: ['to'], message: `at most ${MAX_BOARD_CALENDAR_DAYS} days after from` },
      ]);
    }
    const entries = await manager.find(SequenceEntryEntity, { where: { date: Between(from, to) } });
    const byDate = groupByDate(entries);
    const dates = [...new Set([...workingDaysBetween(from, to, rules.working), ...byDate.keys()])].sort();
    const models = await manager.find(PartEntity, { where: { source: 'end_item' }, order: { partNumber: 'ASC' } });
    return {
      from,
      to,
      today: rules.today,
      frozenUntil: rules.frozenUntil,
      frozenWindowDays: rules.settings.frozenWindowDays,
      dailyCapacity: rules.settings.dailyCapacity,
      days: dates.map((date) => this.describeDay(rules, date, byDate.get(date) ?? [])),
      models: models.map((model) => ({ partNumber: model.partNumber, description: model.description })),
    };
  }

  async settings(): Promise<VersionedSequenceSettings> {
    return withVersion(await readSequenceSettings(this.db.manager));
  }

  /** The frozen window and capacity feed line risk and every open board, so they bump the planning version. */
  updateSettings(settings: SequenceSettings, actor: Actor, basedOn?: string): Promise<VersionedSequenceSettings> {
    return this.db.write(async (manager) => {
      const before = await readSequenceSettings(manager);
      assertCurrent(basedOn, withVersion(before), 'The frozen window and capacity');
      await writeSequenceSettings(manager, settings);
      await recordAudit(manager, {
        actorEmail: actor.email,
        action: 'update',
        entity: 'sequence-settings',
        entityKey: 'plant',
        changes: { before, after: settings },
      });
      await bumpPlanningVersion(manager, 'sequence');
      return withVersion(await readSequenceSettings(manager));
    });
  }

  /**
   * PUT /api/sequence/days: each listed day takes exactly the serials given, in that order.
   * A unit named on a day it is not on moves there, and the day it leaves closes up. Units of a
   * listed day must all be named somewhere (removing is DELETE's job). Only days whose order
   * really changes count as touched for the frozen window and capacity.
   */
  resequence(request: ResequenceRequest, actor: Actor): Promise<ResequenceResponse> {
    return this.db.write(async (manager) => {
      const rules = await this.rules(manager);
      const named = new Set(request.days.flatMap((day) => day.serials));
      const namedEntries =
        named.size > 0 ? await manager.find(SequenceEntryEntity, { where: { serial: In([...named]) } }) : [];
      const known = new Set(namedEntries.map((entry) => entry.serial));
      const unknown = request.days.flatMap((day, dayIndex) =>
        day.serials.flatMap((serial, serialIndex) =>
          known.has(serial) ? [] : [{ serial, path: ['days', dayIndex, 'serials', serialIndex] }],
        ),
      );
      if (unknown.length > 0) {
        throw new BadRequestError(
          `Not in the sequence: ${unknown.map(({ serial }) => serial).join(', ')}.`,
          unknown.map(({ serial, path }) => ({ path, message: `no unit with serial '${serial}'` })),
        );
      }

      const listed = new Map(request.days.map((day) => [day.date, day.serials]));
      const affected = [...new Set([...listed.keys(), ...namedEntries.map((entry) => entry.date)])];
      const entries = await manager.find(SequenceEntryEntity, { where: { date: In(affected) } });
      await this.assertDaysCurrent(manager, rules, request.basedOn ?? [], entries);
      const bySerial = new Map(entries.map((entry) => [entry.serial, entry]));
      const before = new Map<string, string[]>(affected.map((date) => [date, []]));
      for (const [date, dayEntries] of groupByDate(entries))
        before.set(
          date,
          dayEntries.map((entry) => entry.serial),
        );

      const missing = request.days.flatMap((day, dayIndex) =>
        (before.get(day.date) ?? [])
          .filter((serial) => !named.has(serial))
          .map((serial) => ({
            path: ['days', dayIndex, 'serials'],
            message: `unit '${serial}' of ${formatDay(day.date)} is missing; name it on a day or remove it`,
          })),
      );
      if (missing.length > 0) {
        throw new BadRequestError(
          `Every unit of a listed day must keep a place: ${missing.map((issue) => issue.message).join('; ')}.`,
          missing,
        );
      }

      const after = new Map<string, string[]>(
        affected.map((date) => [
          date,
          listed.get(date) ?? (before.get(date) ?? []).filter((serial) => !named.has(serial)),
        ]),
      );
      const changed = affected.filter((date) => !sameOrder(before.get(date) ?? [], after.get(date) ?? [])).sort();
      if (changed.length === 0) return { days: [] };

      this.checkDates(rules, request, changed, before, after);
      const locked = changed.flatMap((date) =>
        after.get(date)!.flatMap((serial, index) => {
          const entry = bySerial.get(serial)!;
          const problem = unitChangeProblem(toUnit(entry), { ...toUnit(entry), date, sequence: index + 1 });
          const dayIndex = request.days.findIndex((day) => day.date === date);
          return problem ? [{ path: ['days', Math.max(dayIndex, 0), 'serials'], message: problem }] : [];
        }),
      );
      if (locked.length > 0)
        throw new ConflictError(
          `Units at the line stay put: ${locked.map((issue) => issue.message).join('; ')}.`,
          locked,
        );
      const frozen = changed.filter((date) => rules.isFrozen(date));
      if (frozen.length > 0 && !request.allowFrozen) throw frozenWindowError(rules, frozen);
      const capacity = rules.settings.dailyCapacity;
      const loads = (serials: string[]) => dayLoad(serials.map((serial) => bySerial.get(serial)!));
      const overloaded = changed
        .map((date) => ({ date, load: loads(after.get(date)!), was: loads(before.get(date) ?? []), capacity }))
        .filter(({ load, was }) => load > capacity && load > was)
        .map(({ date, load }) => ({ date, load, capacity }));
      if (overloaded.length > 0) throw overCapacityError(overloaded);

      const moves: Move[] = [];
      for (const date of changed) {
        for (const [index, serial] of after.get(date)!.entries()) {
          const entry = bySerial.get(serial)!;
          if (entry.date === date && entry.sequence === index + 1) continue;
          moves.push({
            serial,
            model: entry.model,
            from: { date: entry.date, sequence: entry.sequence },
            to: { date, sequence: index + 1 },
          });
          await manager.update(SequenceEntryEntity, { id: entry.id }, { date, sequence: index + 1 });
          entry.date = date;
          entry.sequence = index + 1;
        }
      }
      await recordAudit(manager, {
        actorEmail: actor.email,
        action: 'resequence',
        entity: 'sequence',
        entityKey: changed.length === 1 ? changed[0] : `${changed[0]}..${changed[changed.length - 1]}`,
        changes: { days: changed, moves, ...(frozen.length > 0 && { frozenDaysChanged: frozen }) },
      });
      await bumpPlanningVersion(manager, 'sequence');
      return {
        days: changed.map((date) =>
          this.describeDay(
            rules,
            date,
            after.get(date)!.map((serial) => bySerial.get(serial)!),
          ),
        ),
      };
    });
  }

  /** A day off the calendar (or out of range) may only lose units; it never takes or reorders them. */
  private checkDates(
    rules: SequenceRules,
    request: ResequenceRequest,
    changed: string[],
    before: Map<string, string[]>,
    after: Map<string, string[]>,
  ): void {
    const issues = changed.flatMap((date) => {
      const problem = rules.dateProblem(date);
      if (!problem) return [];
      const kept = new Set(after.get(date));
      const onlyLoses = sameOrder(
        (before.get(date) ?? []).filter((serial) => kept.has(serial)),
        after.get(date) ?? [],
      );
      if (onlyLoses) return [];
      const dayIndex = request.days.findIndex((day) => day.date === date);
      return [{ path: ['days', dayIndex, 'date'], message: problem }];
    });
    if (issues.length > 0)
      throw new BadRequestError(`Units cannot go there: ${issues.map((issue) => issue.message).join('; ')}.`, issues);
  }

  /** POST /api/sequence/units: a new unit at the end of a day, checked as the schedule import checks a row. */
  addUnit(request: AddSequenceUnitRequest, actor: Actor): Promise<SequenceUnit> {
    return this.db.write(async (manager) => {
      const rules = await this.rules(manager);
      const qty = request.qty ?? 1;
      const issues: { path: string[]; message: string }[] = [];
      const dateProblem = rules.dateProblem(request.date);
      if (dateProblem) issues.push({ path: ['date'], message: dateProblem });
      const part = await manager.findOneBy(PartEntity, { partNumber: request.model });
      if (!part) issues.push({ path: ['model'], message: `unknown model '${request.model}'` });
      else if (part.source !== 'end_item')
        issues.push({ path: ['model'], message: `'${request.model}' is a ${part.source} part, not an end item` });
      if (issues.length > 0) throw new BadRequestError(issues.map((issue) => issue.message).join('; '), issues);

      const taken = await manager.findOneBy(SequenceEntryEntity, { serial: request.serial });
      if (taken) {
        throw new ConflictError(
          `Serial ${request.serial} is already in the sequence (${formatDay(taken.date)}, position ${taken.sequence}).`,
          [{ path: ['serial'], message: `already used on ${formatDay(taken.date)}, position ${taken.sequence}` }],
        );
      }
      if (rules.isFrozen(request.date) && !request.allowFrozen) throw frozenWindowError(rules, [request.date]);
      const day = await manager.find(SequenceEntryEntity, {
        where: { date: request.date },
        order: { sequence: 'ASC' },
      });
      const load = dayLoad(day) + qty;
      const capacity = rules.settings.dailyCapacity;
      if (load > capacity) throw overCapacityError([{ date: request.date, load, capacity }]);

      const sequence = day.reduce((last, entry) => Math.max(last, entry.sequence), 0) + 1;
      const entry = await manager.save(
        manager.create(SequenceEntryEntity, {
          date: request.date,
          sequence,
          model: request.model,
          serial: request.serial,
          qty,
        }),
      );
      await recordAudit(manager, {
        actorEmail: actor.email,
        action: 'create',
        entity: 'sequence',
        entityKey: entry.serial,
        changes: {
          date: entry.date,
          sequence,
          model: entry.model,
          qty,
          ...(rules.isFrozen(entry.date) && { frozenDayChanged: entry.date }),
        },
      });
      await bumpPlanningVersion(manager, 'sequence');
      return toUnit(entry);
    });
  }

  /** DELETE /api/sequence/units/:serial: the unit leaves and the units behind it close up. */
  removeUnit(serial: string, allowFrozen: boolean, actor: Actor): Promise<void> {
    return this.db.write(async (manager) => {
      const rules = await this.rules(manager);
      const entry = await manager.findOneBy(SequenceEntryEntity, { serial });
      if (!entry) throw new NotFoundError(`No unit with serial ${serial} in the sequence.`);
      const locked = unitChangeProblem(toUnit(entry), null);
      if (locked) throw new ConflictError(`${locked[0].toUpperCase()}${locked.slice(1)}.`);
      if (rules.isFrozen(entry.date) && !allowFrozen) throw frozenWindowError(rules, [entry.date]);

      await manager.delete(SequenceEntryEntity, { id: entry.id });
      const rest = await manager.find(SequenceEntryEntity, { where: { date: entry.date }, order: { sequence: 'ASC' } });
      for (const [index, unit] of rest.entries()) {
        if (unit.sequence !== index + 1)
          await manager.update(SequenceEntryEntity, { id: unit.id }, { sequence: index + 1 });
      }
      await recordAudit(manager, {
        actorEmail: actor.email,
        action: 'delete',
        entity: 'sequence',
        entityKey: serial,
        changes: {
          date: entry.date,
          sequence: entry.sequence,
          model: entry.model,
          qty: entry.qty,
          ...(rules.isFrozen(entry.date) && { frozenDayChanged: entry.date }),
        },
      });
      await bumpPlanningVersion(manager, 'sequence');
    });
  }
}
