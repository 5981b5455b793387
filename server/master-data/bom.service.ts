import type { EntityManager } from 'typeorm';
import { findBomCycle, findEffectivityOverlaps, isEffective, lowLevelCodes } from '../../shared/domain/bom';
import { applyEngineeringChange, indentedBom, whereUsed, type IndentedBomLine } from '../../shared/domain/bom-tree';
import type { IsoDate } from '../../shared/domain/types';
import {
  checkRecord,
  type BomTree,
  type BomTreeNode,
  type EngineeringChange,
  type FieldIssue,
  type WhereUsed,
} from '../../shared/schemas/master-data-edit';
import { bomLineSchema, type BomLine } from '../../shared/schemas/master-data';
import { recordAudit } from '../audit/audit.service';
import type { Database } from '../db/database';
import { ConflictError, InvalidInputError, NotFoundError } from '../errors';
import type { AuthenticatedUser } from '../http/request-user';
import { BomLineEntity } from './bom-line.entity';
import { replaceBomLines } from './master-data.writer';
import { PartEntity } from './part.entity';

function toBomLine(entity: BomLineEntity): BomLine {
  const { id: _id, ...line } = entity;
  return line;
}

/** Multi-level BOMs: the tree on a date, where-used, and changes checked like a BOM import. */
export class BomService {
  constructor(private readonly db: Database) {}

  async tree(parent: string, date: IsoDate | null): Promise<BomTree> {
    const manager = this.db.manager;
    const top = await manager.findOneBy(PartEntity, { partNumber: parent });
    if (!top) throw new NotFoundError(`No part ${parent}.`);
    const lines = await manager.find(BomLineEntity, { order: { parent: 'ASC', id: 'ASC' } });
    const parts = await manager.find(PartEntity, { select: { partNumber: true, description: true, uom: true } });
    const partOf = new Map(parts.map((part) => [part.partNumber, part]));
    const codes = lowLevelCodes([parent], lines);
    const describe = (node: IndentedBomLine): BomTreeNode => ({
      ...node,
      description: partOf.get(node.component)?.description ?? '',
      uom: partOf.get(node.component)?.uom ?? 'H87',
      lowLevelCode: codes.get(node.component) ?? 0,
      children: node.children.map(describe),
    });
    return {
      parent,
      description: top.description,
      uom: top.uom,
      lowLevelCode: codes.get(parent) ?? 0,
      date,
      lines: indentedBom(parent, lines, date).map(describe),
    };
  }

  async whereUsed(partNumber: string, date: IsoDate | null): Promise<WhereUsed> {
    const manager = this.db.manager;
    if (!(await manager.existsBy(PartEntity, { partNumber }))) throw new NotFoundError(`No part ${partNumber}.`);
    const lines = await manager.find(BomLineEntity, { order: { parent: 'ASC', id: 'ASC' } });
    const { direct, topParents } = whereUsed(partNumber, lines);
    const parents = await manager.find(PartEntity, { select: { partNumber: true, description: true } });
    const descriptionOf = new Map(parents.map((part) => [part.partNumber, part.description]));
    return {
      partNumber,
      parents: (direct as BomLineEntity[])
        .filter((line) => date === null || isEffective(line, date))
        .map((line) => ({
          lineId: line.id,
          parent: line.parent,
          description: descriptionOf.get(line.parent) ?? '',
          qtyPer: line.qtyPer,
          scrapPct: line.scrapPct,
          effectiveFrom: line.effectiveFrom,
          effectiveTo: line.effectiveTo,
        })),
      endItems: topParents,
    };
  }

  /** Replaces the parent's single-level BOM with `input` (every line of it), checked as a BOM file is. */
  async replace(parent: string, input: Record<string, unknown>[], actor: AuthenticatedUser): Promise<BomTree> {
    await this.db.write(async (manager) => {
      const issues: FieldIssue[] = [];
      const lines: BomLine[] = [];
      input.forEach((raw, index) => {
        const checked = checkRecord(bomLineSchema, {
          effectiveFrom: null,
          effectiveTo: null,
          scrapPct: 0,
          ...raw,
          parent,
        });
        if (checked.ok) lines.push(checked.value);
        else issues.push(...checked.issues.map((issue) => ({ ...issue, path: ['lines', index, ...issue.path] })));
      });
      if (issues.length > 0) reject(parent, issues);
      await this.write(manager, parent, lines, actor, 'update');
    });
    return this.tree(parent, null);
  }

  /** Ends the component's line the day before the change and starts the replacement that day. */
  async change(parent: string, change: EngineeringChange, actor: AuthenticatedUser): Promise<BomTree> {
    await this.db.write(async (manager) => {
      const current = (await manager.find(BomLineEntity, { where: { parent }, order: { id: 'ASC' } })).map(toBomLine);
      const outcome = applyEngineeringChange(current, change);
      if (!outcome.ok) reject(parent, [{ path: [outcome.field], message: outcome.message }]);
      await this.write(manager, parent, outcome.lines as BomLine[], actor, 'engineering-change', change);
    });
    return this.tree(parent, null);
  }

  private async write(
    manager: EntityManager,
    parent: string,
    lines: BomLine[],
    actor: AuthenticatedUser,
    action: string,
    change?: EngineeringChange,
  ): Promise<void> {
    const parts = new Set(
      (await manager.find(PartEntity, { select: { partNumber: true } })).map((part) => part.partNumber),
    );
    if (!parts.has(parent)) throw new NotFoundError(`No part ${parent}.`);
    const issues: FieldIssue[] = [];
    lines.forEach((line, index) => {
      if (!parts.has(line.component))
        issues.push({ path: ['lines', index, 'component'], message: `unknown part '${line.component}'` });
    });
    for (const overlap of findEffectivityOverlaps(lines)) {
      issues.push({
        path: ['lines', overlap.secondIndex, 'effectiveFrom'],
        message: `effective dates of ${overlap.parent} → ${overlap.component} overlap line ${overlap.firstIndex + 1} (both ends count)`,
      });
    }
    if (issues.length > 0) reject(parent, issues);

    const others = await manager
      .createQueryBuilder(BomLineEntity, 'line')
      .select(['line.parent', 'line.component'])
      .where('line.parent <> :parent', { parent })
      .getMany();
    const found = findBomCycle([...others, ...lines]);
    if (found) {
      // Told from the parent being edited, whatever order the database returned the other lines in.
      const cycle = startingAt(found, parent);
      throw new ConflictError(
        `The BOM of ${parent} was not changed: it would make a cycle ${cycle.join(' → ')} (a part cannot contain itself).`,
        [{ path: ['lines'], message: `closes a BOM cycle: ${cycle.join(' → ')}`, cycle }],
        'bom_cycle',
      );
    }

    const before = (await manager.find(BomLineEntity, { where: { parent }, order: { id: 'ASC' } })).map(toBomLine);
    await replaceBomLines(manager, lines);
    if (lines.length === 0) await manager.delete(BomLineEntity, { parent });
    await recordAudit(manager, {
      actorEmail: actor.email,
      action,
      entity: 'bom',
      entityKey: parent,
      changes: { before: { lines: before }, after: { lines }, ...(change && { change }) },
    });
  }
}

function reject(parent: string, issues: FieldIssue[]): never {
  throw new InvalidInputError(`The BOM of ${parent} was not changed: ${issues[0].message}.`, issues);
}

/** A cycle written `A → B → C → A` read from `start` when it passes through it: `B → C → A → B`. */
function startingAt(cycle: string[], start: string): string[] {
  const ring = cycle.slice(0, -1);
  const at = ring.indexOf(start);
  if (at <= 0) return cycle;
  const rotated = [...ring.slice(at), ...ring.slice(0, at)];
  return [...rotated, rotated[0]!];
}
