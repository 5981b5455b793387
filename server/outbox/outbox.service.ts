import nodemailer, { type Transporter } from 'nodemailer';
import { And, In, IsNull, LessThan, LessThanOrEqual, Not, Or, type EntityManager } from 'typeorm';
import type { CapturedAttachment, CapturedMail, OutboxHealth, OutboxMessage } from '../../shared/schemas/outbox';
import type { Database } from '../db/database';
import { NotFoundError } from '../errors';
import { UserEntity } from '../users/user.entity';
import { OutboxMessageEntity } from './outbox-message.entity';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html?: string;
  attachments?: { filename: string; content: string; contentType: string }[];
  /** What the notice is about, e.g. `release:R261202-FBS`. */
  ref?: string;
}

const BATCH = 20;
/** How long a dispatcher may hold a message while handing it to the mail server. */
const CLAIM_MS = 2 * 60_000;
const ALERT_REF = 'alert:outbox';

/**
 * Wait before retry n (1-based): 30 s doubling, capped at one hour. There is no last retry: a
 * notice stays in the outbox until the mail server takes it, whatever the outage.
 */
export function retryDelayMs(attempt: number): number {
  return Math.min(30_000 * 2 ** (attempt - 1), 3_600_000);
}

/*
 * Links that act for somebody (a release confirmation, a password reset) are single-use secrets.
 * Once the mail server has the message, the outbox keeps its text with the secret part removed.
 */
const SECRET_LINKS = /(\/(?:confirm|reset-password)\/)[A-Za-z0-9_-]{16,}/g;
const REDACTED = '$1[link removed after sending]';

export function redactSecretLinks(text: string): string {
  return text.replace(SECRET_LINKS, REDACTED);
}

/** Queues a notice inside the caller's unit of work; the dispatcher sends it once that has committed. */
export async function enqueueMail(manager: EntityManager, mail: OutgoingMail): Promise<void> {
  const now = new Date().toISOString();
  await manager.insert(OutboxMessageEntity, {
    to: mail.to,
    subject: mail.subject,
    text: mail.text,
    html: mail.html ?? null,
    attachments: mail.attachments ?? null,
    ref: mail.ref ?? null,
    status: 'pending',
    attempts: 0,
    nextAttemptAt: now,
    createdAt: now,
  });
}

export function toOutboxMessage(row: OutboxMessageEntity): OutboxMessage {
  return {
    id: row.id,
    to: row.to,
    subject: row.subject,
    status: row.status as OutboxMessage['status'],
    ref: row.ref,
    attempts: row.attempts,
    lastError: row.lastError,
    createdAt: row.createdAt,
    sentAt: row.sentAt,
    firstFailedAt: row.firstFailedAt,
    nextAttemptAt: row.status === 'sent' ? null : row.nextAttemptAt,
  };
}

/** The outbox as people see it: what went out, what is failing, and "send again". */
export class OutboxService {
  constructor(private readonly db: Database) {}

  /** The newest 200 notices and their delivery state. */
  async list(): Promise<OutboxMessage[]> {
    const rows = await this.db.manager.find(OutboxMessageEntity, { order: { id: 'DESC' }, take: 200 });
    return rows.map(toOutboxMessage);
  }

  /** How many notices wait or fail, and since when the oldest failing one fails. */
  async health(): Promise<OutboxHealth> {
    const manager = this.db.manager;
    const pending = await manager.countBy(OutboxMessageEntity, { status: 'pending' });
    const failing = await manager.countBy(OutboxMessageEntity, { status: 'failing' });
    const oldest = await manager.findOne(OutboxMessageEntity, {
      where: { status: 'failing' },
      order: { firstFailedAt: 'ASC' },
    });
    return { pending, failing, failingSince: oldest?.firstFailedAt ?? null };
  }

  /** The latest notice about `ref` (a release's mail), or null. */
  async latestFor(ref: string): Promise<OutboxMessage | null> {
    const row = await this.db.manager.findOne(OutboxMessageEntity, { where: { ref }, order: { id: 'DESC' } });
    return row ? toOutboxMessage(row) : null;
  }

  /** "Send again": a notice not yet taken by the mail server is due at once. */
  /** One notice as written, to read as its recipient does; its sending time, or when it was queued. */
  async mail(id: number): Promise<CapturedMail> {
    const row = await this.findRow(id);
    return {
      id: row.id,
      to: row.to,
      subject: row.subject,
      text: row.text,
      html: row.html ?? '',
      date: row.sentAt ?? row.createdAt,
      attachments: (row.attachments ?? []).map((file) => ({
        fileName: file.filename,
        contentType: file.contentType,
        sizeBytes: Buffer.byteLength(file.content),
      })),
    };
  }

  /** A file attached to a notice, with its bytes; null when the notice has no such file. */
  async attachment(id: number, index: number): Promise<(CapturedAttachment & { content: Buffer }) | null> {
    const file = (await this.findRow(id)).attachments?.[index];
    if (!file) return null;
    const content = Buffer.from(file.content);
    return { fileName: file.filename, contentType: file.contentType, sizeBytes: content.length, content };
  }

  private async findRow(id: number): Promise<OutboxMessageEntity> {
    const row = await this.db.manager.findOneBy(OutboxMessageEntity, { id });
    if (!row) throw new NotFoundError(`No notice ${id} in the outbox.`);
    return row;
  }

  async sendAgain(id: number): Promise<OutboxMessage> {
    return this.db.write(async (manager) => {
      const row = await manager.findOneBy(OutboxMessageEntity, { id });
      if (!row) throw new NotFoundError(`No notice ${id} in the outbox.`);
      if (row.status !== 'sent') {
        row.nextAttemptAt = new Date().toISOString();
        await manager.update(OutboxMessageEntity, { id }, { nextAttemptAt: row.nextAttemptAt });
      }
      return toOutboxMessage(row);
    });
  }
}

/**
 * Hands due notices to the mail server. Messages are first claimed, in a unit of work only one
 * dispatcher can win for each message, so two dispatchers (two nodes) never send the same one; a
 * claim that outlives a crashed dispatcher expires and the message is tried again.
 */
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

  /** Sends what is due; returns how many went out. Overlapping calls in this process do nothing. */
  async dispatchDue(now = new Date()): Promise<number> {
    if (this.running) return 0;
    this.running = true;
    try {
      const due = await this.claimDue(now);
      let sent = 0;
      for (const message of due) {
        if (await this.deliver(message)) sent += 1;
      }
      return sent;
    } finally {
      this.running = false;
    }
  }

  close(): void {
    this.transport.close();
  }

  /**
   * Claims a batch of due messages in one unit of work. On PostgreSQL the rows are locked as they
   * are read, and rows another node is claiming at that moment are skipped (FOR UPDATE SKIP
   * LOCKED), so two nodes take different messages instead of waiting for each other.
   */
  private claimDue(now: Date): Promise<OutboxMessageEntity[]> {
    const until = new Date(now.getTime() + CLAIM_MS).toISOString();
    return this.db.write(async (manager) => {
      const due = await manager.find(OutboxMessageEntity, {
        where: {
          status: In(['pending', 'failing']),
          nextAttemptAt: LessThanOrEqual(now.toISOString()),
          claimedUntil: Or(IsNull(), LessThan(now.toISOString())),
        },
        order: { id: 'ASC' },
        take: BATCH,
        ...(this.db.engine === 'postgres' ? { lock: { mode: 'pessimistic_write', onLocked: 'skip_locked' } } : {}),
      });
      if (due.length > 0) {
        await manager.update(
          OutboxMessageEntity,
          { id: In(due.map((message) => message.id)) },
          { claimedUntil: until },
        );
      }
      return due;
    });
  }

  private async deliver(message: OutboxMessageEntity): Promise<boolean> {
    try {
      await this.transport.sendMail({
        from: this.from,
        to: message.to,
        subject: message.subject,
        text: message.text,
        html: message.html ?? undefined,
        attachments: message.attachments ?? undefined,
        // One id per notice: a mail system that sees the same notice twice (a crash between
        // handing it over and recording it) can tell it is one message.
        messageId: `<outbox-${message.id}-${message.createdAt.replace(/\D/g, '')}@cardloop.invalid>`,
      });
    } catch (error) {
      await this.recordFailure(message, error);
      return false;
    }
    await this.db.write((manager) =>
      manager.update(OutboxMessageEntity, message.id, {
        status: 'sent',
        sentAt: new Date().toISOString(),
        attempts: message.attempts + 1,
        claimedUntil: null,
        text: redactSecretLinks(message.text),
        html: message.html === null ? null : redactSecretLinks(message.html),
      }),
    );
    return true;
  }

  private async recordFailure(message: OutboxMessageEntity, error: unknown): Promise<void> {
    const now = new Date();
    const attempts = message.attempts + 1;
    const firstFailure = message.firstFailedAt === null;
    await this.db.write(async (manager) => {
      await manager.update(OutboxMessageEntity, message.id, {
        attempts,
        status: 'failing',
        lastError: error instanceof Error ? error.message : String(error),
        firstFailedAt: message.firstFailedAt ?? now.toISOString(),
        nextAttemptAt: new Date(now.getTime() + retryDelayMs(attempts)).toISOString(),
        claimedUntil: null,
      });
      // The admins hear of a notice that cannot be delivered once, never of their own alerts.
      if (firstFailure && message.ref !== ALERT_REF) await this.alertAdmins(manager, message, error);
    });
  }

  private async alertAdmins(manager: EntityManager, message: OutboxMessageEntity, error: unknown): Promise<void> {
    const admins = await manager.find(UserEntity, {
      where: { role: 'admin', active: true, email: And(Not(message.to)) },
    });
    for (const admin of admins) {
      await enqueueMail(manager, {
        to: admin.email,
        ref: ALERT_REF,
        subject: `A notice cannot be delivered: ${message.subject}`,
        text: [
          `Cardloop could not hand a notice to the mail server. It keeps trying (at least hourly) and nothing is lost.`,
          '',
          `To: ${message.to}`,
          `Subject: ${message.subject}`,
          `Error: ${error instanceof Error ? error.message : String(error)}`,
          '',
          'The Outbox page shows every waiting and failing notice, with "Send again".',
        ].join('\n'),
      });
    }
  }
}
