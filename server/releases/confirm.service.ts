import { In, IsNull, type EntityManager } from 'typeorm';
import { answerDiffers, answerStatus } from '../../shared/domain/release-rules';
import { typedQtyProblem } from '../../shared/domain/typed-quantity';
import type { ConfirmAnswer, Confirmation, ConfirmResult } from '../../shared/schemas/releases';
import { recordAudit } from '../audit/audit.service';
import { ConflictError, InvalidInputError, GoneError, NotFoundError, RefusedInputError } from '../errors';
import { PartEntity } from '../master-data/part.entity';
import { ReleaseLineEntity } from './release-line.entity';
import { ReleaseEntity } from './release.entity';
import { readPlantName } from './releases.service';
import { SupplierEntity } from '../master-data/supplier.entity';
import { hashConfirmationToken } from './confirmation-tokens';
import { ConfirmationTokenEntity } from './confirmation-token.entity';
import { releasesChanged } from './release-events';
import { readLineTiming } from './line-timing';
import { plantToday } from '../planning/plan-dates';
import type { Database } from '../db/database';
import type { AuthenticatedUser } from '../http/request-user';
import { formatDay } from '../../shared/format/dates';

/** Release states a supplier can still answer through a live link. */
const ANSWERABLE = ['draft', 'sent'];

function invalidAnswer(message: string, details: { path: (string | number)[]; message: string }[]): InvalidInputError {
  return new InvalidInputError(message, details);
}

/** 410 for a release the buyer cancelled, 409 for one already answered. */
function answerable(release: ReleaseEntity): ReleaseEntity {
  if (release.status === 'cancelled')
    throw new GoneError(`Release ${release.number} was cancelled by the buyer; there is nothing to confirm.`);
  if (!ANSWERABLE.includes(release.status)) {
    throw new ConflictError(`Release ${release.number} was already answered.`, [{ status: release.status }]);
  }
  return release;
}

interface OpenLink {
  token: ConfirmationTokenEntity;
  release: ReleaseEntity;
}

/**
 * The supplier's side of a release, reached through the e-mailed link without an account: the
 * token is looked up by its SHA-256, so an altered or unknown token simply matches nothing.
 */
export class ConfirmService {
  constructor(
    private readonly db: Database,
    /** Issues the link for the ship notices of a confirmed release (the ship-notices feature owns it). */
    private readonly issueShippingLink: (manager: EntityManager, releaseId: number) => Promise<string>,
  ) {}

  /** What the confirmation page shows; 404 unknown, 409 used, 410 expired or cancelled. */
  async view(token: string): Promise<Confirmation> {
    const manager = this.db.manager;
    const { token: link, release } = await this.openLink(manager, token);
    return this.describe(manager, release, link.expiresAt);
  }

  /** The same page for a signed-in supplier's own release; another's is 404, as if it did not exist. */
  async viewOwn(number: string, user: AuthenticatedUser): Promise<Confirmation> {
    const manager = this.db.manager;
    const release = await this.openOwn(manager, number, user);
    return this.describe(manager, release, null);
  }

  private async describe(
    manager: EntityManager,
    release: ReleaseEntity,
    expiresAt: string | null,
  ): Promise<Confirmation> {
    const lines = await manager.find(ReleaseLineEntity, {
      where: { releaseId: release.id },
      order: { needDate: 'ASC', partNumber: 'ASC', id: 'ASC' },
    });
    const partNumbers = [...new Set(lines.map((line) => line.partNumber))];
    const parts = partNumbers.length ? await manager.find(PartEntity, { where: { partNumber: In(partNumbers) } }) : [];
    const partByNumber = new Map(parts.map((part) => [part.partNumber, part]));
    const supplier = await manager.findOneBy(SupplierEntity, { code: release.supplierCode });
    const timing = await readLineTiming(manager, [release.supplierCode]);
    return {
      release: {
        number: release.number,
        supplierCode: release.supplierCode,
        lines: lines.map((line) => {
          const part = partByNumber.get(line.partNumber);
          return {
            id: line.id,
            partNumber: line.partNumber,
            qty: line.qty,
            needDate: line.needDate,
            description: part?.description ?? '',
            uom: part?.uom ?? 'H87',
            hazardous: Boolean(part?.hazardous),
            expedite: Boolean(line.expedite),
            ...timing.windowOf(release.supplierCode, line.needDate),
          };
        }),
        supplierName: supplier?.name ?? release.supplierCode,
        plantName: await readPlantName(manager),
        releaseDate: release.releaseDate,
        transitDays: timing.transitDaysOf(release.supplierCode),
      },
      today: plantToday(),
      expiresAt,
    };
  }

  /**
   * Records the supplier's answer: every line once, with a quantity and ship date. Anything other
   * than what was asked makes the release an exception for the buyer. The link is spent, the lines
   * and the release change, and the audit row is written in one transaction.
   */
  async answer(token: string, answer: ConfirmAnswer): Promise<ConfirmResult> {
    return this.db.write(async (manager) => {
      const { token: link, release } = await this.openLink(manager, token);
      return this.record(manager, release, answer, `supplier:${release.supplierCode}`, async (now) => {
        // Conditional on the link still being unused, so two submissions racing each other count once.
        const spent = await manager.update(ConfirmationTokenEntity, { id: link.id, usedAt: IsNull() }, { usedAt: now });
        if (spent.affected === 0) throw new ConflictError('This link was already used.');
      });
    });
  }

  /** A signed-in supplier answers its own release; the e-mailed link is spent with it. */
  async answerOwn(number: string, user: AuthenticatedUser, answer: ConfirmAnswer): Promise<ConfirmResult> {
    return this.db.write(async (manager) => {
      const release = await this.openOwn(manager, number, user);
      return this.record(manager, release, answer, user.email, async (now) => {
        await manager.update(ConfirmationTokenEntity, { releaseId: release.id, usedAt: IsNull() }, { usedAt: now });
      });
    });
  }

  /** Each confirmed quantity the part's unit cannot take (half a piece), naming its line's field. */
  private async unfitQuantities(
    manager: EntityManager,
    answer: ConfirmAnswer,
    lineById: Map<number, ReleaseLineEntity>,
  ): Promise<{ path: (string | number)[]; message: string }[]> {
    const partNumbers = [...new Set([...lineById.values()].map((line) => line.partNumber))];
    const parts = await manager.find(PartEntity, { where: { partNumber: In(partNumbers) } });
    const uomOf = new Map(parts.map((part) => [part.partNumber, part.uom]));
    return answer.lines.flatMap((reply, index) => {
      const uom = uomOf.get(lineById.get(reply.id)!.partNumber);
      const problem = uom === undefined ? null : typedQtyProblem(reply.confirmedQty, uom);
      return problem ? [{ path: ['lines', index, 'confirmedQty'], message: problem }] : [];
    });
  }

  private async record(
    manager: EntityManager,
    release: ReleaseEntity,
    answer: ConfirmAnswer,
    actorEmail: string,
    spendLink: (now: string) => Promise<void>,
  ): Promise<ConfirmResult> {
    const lines = await manager.find(ReleaseLineEntity, { where: { releaseId: release.id } });
    const lineById = new Map(lines.map((line) => [line.id, line]));

    const foreign = answer.lines
      .map((line, index) => ({ line, index }))
      .filter(({ line }) => !lineById.has(line.id))
      .map(({ line, index }) => ({
        path: ['lines', index, 'id'],
        message: `line ${line.id} is not on release ${release.number}`,
      }));
    if (foreign.length > 0)
      throw invalidAnswer(`The answer names lines that are not on release ${release.number}.`, foreign);
    const answered = new Set(answer.lines.map((line) => line.id));
    const missing = lines.filter((line) => !answered.has(line.id));
    if (missing.length > 0) {
      throw invalidAnswer(
        `Answer every line of release ${release.number}; missing: ${missing.map((line) => line.partNumber).join(', ')}.`,
        missing.map((line) => ({ path: ['lines'], message: `line ${line.id} (${line.partNumber}) has no answer` })),
      );
    }

    const unfit = await this.unfitQuantities(manager, answer, lineById);
    if (unfit.length > 0)
      throw new RefusedInputError(
        'Some confirmed quantities do not fit the part; nothing was changed.',
        unfit,
        'quantity_refused',
      );

    const today = plantToday();
    const past = answer.lines
      .map((line, index) => ({ line, index }))
      .filter(({ line }) => line.shipDate < today)
      .map(({ line, index }) => ({
        path: ['lines', index, 'shipDate'],
        message: `the ship date ${formatDay(line.shipDate)} is before today (${formatDay(today)})`,
      }));
    if (past.length > 0) throw new RefusedInputError('A ship date cannot be in the past.', past);

    const timing = await readLineTiming(manager, [release.supplierCode]);
    const requestedOf = (line: ReleaseLineEntity) => ({
      qty: line.qty,
      ...timing.windowOf(release.supplierCode, line.needDate),
    });
    const now = new Date().toISOString();
    await spendLink(now);

    let changedLines = 0;
    const changes: Record<string, unknown>[] = [];
    for (const reply of answer.lines) {
      const line = lineById.get(reply.id)!;
      const differs = answerDiffers(requestedOf(line), reply);
      const arrivalDate = timing.arrivalOf(release.supplierCode, reply.shipDate);
      if (differs) changedLines += 1;
      changes.push({
        partNumber: line.partNumber,
        qty: line.qty,
        needDate: line.needDate,
        confirmedQty: reply.confirmedQty,
        shipDate: reply.shipDate,
        arrivalDate,
        differs,
      });
      await manager.update(
        ReleaseLineEntity,
        { id: line.id },
        { confirmedQty: reply.confirmedQty, shipDate: reply.shipDate, arrivalDate },
      );
    }
    const status = answerStatus(
      answer.lines.map((reply) => ({ requested: requestedOf(lineById.get(reply.id)!), answer: reply })),
    );
    // Conditional on the release still waiting for an answer: a link and a signed-in answer
    // racing each other count once.
    const claimed = await manager.update(
      ReleaseEntity,
      { id: release.id, status: In(ANSWERABLE) },
      {
        status,
        confirmedAt: now,
        carrier: answer.carrier || null,
        trackingNumber: answer.trackingNumber || null,
        supplierNote: answer.note || null,
      },
    );
    if (claimed.affected === 0) throw new ConflictError(`Release ${release.number} was already answered.`);
    await recordAudit(manager, {
      actorEmail,
      action: status === 'confirmed' ? 'confirm' : 'propose',
      entity: 'release',
      entityKey: release.number,
      changes: {
        before: release.status,
        after: status,
        lines: changes,
        carrier: answer.carrier,
        trackingNumber: answer.trackingNumber,
        note: answer.note,
      },
    });
    // Confirmed lines become firm receipts for the line risk.
    await releasesChanged(manager);
    const shippingToken = await this.issueShippingLink(manager, release.id);
    return { status, number: release.number, changedLines, shippingToken };
  }

  private async openOwn(manager: EntityManager, number: string, user: AuthenticatedUser): Promise<ReleaseEntity> {
    const release = await manager.findOneBy(ReleaseEntity, { number });
    if (!release || release.supplierCode !== user.supplierCode) throw new NotFoundError(`No release ${number}.`);
    return answerable(release);
  }

  private async openLink(manager: EntityManager, presented: string): Promise<OpenLink> {
    const token = await manager.findOneBy(ConfirmationTokenEntity, { tokenHash: hashConfirmationToken(presented) });
    const release = token ? await manager.findOneBy(ReleaseEntity, { id: token.releaseId }) : null;
    if (!token || !release)
      throw new NotFoundError('This confirmation link is not known. Check that the whole link was copied.');
    // A cancelled release says so, whatever became of its link.
    if (release.status !== 'cancelled') {
      if (token.usedAt) throw new ConflictError('This link was already used.', [{ usedAt: token.usedAt }]);
      if (token.expiresAt <= new Date().toISOString()) {
        throw new GoneError(
          'This link has expired or was replaced by a newer one. Ask the buyer to send the release again.',
        );
      }
    }
    return { token, release: answerable(release) };
  }
}
