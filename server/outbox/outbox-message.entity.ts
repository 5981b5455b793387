import { Column, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

/** A notice waiting to be (or already) handed to the mail server; nothing is lost while it is down. */
@Entity('outbox_message')
@Index(['status', 'nextAttemptAt'])
@Index(['ref'])
export class OutboxMessageEntity {
  @PrimaryGeneratedColumn()
  id: number;

  @Column({ name: 'to_address', type: 'varchar', length: 254 })
  to: string;

  @Column({ type: 'varchar', length: 250 })
  subject: string;

  @Column({ type: 'text' })
  text: string;

  @Column({ type: 'text', nullable: true })
  html: string | null;

  /** [{ filename, content (utf-8 text), contentType }] */
  @Column({ type: 'simple-json', nullable: true })
  attachments: { filename: string; content: string; contentType: string }[] | null;

  /** pending (not tried yet, or due again), sent, or failing (the last attempt failed; retried on). */
  @Column({ type: 'varchar', length: 10, default: 'pending' })
  status: string;

  /** What the notice is about, e.g. `release:R261202-FBS`, so the release can show its mail. */
  @Column({ type: 'varchar', length: 80, nullable: true })
  ref: string | null;

  @Column({ name: 'first_failed_at', type: 'varchar', length: 30, nullable: true })
  firstFailedAt: string | null;

  /** Until when a dispatcher holds the message to send it; another one leaves it alone till then. */
  @Column({ name: 'claimed_until', type: 'varchar', length: 30, nullable: true })
  claimedUntil: string | null;

  @Column({ type: 'integer', default: 0 })
  attempts: number;

  @Column({ name: 'next_attempt_at', type: 'varchar', length: 30 })
  nextAttemptAt: string;

  @Column({ name: 'last_error', type: 'text', nullable: true })
  lastError: string | null;

  @Column({ name: 'created_at', type: 'varchar', length: 30 })
  createdAt: string;

  @Column({ name: 'sent_at', type: 'varchar', length: 30, nullable: true })
  sentAt: string | null;
}
