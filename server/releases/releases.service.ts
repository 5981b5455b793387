import { In, QueryFailedError, type EntityManager } from 'typeorm';
import { addWorkingDays, nextWorkingDay, toWorkingCalendar } from '../../shared/domain/calendar';
import { releaseNumber } from '../../shared/domain/release-rules';
import { partTerms } from '../../shared/domain/supplier-timing';
import { supplierTerms } from '../../shared/schemas/master-data';
import type { ShipNotice } from '../../shared/schemas/ship-notices';
import type {
  Release,
  ReleaseJobSettings,
  ReleaseLine,
  ReleaseLineOrigin,
  ReleasesQuery,
  ReleaseStatus,
  RunReleasesResponse,
} from '../../shared/schemas/releases';
import { recordAudit } from '../audit/audit.service';
import { assertCurrent, versionOf } from '../http/versions';
import { readCalendar } from '../calendar/calendar.service';
import { issueConfirmationToken, revokeConfirmationTokens } from './confirmation-tokens';
import { ConflictError, NotFoundError } from '../errors';
import { applyCardEvent } from '../loops/card-events';
import { KanbanCardEntity } from '../loops/kanban-card.entity';
import { OutboxMessageEntity } from '../outbox/outbox-message.entity';
import { enqueueMail, toOutboxMessage } from '../outbox/outbox.service';
import type { AuthenticatedUser } from '../http/request-user';
import { PartEntity } from '../master-data/part.entity';
import { DEFAULT_HORIZON_WORKING_DAYS } from '../planning/plan-dates';
import { OPEN_RELEASE_STATES } from '../planning/plan-inputs';
import type { PlanningService } from '../planning/planning.service';
import { readSetting, writeSetting } from '../settings/settings';
import { SupplierEntity } from '../master-data/supplier.entity';
import {
  groupBySupplier,
  kanbanLines,
  lineKey,
  plannedLines,
  readEmptyCardSignals,
  type DraftLine,
  type ScheduledPart,
} from './release-builder';
import { composeReleaseMail } from './release-mail';
import { ReleaseLineEntity } from './release-line.entity';
import { ReleaseEntity } from './release.entity';
import { releasesChanged } from './release-events';
import { readLineTiming } from './line-timing';
import type { Database } from '../db/database';

export const RELEASE_JOB_TIME = 'releases.jobTime';
export const RELEASE_JOB_LAST_RUN = 'releases.lastRunDate';
export const DEFAULT_RELEASE_JOB_TIME = '06:00';
const PLANT_NAME = 'plant.name';
export const DEFAULT_PLANT_NAME = 'Cardloop demo plant';

/** The longest plan a run asks for, in working days (about a year). */
const MAX_RUN_HORIZON_WORKING_DAYS = 250;

/** Releases the buyer may still ask the supplier about: the link can be sent (again). */
const RESENDABLE: ReleaseStatus[] = ['draft', 'sent', 'exception'];
/** Nothing has been received against these yet, so they can be called off. */
const CANCELLABLE: ReleaseStatus[] = ['draft', 'sent', 'confirmed', 'exception', 'shipped'];

export interface ReleasesServiceOptions {
  /** Base of the confirmation links in the e-mails, e.g. `https://cardloop.example.com`. */
  appUrl: string;
  /** The ship notices of a set of releases, by release id (the ship-notices feature owns them). */
  readShipNotices: (manager: EntityManager, releases: ReleaseEntity[]) => Promise<Map<number, ShipNotice[]>>;
}

/** Who acts: a signed-in user, or null for the scheduled job. */
export type ReleaseActor = AuthenticatedUser | null;

function isUniqueViolation(error: unknown): boolean {
  if (!(error instanceof QueryFailedError)) return false;
  const driverError = error.driverError as { code?: string } | undefined;
  return driverError?.code === '23505' || /UNIQUE constraint failed/i.test(error.message);
}

/** The outbox reference of a release's e-mails. */
export function releaseNoticeRef(number: string): string {
  return `release:${number}`;
}

function actorOf(actor: ReleaseActor): string {
  return actor?.email ?? 'job:releases';
}

/** The plant's name as suppliers know it; a setting so an install can name itself. */
export function readPlantName(manager: EntityManager): Promise<string> {
  return readSetting<string>(manager, PLANT_NAME, DEFAULT_PLANT_NAME);
}

/**
 * Builds, sends and manages supplier releases: one per supplier per day, from empty kanban cards
 * and from the planned releases of scheduled parts that are due.
 */
export class ReleasesService {
  private readonly appUrl: string;
  /** Runs through this service go one after another; a run elsewhere (the job's own service, another instance) is met by the unique index. */
  private running: Promise<unknown> = Promise.resolve();

  constructor(
    private readonly db: Database,
    private readonly planning: PlanningService,
    private readonly options: ReleasesServiceOptions,
  ) {
    this.appUrl = options.appUrl.replace(/\/+$/, '');
  }

  /** Builds and sends the releases of `date`; a day already released gets nothing new. */
  run(date: string, actor: ReleaseActor): Promise<RunReleasesResponse> {
    const next = this.running.then(() =>
      // Another process (a second instance, or the job beside "Run now") may release the same
      // supplier and day first; the unique index turns that into a failed insert, and running again
      // then finds the day released and creates nothing.
      this.runOnce(date, actor).catch((error: unknown) => {
        if (!isUniqueViolation(error)) throw error;
        return this.runOnce(date, actor);
      }),
    );
    this.running = next.catch(() => undefined);
    return next;
  }

  private async runOnce(date: string, actor: ReleaseActor): Promise<RunReleasesResponse> {
    const planned = await this.duePlannedLines(date);
    const created = await this.db.write(async (manager) => {
      const calendar = toWorkingCalendar(await readCalendar(manager));
      const existing = await manager.find(ReleaseEntity, {
        where: { releaseDate: date, reference: '' },
        order: { number: 'ASC' },
      });
      const releasedSuppliers = new Set(existing.map((release) => release.supplierCode));
      const lines = [...kanbanLines(await readEmptyCardSignals(manager), date, calendar), ...planned].filter(
        (line) => !releasedSuppliers.has(line.supplierCode),
      );
      const supplierCodes = [...new Set(lines.map((line) => line.supplierCode))];
      const suppliers = supplierCodes.length
        ? await manager.find(SupplierEntity, { where: { code: In(supplierCodes) } })
        : [];
      const supplierByCode = new Map(suppliers.map((supplier) => [supplier.code, supplier]));
      const plantName = await readPlantName(manager);

      const releaseIds: number[] = [];
      for (const [supplierCode, supplierLines] of groupBySupplier(lines)) {
        const supplier = supplierByCode.get(supplierCode);
        if (!supplier) continue;
        const release = await this.createRelease(manager, supplier, date, supplierLines, actor);
        await this.sendRelease(manager, release, supplier, plantName, false);
        releaseIds.push(release.id);
      }
      await recordAudit(manager, {
        actorEmail: actorOf(actor),
        action: 'run',
        entity: 'release_run',
        entityKey: date,
        changes: {
          created: releaseIds.length,
          lines: lines.length,
          alreadyReleased: existing.map((release) => release.number),
        },
      });
      // Open lines are scheduled receipts of the plan from now on.
      if (releaseIds.length > 0) await releasesChanged(manager);
      return { releaseIds, existing: existing.map((release) => release.number) };
    });
    const made = created.releaseIds.length
      ? await this.db.manager.find(ReleaseEntity, {
          where: { id: In(created.releaseIds) },
          order: { number: 'ASC' },
        })
      : [];
    return { date, releases: await this.describe(this.db.manager, made), existing: created.existing };
  }

  /**
   * Planned lines due by `date`. The plan starts on the release date (on-hand counts at its start)
   * and reaches far enough that every release dated up to it is known: a component's release
   * depends on its parents' releases up to a cumulative lead time later.
   */
  private async duePlannedLines(date: string): Promise<DraftLine[]> {
    let plan = await this.planning.plan(date);
    const calendar = toWorkingCalendar(plan.inputs.calendar);
    const longestLeadTime = Math.max(0, ...plan.inputs.parts.map((part) => part.leadTimeDays));
    const deepestLevel = Math.max(0, ...[...plan.result.parts.values()].map((part) => part.lowLevelCode));
    const needed = Math.min(MAX_RUN_HORIZON_WORKING_DAYS, longestLeadTime * (deepestLevel + 1) + 1);
    if (needed > Math.max(DEFAULT_HORIZON_WORKING_DAYS, plan.result.days.length)) {
      plan = await this.planning.plan(date, addWorkingDays(nextWorkingDay(date, calendar), needed - 1, calendar));
    }
    const suppliers = await this.db.manager.find(SupplierEntity);
    const termsByCode = new Map(suppliers.map((supplier) => [supplier.code, supplierTerms(supplier)]));
    const parts: ScheduledPart[] = plan.inputs.parts
      .filter((part) => part.source === 'buy' && part.replenishment === 'scheduled' && part.supplierCode)
      .filter((part) => termsByCode.has(part.supplierCode!))
      .map((part) => ({
        partNumber: part.partNumber,
        supplierCode: part.supplierCode!,
        terms: partTerms(termsByCode.get(part.supplierCode!)!, part.leadTimeDays),
      }));
    return plannedLines(plan.result, parts, date, calendar, await this.openPlanLineKeys());
  }

  /** Need dates already on order for planned parts: a release the plan still shows for them is not ordered twice. */
  private async openPlanLineKeys(): Promise<Set<string>> {
    const rows = await this.db.manager
      .getRepository(ReleaseLineEntity)
      .createQueryBuilder('line')
      .innerJoin(ReleaseEntity, 'release', 'release.id = line.releaseId')
      .select('line.partNumber', 'partNumber')
      .addSelect('line.needDate', 'needDate')
      .where('line.origin = :origin', { origin: 'plan' })
      .andWhere('line.closed = :closed', { closed: false })
      .andWhere('release.status IN (:...states)', { states: ['draft', ...OPEN_RELEASE_STATES] })
      .getRawMany<{ partNumber: string; needDate: string }>();
    return new Set(rows.map((row) => lineKey(row.partNumber, row.needDate)));
  }

  private async createRelease(
    manager: EntityManager,
    supplier: SupplierEntity,
    date: string,
    lines: DraftLine[],
    actor: ReleaseActor,
  ): Promise<ReleaseEntity> {
    const release = await manager.save(
      manager.create(ReleaseEntity, {
        number: releaseNumber(supplier.code, date),
        supplierCode: supplier.code,
        releaseDate: date,
        status: 'draft',
        sentAt: null,
        confirmedAt: null,
        carrier: null,
        trackingNumber: null,
        supplierNote: null,
      }),
    );
    const cardNumbers: string[] = [];
    for (const draft of lines) {
      const line = await manager.save(
        manager.create(ReleaseLineEntity, {
          releaseId: release.id,
          partNumber: draft.partNumber,
          qty: draft.qty,
          needDate: draft.needDate,
          requestedQty: draft.qty,
          requestedDate: draft.needDate,
          expedite: draft.expedite,
          arrivalDate: null,
          origin: draft.origin,
          cardId: draft.cardId,
          confirmedQty: null,
          shipDate: null,
          receivedQty: 0,
          closed: false,
        }),
      );
      if (draft.cardId !== null) {
        const card = await manager.findOneByOrFail(KanbanCardEntity, { id: draft.cardId });
        await applyCardEvent(manager, card, 'release', actor?.email ?? null);
        await manager.update(KanbanCardEntity, { id: card.id }, { releaseLineId: line.id });
        cardNumbers.push(card.cardNumber);
      }
    }
    await recordAudit(manager, {
      actorEmail: actorOf(actor),
      action: 'create',
      entity: 'release',
      entityKey: release.number,
      changes: {
        supplierCode: supplier.code,
        releaseDate: date,
        lines: lines.map((line) => ({
          partNumber: line.partNumber,
          qty: line.qty,
          needDate: line.needDate,
          origin: line.origin,
          expedite: line.expedite,
        })),
        cards: cardNumbers,
      },
    });
    return release;
  }

  /** Issues a fresh link, queues the e-mail and marks the release sent, inside the caller's transaction. */
  private async sendRelease(
    manager: EntityManager,
    release: ReleaseEntity,
    supplier: SupplierEntity,
    plantName: string,
    resent: boolean,
  ): Promise<void> {
    const now = new Date();
    const { token, expiresAt } = await issueConfirmationToken(manager, release.id, now);
    const lines = await manager.find(ReleaseLineEntity, {
      where: { releaseId: release.id },
      order: { needDate: 'ASC', id: 'ASC' },
    });
    const parts = await this.partsOf(
      manager,
      lines.map((line) => line.partNumber),
    );
    await enqueueMail(manager, {
      ref: releaseNoticeRef(release.number),
      ...composeReleaseMail({
        number: release.number,
        releaseDate: release.releaseDate,
        supplierName: supplier.name,
        supplierEmail: supplier.email,
        plantName,
        link: `${this.appUrl}/confirm/${token}`,
        expiresAt,
        resent,
        transitDays: supplier.transitDays,
        lines: lines.map((line) => {
          const part = parts.get(line.partNumber);
          return {
            partNumber: line.partNumber,
            description: part?.description ?? '',
            qty: line.qty,
            uom: part?.uom ?? 'H87',
            needDate: line.needDate,
            hazardous: part?.hazardous ?? false,
            expedite: Boolean(line.expedite),
            unNumber: part?.unNumber ?? null,
            hazardClass: part?.hazardClass ?? null,
            unitWeightKg: part?.unitWeightKg ?? null,
            heavyLift: part?.heavyLift ?? false,
          };
        }),
      }),
    });
    release.status = 'sent';
    release.sentAt = now.toISOString();
    await manager.update(ReleaseEntity, { id: release.id }, { status: release.status, sentAt: release.sentAt });
  }

  async list(query: ReleasesQuery, user: AuthenticatedUser): Promise<Release[]> {
    const manager = this.db.manager;
    if (user.role === 'supplier' && !user.supplierCode) return [];
    const releases = await manager.find(ReleaseEntity, {
      where: {
        ...(query.status && { status: query.status }),
        ...(query.date && { releaseDate: query.date }),
        ...(user.role === 'supplier' && { supplierCode: user.supplierCode! }),
      },
      order: { releaseDate: 'DESC', number: 'ASC' },
      take: 500,
    });
    return this.describe(manager, releases);
  }

  async get(number: string, user: AuthenticatedUser): Promise<Release> {
    const release = await this.findVisible(this.db.manager, number, user);
    return (await this.describe(this.db.manager, [release]))[0];
  }

  /** Sends the release again with a new link; earlier links stop working. An exception goes back to waiting for an answer. */
  async resend(number: string, actor: AuthenticatedUser): Promise<Release> {
    await this.db.write(async (manager) => {
      const release = await this.findRelease(manager, number);
      if (!RESENDABLE.includes(release.status as ReleaseStatus)) {
        throw new ConflictError(
          `Release ${number} is ${release.status}; only a release waiting for or disputing an answer can be sent again.`,
          [{ status: release.status }],
        );
      }
      const supplier = await manager.findOneBy(SupplierEntity, { code: release.supplierCode });
      if (!supplier)
        throw new ConflictError(`Supplier ${release.supplierCode} no longer exists; the release cannot be sent.`);
      const before = {
        status: release.status,
        carrier: release.carrier,
        trackingNumber: release.trackingNumber,
        supplierNote: release.supplierNote,
      };
      const proposal = (await manager.find(ReleaseLineEntity, { where: { releaseId: release.id } })).map((line) => ({
        id: line.id,
        confirmedQty: line.confirmedQty,
        shipDate: line.shipDate,
      }));
      // The supplier answers afresh: a disputed answer is kept in the audit trail, not on the lines.
      await manager.update(ReleaseLineEntity, { releaseId: release.id }, { confirmedQty: null, shipDate: null });
      Object.assign(release, { confirmedAt: null, carrier: null, trackingNumber: null, supplierNote: null });
      await manager.save(release);
      await this.sendRelease(manager, release, supplier, await readPlantName(manager), true);
      await recordAudit(manager, {
        actorEmail: actor.email,
        action: 'resend',
        entity: 'release',
        entityKey: number,
        changes: { before, previousAnswer: before.status === 'exception' ? proposal : undefined, to: supplier.email },
      });
      await releasesChanged(manager);
    });
    return this.get(number, actor);
  }

  /** The release's latest e-mail is tried again at once; nothing else changes. */
  async sendNoticeAgain(number: string, actor: AuthenticatedUser): Promise<Release> {
    const release = await this.findRelease(this.db.manager, number);
    const notice = await this.db.manager.findOne(OutboxMessageEntity, {
      where: { ref: releaseNoticeRef(release.number) },
      order: { id: 'DESC' },
    });
    if (!notice) throw new NotFoundError(`Release ${number} has no e-mail yet.`);
    await this.db.write(async (manager) => {
      if (notice.status !== 'sent') {
        await manager.update(OutboxMessageEntity, { id: notice.id }, { nextAttemptAt: new Date().toISOString() });
      }
      await recordAudit(manager, {
        actorEmail: actor.email,
        action: 'send-again',
        entity: 'release',
        entityKey: number,
        changes: { noticeId: notice.id, status: notice.status },
      });
    });
    return this.get(number, actor);
  }

  /**
   * Calls a release off before anything was received. Its kanban cards go back to empty, so the
   * next day's run orders them again (this day's release exists, cancelled, and a day has one).
   */
  async cancel(number: string, actor: AuthenticatedUser): Promise<Release> {
    await this.db.write(async (manager) => {
      const release = await this.findRelease(manager, number);
      const lines = await manager.find(ReleaseLineEntity, { where: { releaseId: release.id } });
      if (!CANCELLABLE.includes(release.status as ReleaseStatus) || lines.some((line) => line.receivedQty > 0)) {
        throw new ConflictError(
          `Release ${number} is ${release.status}; only a release with nothing received can be cancelled.`,
          [{ status: release.status }],
        );
      }
      const cardIds = lines.map((line) => line.cardId).filter((id): id is number => id !== null);
      const cards = cardIds.length
        ? await manager.find(KanbanCardEntity, { where: { id: In(cardIds), state: In(['ordered', 'shipped']) } })
        : [];
      const now = new Date().toISOString();
      for (const card of cards) {
        // Only a card still travelling for this release comes back; one already reused is left alone.
        if (card.releaseLineId !== null && !lines.some((line) => line.id === card.releaseLineId)) continue;
        await manager.update(
          KanbanCardEntity,
          { id: card.id },
          { state: 'empty', stateChangedAt: now, releaseLineId: null },
        );
      }
      await manager.update(ReleaseLineEntity, { releaseId: release.id }, { closed: true });
      await revokeConfirmationTokens(manager, release.id);
      const before = release.status;
      release.status = 'cancelled';
      await manager.save(release);
      await recordAudit(manager, {
        actorEmail: actor.email,
        action: 'cancel',
        entity: 'release',
        entityKey: number,
        changes: { before, cardsBackToEmpty: cards.map((card) => card.cardNumber) },
      });
      await releasesChanged(manager);
    });
    return this.get(number, actor);
  }

  /** The buyer takes the supplier's proposal: the answered quantities and dates become the firm ones. */
  async acceptException(number: string, actor: AuthenticatedUser): Promise<Release> {
    await this.db.write(async (manager) => {
      const release = await this.findRelease(manager, number);
      if (release.status !== 'exception') {
        throw new ConflictError(`Release ${number} is ${release.status}; only an exception can be accepted.`, [
          { status: release.status },
        ]);
      }
      release.status = 'confirmed';
      await manager.save(release);
      // The answer becomes the order: the plan, line risk and dock read the new quantity and arrival,
      // while requested_qty and requested_date keep what was first asked for the scorecard.
      await manager
        .createQueryBuilder()
        .update(ReleaseLineEntity)
        .set({ qty: () => 'confirmed_qty', needDate: () => 'arrival_date' })
        .where('release_id = :id AND confirmed_qty IS NOT NULL AND arrival_date IS NOT NULL', { id: release.id })
        .execute();
      await recordAudit(manager, {
        actorEmail: actor.email,
        action: 'accept',
        entity: 'release',
        entityKey: number,
        changes: { before: 'exception', after: 'confirmed' },
      });
      // Confirmed lines count as firm receipts for the line risk.
      await releasesChanged(manager);
    });
    return this.get(number, actor);
  }

  async jobSettings(manager = this.db.manager): Promise<ReleaseJobSettings> {
    const jobTime = await readSetting<string>(manager, RELEASE_JOB_TIME, DEFAULT_RELEASE_JOB_TIME);
    const lastRunDate = await readSetting<string | null>(manager, RELEASE_JOB_LAST_RUN, null);
    // The version is of the admin's setting only: the job's own last run is not an edit.
    return { jobTime, lastRunDate, version: versionOf({ jobTime }) };
  }

  async updateJobSettings(jobTime: string, actor: AuthenticatedUser, basedOn?: string): Promise<ReleaseJobSettings> {
    await this.db.write(async (manager) => {
      assertCurrent(basedOn, await this.jobSettings(manager), 'The release job time');
      const before = await readSetting<string>(manager, RELEASE_JOB_TIME, DEFAULT_RELEASE_JOB_TIME);
      if (before === jobTime) return;
      await writeSetting(manager, RELEASE_JOB_TIME, jobTime);
      await recordAudit(manager, {
        actorEmail: actor.email,
        action: 'update',
        entity: 'setting',
        entityKey: RELEASE_JOB_TIME,
        changes: { before, after: jobTime },
      });
    });
    return this.jobSettings();
  }

  private async findRelease(manager: EntityManager, number: string): Promise<ReleaseEntity> {
    const release = await manager.findOneBy(ReleaseEntity, { number });
    if (!release) throw new NotFoundError(`No release ${number}.`);
    return release;
  }

  /** A supplier's account sees its own releases only; another's is reported as not there at all. */
  private async findVisible(manager: EntityManager, number: string, user: AuthenticatedUser): Promise<ReleaseEntity> {
    const release = await manager.findOneBy(ReleaseEntity, { number });
    if (!release || (user.role === 'supplier' && release.supplierCode !== user.supplierCode)) {
      throw new NotFoundError(`No release ${number}.`);
    }
    return release;
  }

  private async partsOf(manager: EntityManager, partNumbers: string[]): Promise<Map<string, PartEntity>> {
    const unique = [...new Set(partNumbers)];
    if (unique.length === 0) return new Map();
    const parts = await manager.find(PartEntity, { where: { partNumber: In(unique) } });
    return new Map(parts.map((part) => [part.partNumber, part]));
  }

  /** Releases with their lines, part facts, card numbers and supplier names, in a handful of queries. */
  private async describe(manager: EntityManager, releases: ReleaseEntity[]): Promise<Release[]> {
    if (releases.length === 0) return [];
    const lines = await manager.find(ReleaseLineEntity, {
      where: { releaseId: In(releases.map((release) => release.id)) },
      order: { needDate: 'ASC', partNumber: 'ASC', id: 'ASC' },
    });
    const parts = await this.partsOf(
      manager,
      lines.map((line) => line.partNumber),
    );
    const cardIds = lines.map((line) => line.cardId).filter((id): id is number => id !== null);
    const cards = cardIds.length ? await manager.find(KanbanCardEntity, { where: { id: In(cardIds) } }) : [];
    const cardNumberById = new Map(cards.map((card) => [card.id, card.cardNumber]));
    const suppliers = await manager.find(SupplierEntity, {
      where: { code: In([...new Set(releases.map((release) => release.supplierCode))]) },
    });
    const supplierName = new Map(suppliers.map((supplier) => [supplier.code, supplier.name]));
    const notices = await manager.find(OutboxMessageEntity, {
      where: { ref: In(releases.map((release) => releaseNoticeRef(release.number))) },
      order: { id: 'ASC' },
    });
    const noticeOf = new Map(notices.map((notice) => [notice.ref, toOutboxMessage(notice)]));
    const shipNotices = await this.options.readShipNotices(manager, releases);
    const supplierOf = new Map(releases.map((release) => [release.id, release.supplierCode]));
    const timing = await readLineTiming(manager, [...supplierOf.values()]);
    const linesByRelease = new Map<number, ReleaseLine[]>();
    for (const line of lines) {
      const part = parts.get(line.partNumber);
      const list = linesByRelease.get(line.releaseId) ?? [];
      list.push({
        id: line.id,
        partNumber: line.partNumber,
        qty: line.qty,
        needDate: line.needDate,
        description: part?.description ?? '',
        uom: part?.uom ?? 'H87',
        hazardous: Boolean(part?.hazardous),
        origin: line.origin as ReleaseLineOrigin,
        cardNumber: line.cardId !== null ? (cardNumberById.get(line.cardId) ?? null) : null,
        confirmedQty: line.confirmedQty,
        shipDate: line.shipDate,
        receivedQty: line.receivedQty,
        closed: Boolean(line.closed),
        requestedQty: line.requestedQty ?? line.qty,
        requestedDate: line.requestedDate ?? line.needDate,
        expedite: Boolean(line.expedite),
        arrivalDate: line.arrivalDate,
        ...timing.windowOf(supplierOf.get(line.releaseId)!, line.needDate),
      });
      linesByRelease.set(line.releaseId, list);
    }
    return releases.map((release) => ({
      number: release.number,
      supplierCode: release.supplierCode,
      status: release.status as ReleaseStatus,
      lines: linesByRelease.get(release.id) ?? [],
      id: release.id,
      supplierName: supplierName.get(release.supplierCode) ?? release.supplierCode,
      releaseDate: release.releaseDate,
      sentAt: release.sentAt,
      confirmedAt: release.confirmedAt,
      carrier: release.carrier,
      trackingNumber: release.trackingNumber,
      supplierNote: release.supplierNote,
      notice: noticeOf.get(releaseNoticeRef(release.number)) ?? null,
      shipNotices: shipNotices.get(release.id) ?? [],
    }));
  }
}
