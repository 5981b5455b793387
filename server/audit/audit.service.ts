import type { EntityManager } from 'typeorm';
import { AuditEventEntity } from './audit-event.entity';

export interface AuditEntry {
  actorEmail: string | null;
  action: string;
  entity: string;
  entityKey: string;
  changes?: Record<string, unknown>;
}

/** Records who changed what, inside the caller's transaction so the trail and the change land together. */
export async function recordAudit(manager: EntityManager, entry: AuditEntry): Promise<void> {
  const event = manager.create(AuditEventEntity, {
    at: new Date().toISOString(),
    actorEmail: entry.actorEmail,
    action: entry.action,
    entity: entry.entity,
    entityKey: entry.entityKey,
  });
  event.changes = entry.changes ?? null;
  await manager.save(event);
}
