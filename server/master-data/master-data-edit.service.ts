import { isDeepStrictEqual } from 'node:util';
import type { EntityManager } from 'typeorm';
import { lowLevelCodes } from '../../shared/domain/bom';
import { checkRecord, type FieldIssue, type PartDetail } from '../../shared/schemas/master-data-edit';
import { partSchema, supplierSchema, type Part, type Supplier } from '../../shared/schemas/master-data';
import { recordAudit } from '../audit/audit.service';
import type { Database } from '../db/database';
import { ConflictError, InvalidInputError, NotFoundError } from '../errors';
import type { AuthenticatedUser } from '../http/request-user';
import { KanbanCardEntity } from '../loops/kanban-card.entity';
import { KanbanLoopEntity } from '../loops/kanban-loop.entity';
import { syncLoops } from '../loops/loop-sync';
import { ReleaseLineEntity } from '../releases/release-line.entity';
import { SequenceEntryEntity } from '../sequence/sequence-entry.entity';
import { bumpPlanningVersion } from '../settings/versions';
import { StockMovementEntity } from '../stock/stock-movement.entity';
import { BomLineEntity } from './bom-line.entity';
import { upsertSuppliers } from './master-data.writer';
import { PartEntity } from './part.entity';
import { SupplierEntity } from './supplier.entity';

/** Fields whose old and new values differ, as `{ before, after }` for the audit trail. */
export function changedFields<T extends object>(
  before: T | null,
  after: T,
): { before: Partial<T>; after: Partial<T> } | null {
  const from: Partial<T> = {};
  const to: Partial<T> = {};
  for (const key of Object.keys(after) as (keyof T)[]) {
    // By value: a list of weekdays read again is a new array holding the same days.
    if (before && isDeepStrictEqual(before[key], after[key])) continue;
    if (before) from[key] = before[key];
    to[key] = after[key];
  }
  return Object.keys(to).length === 0 ? null : { before: from, after: to };
}

function rejectIssues(what: string, issues: FieldIssue[]): never {
  const fields = [...new Set(issues.map((issue) => issue.path.join('.')))].join(', ');
  throw new InvalidInputError(`${what} was not saved: check ${fields}.`, issues);
}

function toPart(entity: PartEntity): Part {
  const { id: _id, lastCountedAt: _counted, ...part } = entity;
  return part as Part;
}

function toSupplier(entity: SupplierEntity): Supplier {
  const { id: _id, ...supplier } = entity;
  return supplier as Supplier;
}

/** One part, one supplier at a time: read for a detail page, changed from a form, each change audited. */
export class MasterDataEditService {
  constructor(
    private readonly db: Database,
    /** Saves parts and posts any change of on-hand to the ledger (the stock feature owns it). */
    private readonly savePartsWithStock: (
      manager: EntityManager,
      parts: readonly Part[],
      actorEmail: string,
      reason: string,
    ) => Promise<void>,
  ) {}

  async getPart(partNumber: string): Promise<PartDetail> {
    const manager = this.db.manager;
    const part = await manager.findOneBy(PartEntity, { partNumber });
    if (!part) throw new NotFoundError(`No part ${partNumber}.`);
    const supplier = part.supplierCode ? await manager.findOneBy(SupplierEntity, { code: part.supplierCode }) : null;
    const loop = await manager.findOneBy(KanbanLoopEntity, { partNumber });
    const activeCards = loop
      ? await manager
          .createQueryBuilder(KanbanCardEntity, 'card')
          .where('card.loopId = :loopId AND card.retiredAt IS NULL', { loopId: loop.id })
          .getCount()
      : 0;
    const links = await manager.find(BomLineEntity, { select: { parent: true, component: true } });
    return {
      part: toPart(part),
      lowLevelCode: lowLevelCodes([partNumber], links).get(partNumber) ?? 0,
      supplierName: supplier?.name ?? null,
      loop: loop ? { id: loop.id, containerQty: loop.containerQty, activeCards } : null,
    };
  }

  /**
   * Creates or changes a part from a form. On-hand is not master data: the ledger owns it, so the
   * form cannot set it. Answers whether the part is new.
   */
  async savePart(partNumber: string, input: Record<string, unknown>, actor: AuthenticatedUser): Promise<boolean> {
    return this.db.write(async (manager) => {
      const existing = await manager.findOneBy(PartEntity, { partNumber });
      const kept = existing ? toPart(existing) : null;
      const record = { ...kept, ...input, partNumber, onHand: kept?.onHand ?? 0 };
      const checked = checkRecord(partSchema, record);
      if (!checked.ok) rejectIssues(`Part ${partNumber}`, checked.issues);
      const part = checked.value;
      if (part.supplierCode && !(await manager.existsBy(SupplierEntity, { code: part.supplierCode }))) {
        rejectIssues(`Part ${partNumber}`, [
          { path: ['supplierCode'], message: `unknown supplier '${part.supplierCode}'` },
        ]);
      }
      const changes = changedFields(kept, part);
      if (!changes) return false;
      await this.savePartsWithStock(manager, [part], actor.email, 'Part master');
      await syncLoops(manager);
      await recordAudit(manager, {
        actorEmail: actor.email,
        action: kept ? 'update' : 'create',
        entity: 'part',
        entityKey: partNumber,
        changes,
      });
      return !kept;
    });
  }

  /** Deletes a part nothing refers to; a part in use is refused with every reason it is in use. */
  async deletePart(partNumber: string, actor: AuthenticatedUser): Promise<void> {
    await this.db.write(async (manager) => {
      const part = await manager.findOneBy(PartEntity, { partNumber });
      if (!part) throw new NotFoundError(`No part ${partNumber}.`);
      const reasons = await usesOfPart(manager, partNumber);
      if (reasons.length > 0) {
        throw new ConflictError(
          `Part ${partNumber} is in use and was not deleted: ${reasons.join('; ')}.`,
          reasons.map((reason) => ({ reason })),
          'in_use',
        );
      }
      await manager.delete(KanbanLoopEntity, { partNumber });
      await manager.delete(PartEntity, { partNumber });
      await bumpPlanningVersion(manager, 'parts');
      await recordAudit(manager, {
        actorEmail: actor.email,
        action: 'delete',
        entity: 'part',
        entityKey: partNumber,
        changes: { before: toPart(part) },
      });
    });
  }

  async getSupplier(code: string): Promise<Supplier> {
    const supplier = await this.db.manager.findOneBy(SupplierEntity, { code });
    if (!supplier) throw new NotFoundError(`No supplier ${code}.`);
    return toSupplier(supplier);
  }

  /** Creates or changes a supplier from a form; answers whether it is new. */
  async saveSupplier(code: string, input: Record<string, unknown>, actor: AuthenticatedUser): Promise<boolean> {
    return this.db.write(async (manager) => {
      const existing = await manager.findOneBy(SupplierEntity, { code });
      const kept = existing ? toSupplier(existing) : null;
      const checked = checkRecord(supplierSchema, { ...kept, ...input, code });
      if (!checked.ok) rejectIssues(`Supplier ${code}`, checked.issues);
      const changes = changedFields(kept, checked.value);
      if (!changes) return false;
      await upsertSuppliers(manager, [checked.value]);
      await recordAudit(manager, {
        actorEmail: actor.email,
        action: kept ? 'update' : 'create',
        entity: 'supplier',
        entityKey: code,
        changes,
      });
      return !kept;
    });
  }
}

/** Why a part cannot go: the records that name it and would be left pointing at nothing. */
async function usesOfPart(manager: EntityManager, partNumber: string): Promise<string[]> {
  const reasons: string[] = [];
  const asComponent = await manager.countBy(BomLineEntity, { component: partNumber });
  if (asComponent > 0) reasons.push(`component on ${asComponent} BOM line(s)`);
  const asParent = await manager.countBy(BomLineEntity, { parent: partNumber });
  if (asParent > 0) reasons.push(`has a BOM of ${asParent} line(s)`);
  const units = await manager.countBy(SequenceEntryEntity, { model: partNumber });
  if (units > 0) reasons.push(`model of ${units} unit(s) in the build sequence`);
  const releaseLines = await manager.countBy(ReleaseLineEntity, { partNumber });
  if (releaseLines > 0) reasons.push(`on ${releaseLines} release line(s)`);
  const movements = await manager.countBy(StockMovementEntity, { partNumber });
  if (movements > 0) reasons.push(`has ${movements} stock movement(s) in the ledger`);
  const loop = await manager.findOneBy(KanbanLoopEntity, { partNumber });
  if (loop) {
    const cards = await manager
      .createQueryBuilder(KanbanCardEntity, 'card')
      .where('card.loopId = :loopId AND card.retiredAt IS NULL', { loopId: loop.id })
      .getCount();
    if (cards > 0) reasons.push(`has ${cards} active kanban card(s)`);
  }
  return reasons;
}
