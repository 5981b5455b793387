import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/** The first answer to a request sent with an Idempotency-Key, so a retry gets it again and changes nothing. */
@Entity('idempotent_request')
@Index(['scope', 'idempotencyKey'], { unique: true })
export class IdempotentRequestEntity {
  @PrimaryGeneratedColumn()
  id: number;

  /** Which kind of request the key belongs to, e.g. `build`. */
  @Column({ type: 'varchar', length: 30 })
  scope: string;

  @Column({ name: 'idempotency_key', type: 'varchar', length: 100 })
  idempotencyKey: string;

  /** SHA-256 of the request body as sent the first time. */
  @Column({ name: 'request_hash', type: 'varchar', length: 64 })
  requestHash: string;

  @Column({ type: 'integer' })
  status: number;

  /** The first answer's body, as JSON. */
  @Column({ type: 'text' })
  response: string;

  @Column({ name: 'created_at', type: 'varchar', length: 30 })
  createdAt: string;
}
