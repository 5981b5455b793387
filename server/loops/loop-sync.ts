import { In, type EntityManager } from 'typeorm';
import type { LoopKind } from '../../shared/schemas/loops';
import { recordAudit } from '../audit/audit.service';
import { chunks } from '../db/upsert';
import { PartEntity } from '../master-data/part.entity';
import { KanbanLoopEntity } from './kanban-loop.entity';

export const DEFAULT_SAFETY_FACTOR = 0.1;
export const DEFAULT_SIZING_WINDOW_DAYS = 20;

/** Bought parts circulate cards to their supplier; made parts to the in-house supermarket. */
export function loopKindOf(source: string): LoopKind {
  return source === 'buy' ? 'supplier' : 'supermarket';
}

/**
 * Creates the missing loop of every kanban part (container = the part's pack quantity) and keeps
 * each loop's kind in step with its part's source. Idempotent, and safe when two callers race: a
 * loop that appeared meanwhile is skipped by the insert rather than failing it. Loops of parts that
 * left kanban stay, with their cards and history, until the buyer pulls their cards.
 */
export async function syncLoops(manager: EntityManager): Promise<{ created: string[] }> {
  const parts = await manager.find(PartEntity, {
    where: { replenishment: 'kanban' },
    select: { partNumber: true, source: true, packQty: true },
  });
  const loops = await manager.find(KanbanLoopEntity, { select: { id: true, partNumber: true, kind: true } });
  const loopByPart = new Map(loops.map((loop) => [loop.partNumber, loop]));

  const missing = parts.filter((part) => !loopByPart.has(part.partNumber));
  // In chunks, and without reading generated ids back: thousands of new kanban parts at once would
  // otherwise exceed SQLite's limits on variables and expression depth.
  for (const chunk of chunks(missing)) {
    await manager
      .createQueryBuilder()
      .insert()
      .into(KanbanLoopEntity)
      .values(
        chunk.map((part) => ({
          partNumber: part.partNumber,
          kind: loopKindOf(part.source),
          containerQty: part.packQty,
          safetyFactor: DEFAULT_SAFETY_FACTOR,
          safetyDays: 0,
          safetyUnits: 0,
          sizingWindowDays: DEFAULT_SIZING_WINDOW_DAYS,
        })),
      )
      .orIgnore()
      .updateEntity(false)
      .execute();
  }
  if (missing.length > 0) {
    await recordAudit(manager, {
      actorEmail: null,
      action: 'create',
      entity: 'kanban_loop',
      entityKey: missing.length === 1 ? missing[0].partNumber : `${missing.length} loops`,
      changes: { created: missing.map((part) => part.partNumber) },
    });
  }

  for (const kind of ['supplier', 'supermarket'] as const) {
    const ids = parts
      .filter((part) => loopKindOf(part.source) === kind)
      .map((part) => loopByPart.get(part.partNumber))
      .filter((loop) => loop !== undefined && loop.kind !== kind)
      .map((loop) => loop!.id);
    for (const chunk of chunks(ids)) await manager.update(KanbanLoopEntity, { id: In(chunk) }, { kind });
  }
  return { created: missing.map((part) => part.partNumber) };
}
