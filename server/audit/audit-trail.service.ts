import { toCsv } from '../../shared/domain/csv';
import { addCalendarDays } from '../../shared/domain/date';
import { describeAuditChanges } from '../../shared/domain/audit-changes';
import { AUDIT_LIMIT, type AuditEvent, type AuditList, type AuditQuery } from '../../shared/schemas/audit';
import type { Database } from '../db/database';
import { AuditEventEntity } from './audit-event.entity';

function likePattern(text: string): string {
  return `%${text.replace(/[\\%_]/g, (character) => `\\${character}`)}%`;
}

/** The audit trail as people read it: filtered, newest first, as JSON or CSV. */
export class AuditTrailService {
  constructor(private readonly db: Database) {}

  async list(query: AuditQuery): Promise<AuditList> {
    const builder = this.db.manager.createQueryBuilder(AuditEventEntity, 'event');
    if (query.kind) builder.andWhere('event.entity = :kind', { kind: query.kind });
    if (query.user)
      builder.andWhere("LOWER(event.actorEmail) LIKE :user ESCAPE '\\'", {
        user: likePattern(query.user.toLowerCase()),
      });
    if (query.subject)
      builder.andWhere("event.entityKey LIKE :subject ESCAPE '\\'", { subject: likePattern(query.subject) });
    // `at` is an ISO instant in UTC, so day bounds compare as strings.
    if (query.from) builder.andWhere('event.at >= :from', { from: query.from });
    if (query.to) builder.andWhere('event.at < :to', { to: addCalendarDays(query.to, 1) });
    const rows = await builder
      .orderBy('event.id', 'DESC')
      .take(AUDIT_LIMIT + 1)
      .getMany();
    return { events: rows.slice(0, AUDIT_LIMIT).map(toEvent), truncated: rows.length > AUDIT_LIMIT };
  }

  /** The kinds of record the trail holds, for the filter. */
  async kinds(): Promise<string[]> {
    const rows = await this.db.manager
      .createQueryBuilder(AuditEventEntity, 'event')
      .select('DISTINCT event.entity', 'entity')
      .orderBy('entity', 'ASC')
      .getRawMany<{ entity: string }>();
    return rows.map((row) => row.entity);
  }
}

function toEvent(entity: AuditEventEntity): AuditEvent {
  return {
    id: entity.id,
    at: entity.at,
    actorEmail: entity.actorEmail,
    action: entity.action,
    kind: entity.entity,
    subject: subjectOf(entity),
    changes: entity.changes,
    summary: describeAuditChanges(entity.changes),
  };
}

/**
 * What a person calls the record: a receipt is keyed by its own number, which nobody at the dock
 * knows, so it is named by its release and part, the number kept beside them.
 */
function subjectOf(entity: AuditEventEntity): string {
  const changes = entity.changes;
  if (
    entity.entity === 'receipt' &&
    typeof changes?.releaseNumber === 'string' &&
    typeof changes.partNumber === 'string'
  )
    return `${changes.releaseNumber} · ${changes.partNumber} (receipt ${entity.entityKey})`;
  return entity.entityKey;
}

/** The events as CSV, one row each, the changes in one readable column. */
export function auditToCsv(events: readonly AuditEvent[]): string {
  return toCsv(
    ['at', 'user', 'action', 'kind', 'subject', 'changes'],
    events.map((event) => [event.at, event.actorEmail ?? '', event.action, event.kind, event.subject, event.summary]),
  );
}
