import nodemailer, { type Transporter } from 'nodemailer';
import { LessThanOrEqual, type EntityManager } from 'typeorm';
import type { OutboxMessage } from '../../shared/schemas/outbox';
import { OutboxMessageEntity } from './outbox-message.entity';
import type { Database } from '../db/database';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html?: string;
  attachments?: { filename: string; content: string; contentType: string }[];
}

const MAX_ATTEMPTS = 8;
const BATCH = 20;

/** Backoff before retry n (1-based): 30 s doubling, capped at one hour. */
export function retryDelayMs(attempt: number): number {
  return Math.min(30_000 * 2 ** (attempt - 1), 3_600_000);
}

/** Queues a notice inside the caller's transaction; the dispatcher sends it later. */
export async function enqueueMail(manager: EntityManager, mail: OutgoingMail): Promise<void> {
  const now = new Date().toISOString();
  await manager.insert(OutboxMessageEntity, {
    to: mail.to,
    subject: mail.subject,
    text: mail.text,
    html: mail.html ?? null,
    attachments: mail.attachments ?? null,
    status: 'pending',
    attempts: 0,
    nextAttemptAt: now,
    createdAt: now,
  });
}

/** The admin's view of the outbox. */
export class OutboxService {
  constructor(private readonly db: Database) {}

  /** The newest 200 notices and their delivery state. */
  async list(): Promise<OutboxMessage[]> {
    const rows = await this.db.manager.find(OutboxMessageEntity, { order: { id: 'DESC' }, take: 200 });
    return rows.map((row) => ({
      id: row.id,
      to: row.to,
      subject: row.subject,
      status: row.status as OutboxMessage['status'],
      attempts: row.attempts,
      lastError: row.lastError,
      createdAt: row.createdAt,
      sentAt: row.sentAt,
    }));
  }
}

/** Hands pending outbox messages to the SMTP server, retrying with backoff while it is down. */
export class OutboxDispatcher {
  private readonly transport: Transporter;
  private running = false;

  constructor(
    private readonly db: Database,
    smtpUrl: string,
    private readonly from: string,
  ) {
    this.transport = nodemailer.createTransport(smtpUrl);
  }

  /** Sends what is due; returns how many went out. Overlapping calls do nothing. */
  async dispatchDue(now = new Date()): Promise<number> {
    if (this.running) return 0;
    this.running = true;
    try {
      const due = await this.db.manager.find(OutboxMessageEntity, {
        where: { status: 'pending', nextAttemptAt: LessThanOrEqual(now.toISOString()) },
        order: { id: 'ASC' },
        take: BATCH,
      });
      let sent = 0;
      for (const message of due) {
        try {
          await this.transport.sendMail({
            from: this.from,
            to: message.to,
            subject: message.subject,
            text: message.text,
            html: message.html ?? undefined,
            attachments: message.attachments ?? undefined,
          });
          await this.db.write((manager) =>
            manager.update(OutboxMessageEntity, message.id, {
              status: 'sent',
              sentAt: new Date().toISOString(),
              attempts: message.attempts + 1,
            }),
          );
          sent += 1;
        } catch (error) {
          const attempts = message.attempts + 1;
          await this.db.write((manager) =>
            manager.update(OutboxMessageEntity, message.id, {
              attempts,
              lastError: error instanceof Error ? error.message : String(error),
              status: attempts >= MAX_ATTEMPTS ? 'failed' : 'pending',
              nextAttemptAt: new Date(now.getTime() + retryDelayMs(attempts)).toISOString(),
            }),
          );
        }
      }
      return sent;
    } finally {
      this.running = false;
    }
  }

  close(): void {
    this.transport.close();
  }
}
