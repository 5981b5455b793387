import { In, type EntityManager } from 'typeorm';
import { addWorkingDays } from '../../shared/domain/calendar';
import { MAX_CARD_INDEX, cardNumber } from '../../shared/domain/gs1';
import { KanbanInputError, sizeKanban, type KanbanSizing } from '../../shared/domain/kanban-sizing';
import { scanRefusal, type CardState } from '../../shared/domain/card-cycle';
import type { KanbanSizeRequest } from '../../shared/schemas/loops-sizing';
import type {
  AcceptKanbanLoopRequest,
  AcceptKanbanLoopResponse,
  CardLabel,
  CardScan,
  CardScanRequest,
  CardScanResponse,
  CardStateCounts,
  KanbanCard,
  KanbanCardDetail,
  KanbanCardWithScans,
  KanbanLoop,
  LoopKind,
  UpdateKanbanLoopRequest,
} from '../../shared/schemas/loops';
import { recordAudit } from '../audit/audit.service';
import { bumpPlanningVersion } from '../settings/versions';
import { ConflictError, InvalidInputError, NotFoundError } from '../errors';
import type { AuthenticatedUser } from '../http/request-user';
import { PartEntity } from '../master-data/part.entity';
import { DEFAULT_HORIZON_WORKING_DAYS } from '../planning/plan-dates';
import type { PlanningService } from '../planning/planning.service';
import { SupplierEntity } from '../master-data/supplier.entity';
import { renderCardLabelsPdf } from './card-labels-pdf';
import { withQrSvg, type CardLabelContent } from './card-labels';
import { applyCardEvent, assertInCirculation, defaultEvent, findCard, readCardNumber } from './card-events';
import { CardScanEntity } from './card-scan.entity';
import { KanbanCardEntity } from './kanban-card.entity';
import { KanbanLoopEntity } from './kanban-loop.entity';
import { sizeLoop } from './loop-sizing';
import { effectiveCycle, partTerms } from '../../shared/domain/supplier-timing';
import { supplierTerms } from '../../shared/schemas/master-data';
import type { PlantCalendar } from '../../shared/domain/types';
import type { Database } from '../db/database';
import { chunks } from '../db/upsert';
import { assertCurrent, versionOf } from '../http/versions';

/** Scans shown beside each card in a loop's card list; the card's own page has them all. */
export const RECENT_SCANS_PER_CARD = 20;

const LOOP_SETTINGS = ['containerQty', 'safetyFactor', 'safetyDays', 'safetyUnits', 'sizingWindowDays'] as const;

interface SizingDemand {
  days: string[];
  /** The plant calendar: its working week is the `days` of a derived delivery cycle. */
  calendar: PlantCalendar;
  /** Gross demand of a part on each working day of the horizon (zeros for a part the plan lacks). */
  grossOf(partNumber: string): number[];
}

function emptyCounts(): CardStateCounts {
  return { full: 0, empty: 0, ordered: 0, shipped: 0 };
}

function toCardScan(scan: CardScanEntity): CardScan {
  return {
    id: scan.id,
    event: scan.event as CardScan['event'],
    fromState: scan.fromState as CardState,
    toState: scan.toState as CardState,
    userEmail: scan.userEmail,
    scannedAt: scan.scannedAt,
  };
}

function toKanbanCard(card: KanbanCardEntity, partNumber: string): KanbanCard {
  return {
    id: card.id,
    loopId: card.loopId,
    partNumber,
    cardNumber: card.cardNumber,
    cardIndex: card.cardIndex,
    state: card.state as CardState,
    stateChangedAt: card.stateChangedAt,
    retired: card.retiredAt !== null,
    retiredAt: card.retiredAt,
    releaseLineId: card.releaseLineId,
  };
}

/** The version of what a buyer edits on a loop (not of its demand, which moves by itself). */
function loopVersion(loop: KanbanLoopEntity): string {
  return versionOf(LOOP_SETTINGS.map((key) => loop[key]));
}

/** Loops, their sizing against the cached plan, card circulation and scans, and card labels. */
export class LoopsService {
  constructor(
    private readonly db: Database,
    private readonly planning: PlanningService,
  ) {}

  /** POST /api/kanban/size: the formula on the caller's numbers. */
  size(request: KanbanSizeRequest): KanbanSizing {
    try {
      return sizeKanban(request);
    } catch (error) {
      if (!(error instanceof KanbanInputError)) throw error;
      const message = error.message.slice(error.field.length + 2);
      throw new InvalidInputError(error.message, [{ path: error.field.split('.'), message }]);
    }
  }

  async listLoops(options: { supplierCode?: string } = {}): Promise<KanbanLoop[]> {
    const manager = this.db.manager;
    if (options.supplierCode && !(await manager.existsBy(SupplierEntity, { code: options.supplierCode }))) {
      throw new NotFoundError(`No supplier ${options.supplierCode}.`);
    }
    const loops = await manager.find(KanbanLoopEntity, { order: { partNumber: 'ASC' } });
    const views = await this.describeLoops(manager, loops, false);
    return views.filter(
      (view) =>
        (view.partIsKanban || view.activeCards > 0) &&
        (!options.supplierCode || view.supplierCode === options.supplierCode),
    );
  }

  async getLoop(id: number): Promise<KanbanLoop> {
    const loop = await this.findLoop(this.db.manager, id);
    return (await this.describeLoops(this.db.manager, [loop], true))[0];
  }

  async updateLoop(
    id: number,
    patch: UpdateKanbanLoopRequest,
    actor: AuthenticatedUser,
    basedOn?: string,
  ): Promise<KanbanLoop> {
    await this.db.write(async (manager) => {
      const loop = await this.findLoop(manager, id);
      if (basedOn !== undefined && basedOn !== loopVersion(loop)) {
        assertCurrent(basedOn, (await this.describeLoops(manager, [loop], true))[0], `Loop ${loop.partNumber}`);
      }
      const before: Record<string, number> = {};
      const after: Record<string, number> = {};
      for (const key of LOOP_SETTINGS) {
        const value = patch[key];
        if (value === undefined || value === loop[key]) continue;
        before[key] = loop[key];
        after[key] = value;
        loop[key] = value;
      }
      if (Object.keys(after).length === 0) return;
      await manager.save(loop);
      // The line risk counts on the loop's containers and replenishment time, read with stock.
      await bumpPlanningVersion(manager, 'stock');
      await recordAudit(manager, {
        actorEmail: actor.email,
        action: 'update',
        entity: 'kanban_loop',
        entityKey: loop.partNumber,
        changes: { before, after },
      });
    });
    return this.getLoop(id);
  }

  /**
   * Makes the active cards equal the current recommendation. Cards are added with the next
   * indexes; cards are pulled only while in hand — full ones first (no parts are stranded in a
   * container), then empty ones — never ordered or shipped cards, which are with the supplier and
   * are reported as still to pull.
   */
  async acceptLoop(
    id: number,
    request: AcceptKanbanLoopRequest,
    actor: AuthenticatedUser,
  ): Promise<AcceptKanbanLoopResponse> {
    const current = await this.getLoop(id);
    const target = current.recommendedCards;
    if (request.expectedRecommended !== undefined && request.expectedRecommended !== target) {
      throw new ConflictError(
        `The recommendation for ${current.partNumber} is now ${target} cards, not ${request.expectedRecommended}; review it and accept again.`,
        [{ expectedRecommended: request.expectedRecommended, recommendedCards: target }],
      );
    }
    const outcome = await this.db.write(async (manager) => {
      const cards = await manager.find(KanbanCardEntity, { where: { loopId: id }, order: { cardIndex: 'ASC' } });
      const active = cards.filter((card) => card.retiredAt === null);
      const added: string[] = [];
      const retired: string[] = [];
      let stillToPull = 0;
      if (active.length < target) {
        added.push(...(await this.addCards(manager, id, cards, target - active.length)));
      } else if (active.length > target) {
        const excess = active.length - target;
        const inHand = (state: string) =>
          active.filter((card) => card.state === state).sort((a, b) => b.cardIndex - a.cardIndex);
        const toRetire = [...inHand('full'), ...inHand('empty')].slice(0, excess);
        if (toRetire.length > 0) {
          const retiredAt = new Date().toISOString();
          await manager.update(KanbanCardEntity, { id: In(toRetire.map((card) => card.id)) }, { retiredAt });
        }
        retired.push(...toRetire.map((card) => card.cardNumber));
        stillToPull = excess - toRetire.length;
      }
      if (added.length > 0 || retired.length > 0) {
        // Cards added or retired change the loop's card count alone: stock, as planning changes go.
        await bumpPlanningVersion(manager, 'stock');
        await recordAudit(manager, {
          actorEmail: actor.email,
          action: 'accept',
          entity: 'kanban_loop',
          entityKey: current.partNumber,
          changes: {
            recommendedCards: target,
            activeBefore: active.length,
            activeAfter: active.length + added.length - retired.length,
            added,
            retired,
            stillToPull,
          },
        });
      }
      return { added, retired, stillToPull };
    });
    return { ...(await this.getLoop(id)), ...outcome };
  }

  async listCards(loopId: number): Promise<KanbanCardWithScans[]> {
    const manager = this.db.manager;
    const loop = await this.findLoop(manager, loopId);
    const cards = await manager.find(KanbanCardEntity, { where: { loopId }, order: { cardIndex: 'ASC' } });
    const scans = await this.recentScans(
      manager,
      cards.map((card) => card.id),
    );
    return cards.map((card) => ({ ...toKanbanCard(card, loop.partNumber), scans: scans.get(card.id) ?? [] }));
  }

  async getCard(typedNumber: string): Promise<KanbanCardDetail> {
    const manager = this.db.manager;
    const card = await findCard(manager, readCardNumber(typedNumber));
    const loop = await this.findLoop(manager, card.loopId);
    const part = await manager.findOneBy(PartEntity, { partNumber: loop.partNumber });
    const scans = await manager.find(CardScanEntity, { where: { cardId: card.id }, order: { id: 'DESC' } });
    return {
      ...toKanbanCard(card, loop.partNumber),
      scans: scans.map(toCardScan),
      kind: loop.kind as LoopKind,
      description: part?.description ?? '',
      pointOfUse: part?.pointOfUse ?? null,
      supplierCode: part?.supplierCode ?? null,
    };
  }

  /** One scan: the card moves one step of its cycle and the scan log gains a row, together. */
  async scan(request: CardScanRequest, actor: AuthenticatedUser): Promise<CardScanResponse> {
    const number = readCardNumber(request.cardNumber);
    return this.db.write(async (manager) => {
      const card = await findCard(manager, number);
      assertInCirculation(card);
      const event = request.event ?? defaultEvent(card);
      const refusal = scanRefusal(event);
      if (refusal) {
        throw new ConflictError(`Card ${card.cardNumber} cannot be scanned "${event}": ${refusal}.`, [
          { currentState: card.state, event },
        ]);
      }
      const loop = await this.findLoop(manager, card.loopId);
      const moved = await applyCardEvent(manager, card, event, actor.email);
      // Cards in circulation are the loop's supply, which the line risk counts. A scan changes a
      // card's state and its log alone: stock, as planning changes go.
      await bumpPlanningVersion(manager, 'stock');
      return { card: toKanbanCard(moved.card, loop.partNumber), scan: toCardScan(moved.scan) };
    });
  }

  async labels(loopId: number, which: 'all' | 'active'): Promise<CardLabel[]> {
    return withQrSvg(await this.labelContents(loopId, which));
  }

  async labelsPdf(loopId: number, which: 'all' | 'active'): Promise<{ fileName: string; pdf: Buffer }> {
    const loop = await this.findLoop(this.db.manager, loopId);
    const labels = await this.labelContents(loopId, which);
    const pdf = await renderCardLabelsPdf(labels, `Kanban cards ${loop.partNumber}`);
    return { fileName: `kanban-cards-${loop.partNumber.replace(/[^A-Za-z0-9._-]/g, '_')}.pdf`, pdf };
  }

  private async labelContents(loopId: number, which: 'all' | 'active'): Promise<CardLabelContent[]> {
    const manager = this.db.manager;
    const loop = await this.findLoop(manager, loopId);
    const part = await manager.findOneBy(PartEntity, { partNumber: loop.partNumber });
    const supplier = part?.supplierCode ? await manager.findOneBy(SupplierEntity, { code: part.supplierCode }) : null;
    const cards = (await manager.find(KanbanCardEntity, { where: { loopId }, order: { cardIndex: 'ASC' } })).filter(
      (card) => which === 'all' || card.retiredAt === null,
    );
    return cards.map((card, index) => ({
      loopId: loop.id,
      kind: loop.kind as LoopKind,
      cardNumber: card.cardNumber,
      cardIndex: card.cardIndex,
      position: index + 1,
      count: cards.length,
      retired: card.retiredAt !== null,
      partNumber: loop.partNumber,
      description: part?.description ?? '',
      pointOfUse: part?.pointOfUse ?? null,
      supplierCode: part?.supplierCode ?? null,
      supplierName: supplier?.name ?? null,
      containerQty: loop.containerQty,
      uom: part?.uom ?? 'H87',
      hazardous: part?.hazardous ?? false,
    }));
  }

  private async addCards(
    manager: EntityManager,
    loopId: number,
    cards: KanbanCardEntity[],
    count: number,
  ): Promise<string[]> {
    // Indexes continue after every card ever issued: a pulled card keeps its number and history.
    const firstIndex = cards.reduce((max, card) => Math.max(max, card.cardIndex), 0) + 1;
    const lastIndex = firstIndex + count - 1;
    if (lastIndex > MAX_CARD_INDEX) {
      throw new ConflictError(
        `A loop can issue at most ${MAX_CARD_INDEX} card numbers; this one has used ${firstIndex - 1}.`,
      );
    }
    const now = new Date().toISOString();
    const rows = Array.from({ length: count }, (_, offset) => ({
      loopId,
      cardIndex: firstIndex + offset,
      cardNumber: cardNumber(loopId, firstIndex + offset),
      state: 'full',
      stateChangedAt: now,
      retiredAt: null,
      releaseLineId: null,
    }));
    for (const chunk of chunks(rows)) await manager.insert(KanbanCardEntity, chunk);
    return rows.map((row) => row.cardNumber);
  }

  private async findLoop(manager: EntityManager, id: number): Promise<KanbanLoopEntity> {
    const loop = await manager.findOneBy(KanbanLoopEntity, { id });
    if (!loop) throw new NotFoundError(`No kanban loop ${id}.`);
    return loop;
  }

  /**
   * Every loop is sized on one plan whose horizon covers the longest sizing window (at least the
   * default horizon, so the plan is usually the one the Horizon screen already cached). Sizing a
   * single loop uses that same plan, so the figure a buyer accepts is the figure the list showed.
   */
  private async sizingDemand(manager: EntityManager): Promise<SizingDemand> {
    const longest = await manager
      .createQueryBuilder(KanbanLoopEntity, 'loop')
      .select('MAX(loop.sizingWindowDays)', 'longest')
      .getRawOne<{ longest: number | string | null }>();
    const horizonDays = Math.max(DEFAULT_HORIZON_WORKING_DAYS, Number(longest?.longest ?? 0));
    let plan = await this.planning.plan();
    if (horizonDays !== DEFAULT_HORIZON_WORKING_DAYS) {
      plan = await this.planning.plan(plan.from, addWorkingDays(plan.from, horizonDays - 1, plan.inputs.calendar));
    }
    const { result } = plan;
    return {
      days: result.days,
      calendar: plan.inputs.calendar,
      grossOf: (partNumber) =>
        result.parts.get(partNumber)?.buckets.map((bucket) => bucket.gross) ?? result.days.map(() => 0),
    };
  }

  private async cardCounts(manager: EntityManager, loopIds: number[] | null): Promise<Map<number, CardStateCounts>> {
    const query = manager
      .createQueryBuilder(KanbanCardEntity, 'card')
      .select('card.loopId', 'loopId')
      .addSelect('card.state', 'state')
      .addSelect('COUNT(*)', 'count')
      .where('card.retiredAt IS NULL')
      .groupBy('card.loopId')
      .addGroupBy('card.state');
    if (loopIds) query.andWhere('card.loopId IN (:...loopIds)', { loopIds });
    const rows = await query.getRawMany<{ loopId: number; state: string; count: number | string }>();
    const counts = new Map<number, CardStateCounts>();
    for (const row of rows) {
      const loopId = Number(row.loopId);
      const loopCounts = counts.get(loopId) ?? emptyCounts();
      if (row.state in loopCounts) loopCounts[row.state as CardState] += Number(row.count);
      counts.set(loopId, loopCounts);
    }
    return counts;
  }

  /** Sizes loops in one pass: one query each for parts, suppliers and card counts, and the cached plan. */
  private async describeLoops(
    manager: EntityManager,
    loops: KanbanLoopEntity[],
    onlyThese: boolean,
  ): Promise<KanbanLoop[]> {
    if (loops.length === 0) return [];
    const partNumbers = loops.map((loop) => loop.partNumber);
    // One after another: a PostgreSQL unit of work is one connection, which takes one query at a time.
    const parts = await manager.find(PartEntity, { where: onlyThese ? { partNumber: In(partNumbers) } : {} });
    const demand = await this.sizingDemand(manager);
    const counts = await this.cardCounts(manager, onlyThese ? loops.map((loop) => loop.id) : null);
    const partByNumber = new Map(parts.map((part) => [part.partNumber, part]));
    const supplierCodes = [...new Set(parts.map((part) => part.supplierCode).filter((code): code is string => !!code))];
    const suppliers = supplierCodes.length
      ? await manager.find(SupplierEntity, { where: { code: In(supplierCodes) } })
      : [];
    const supplierByCode = new Map(suppliers.map((supplier) => [supplier.code, supplier]));

    return loops.map((loop) => {
      const part = partByNumber.get(loop.partNumber);
      const supplier = part?.supplierCode ? supplierByCode.get(part.supplierCode) : undefined;
      const kind = loop.kind as LoopKind;
      const windowDays = demand.days.slice(0, loop.sizingWindowDays);
      const sizing = sizeLoop({
        kind,
        containerQty: loop.containerQty,
        safetyFactor: loop.safetyFactor,
        safetyDays: loop.safetyDays,
        safetyUnits: loop.safetyUnits,
        dailyGross: demand.grossOf(loop.partNumber).slice(0, loop.sizingWindowDays),
        cycle: supplier
          ? effectiveCycle(partTerms(supplierTerms(supplier), part?.leadTimeDays ?? 0), demand.calendar)
          : null,
        leadTimeDays: part?.leadTimeDays ?? 0,
        partIsKanban: part?.replenishment === 'kanban',
      });
      const cardStates = counts.get(loop.id) ?? emptyCounts();
      const activeCards = cardStates.full + cardStates.empty + cardStates.ordered + cardStates.shipped;
      const difference = sizing.recommendedCards - activeCards;
      return {
        version: loopVersion(loop),
        partNumber: loop.partNumber,
        supplierCode: part?.supplierCode ?? null,
        containerQty: loop.containerQty,
        safetyFactor: loop.safetyFactor,
        averageDailyDemand: sizing.averageDailyDemand,
        replenishmentDays: sizing.replenishmentDays,
        recommendedCards: sizing.recommendedCards,
        activeCards,
        id: loop.id,
        description: part?.description ?? '',
        kind,
        pointOfUse: part?.pointOfUse ?? null,
        uom: part?.uom ?? 'H87',
        peakDailyDemand: sizing.peakDailyDemand,
        safetyDays: loop.safetyDays,
        safetyUnits: loop.safetyUnits,
        sizingWindowDays: loop.sizingWindowDays,
        windowFrom: windowDays[0] ?? '',
        windowTo: windowDays[windowDays.length - 1] ?? '',
        exactCards: sizing.exactCards,
        formula: sizing.formula,
        proposal: {
          action: difference > 0 ? 'add' : difference < 0 ? 'pull' : 'none',
          count: Math.abs(difference),
        },
        cardStates,
        partIsKanban: part?.replenishment === 'kanban',
      };
    });
  }

  /** The latest scans of each card, newest first, in one windowed query rather than one per card. */
  private async recentScans(manager: EntityManager, cardIds: number[]): Promise<Map<number, CardScan[]>> {
    const byCard = new Map<number, CardScan[]>();
    if (cardIds.length === 0) return byCard;
    const rows = await manager
      .createQueryBuilder()
      .select('ranked.*')
      .from(
        (subQuery) =>
          subQuery
            .select('scan.id', 'id')
            .addSelect('scan.card_id', 'cardId')
            .addSelect('scan.event', 'event')
            .addSelect('scan.from_state', 'fromState')
            .addSelect('scan.to_state', 'toState')
            .addSelect('scan.user_email', 'userEmail')
            .addSelect('scan.scanned_at', 'scannedAt')
            .addSelect('ROW_NUMBER() OVER (PARTITION BY scan.card_id ORDER BY scan.id DESC)', 'recency')
            .from(CardScanEntity, 'scan')
            .where('scan.card_id IN (:...cardIds)', { cardIds }),
        'ranked',
      )
      .where('ranked.recency <= :limit', { limit: RECENT_SCANS_PER_CARD })
      .orderBy('ranked.id', 'DESC')
      .getRawMany<CardScan & { cardId: number }>();
    for (const row of rows) {
      const cardId = Number(row.cardId);
      const list = byCard.get(cardId) ?? [];
      list.push({
        id: Number(row.id),
        event: row.event,
        fromState: row.fromState,
        toState: row.toState,
        userEmail: row.userEmail,
        scannedAt: row.scannedAt,
      });
      byCard.set(cardId, list);
    }
    return byCard;
  }
}
