import type { UnitStatus } from '../../shared/schemas/builds';
import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/** One unit slot of the daily build sequence, keyed by its serial. */
@Entity('sequence_entry')
@Index(['date', 'sequence'])
export class SequenceEntryEntity {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ type: 'varchar', length: 10 })
  date: string;

  @Column({ type: 'integer' })
  sequence: number;

  @Column({ type: 'varchar', length: 40 })
  model: string;

  @Index({ unique: true })
  @Column({ type: 'varchar', length: 40 })
  serial: string;

  @Column({ type: 'integer', default: 1 })
  qty: number;

  /** planned, started (its kit was issued) or built (its components were backflushed). */
  @Column({ type: 'varchar', length: 10, default: 'planned' })
  status: UnitStatus;

  @Column({ name: 'started_at', type: 'varchar', length: 30, nullable: true })
  startedAt: string | null;

  @Column({ name: 'built_at', type: 'varchar', length: 30, nullable: true })
  builtAt: string | null;
}
