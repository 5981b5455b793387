import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

@Entity('audit_event')
@Index(['entity', 'entityKey'])
export class AuditEventEntity {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ type: 'varchar', length: 30 })
  at: string;

  @Column({ name: 'actor_email', type: 'varchar', length: 254, nullable: true })
  actorEmail: string | null;

  /** create, update, delete, import, accept… */
  @Column({ type: 'varchar', length: 30 })
  action: string;

  @Column({ type: 'varchar', length: 40 })
  entity: string;

  @Column({ name: 'entity_key', type: 'varchar', length: 80 })
  entityKey: string;

  @Column({ type: 'simple-json', nullable: true })
  changes: Record<string, unknown> | null;
}
