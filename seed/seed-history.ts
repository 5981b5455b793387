import { randomBytes } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { releaseNumber } from '../shared/domain/release-rules';
import { addsToOnHand } from '../shared/schemas/receipts';
import type { Database } from '../server/db/database';
import { ReceiptEntity } from '../server/dock/receipt.entity';
import { KanbanCardEntity } from '../server/loops/kanban-card.entity';
import { KanbanLoopEntity } from '../server/loops/kanban-loop.entity';
import { PartEntity } from '../server/master-data/part.entity';
import { SupplierEntity } from '../server/master-data/supplier.entity';
import { OutboxMessageEntity } from '../server/outbox/outbox-message.entity';
import { redactSecretLinks } from '../server/outbox/outbox.service';
import { composeReleaseMail } from '../server/releases/release-mail';
import { ReleaseLineEntity } from '../server/releases/release-line.entity';
import { ReleaseEntity } from '../server/releases/release.entity';
import { readPlantName, releaseNoticeRef } from '../server/releases/releases.service';
import { CONFIRMATION_TOKEN_TTL_DAYS } from '../server/releases/confirmation-tokens';
import { bumpDockVersion, bumpPlanningVersion } from '../server/settings/versions';
import type { NewMovement, PostedMovement } from '../server/stock/stock-ledger';
import type { HistoryRelease, OpenKanbanDelivery } from './scenario-history';

/** The clerk who counted the past deliveries in. */
const RECEIVING_EMAIL = 'receiving@example.com';

/** An instant on a plant day: `minutes` after local midnight. */
export function instantOn(date: string, minutes: number): string {
  const midnight = new Date(`${date}T00:00:00`);
  return new Date(midnight.getTime() + minutes * 60_000).toISOString();
}

const SENT_AT_MINUTES = 6 * 60 + 2;
const ANSWERED_AT_MINUTES = 10 * 60 + 15;
const RECEIVED_AT_MINUTES = 9 * 60 + 30;

function receiptKey(number: string, partNumber: string, at: string): string {
  return `${number}|${partNumber}|${at}`;
}

/** The stock movements the past receipts posted, to go into the ledger in time order with the builds. */
export function receiptMovements(releases: readonly HistoryRelease[]): NewMovement[] {
  return releases.flatMap((release) => {
    const number = releaseNumber(release.supplierCode, release.releaseDate);
    return release.lines.flatMap((line) =>
      line.receipts
        .filter((receipt) => addsToOnHand(receipt.discrepancy))
        .map((receipt): NewMovement => ({
          partNumber: line.partNumber,
          qty: receipt.qty,
          kind: 'receipt',
          userEmail: RECEIVING_EMAIL,
          reason: `Release ${number}${receipt.discrepancy ? ` (${receipt.discrepancy})` : ''}`,
          refType: 'release',
          ref: number,
          at: instantOn(receipt.on, RECEIVED_AT_MINUTES),
        })),
    );
  });
}

/** Writes the past releases, their lines and receipts; each receipt's on-hand is the one its movement left. */
export async function writePastReleases(
  manager: EntityManager,
  releases: readonly HistoryRelease[],
  posted: readonly PostedMovement[],
): Promise<void> {
  const balanceAfter = new Map(
    posted
      .filter((movement) => movement.kind === 'receipt')
      .map((movement) => [receiptKey(movement.ref!, movement.partNumber, movement.at), movement.balanceAfter]),
  );
  let receiptIndex = 0;
  for (const past of releases) {
    const number = releaseNumber(past.supplierCode, past.releaseDate);
    const release = await manager.save(
      manager.create(ReleaseEntity, {
        number,
        supplierCode: past.supplierCode,
        releaseDate: past.releaseDate,
        status: past.status,
        sentAt: instantOn(past.releaseDate, SENT_AT_MINUTES),
        confirmedAt: past.answeredOn ? instantOn(past.answeredOn, ANSWERED_AT_MINUTES) : null,
        carrier: null,
        trackingNumber: null,
        supplierNote: past.supplierNote,
      }),
    );
    for (const line of past.lines) {
      const received = line.receipts.reduce(
        (sum, receipt) => sum + (addsToOnHand(receipt.discrepancy) ? receipt.qty : 0),
        0,
      );
      const saved = await manager.save(
        manager.create(ReleaseLineEntity, {
          releaseId: release.id,
          partNumber: line.partNumber,
          qty: line.qty,
          needDate: line.needDate,
          requestedQty: line.qty,
          requestedDate: line.needDate,
          expedite: false,
          origin: line.origin,
          cardId: null,
          confirmedQty: line.confirmedQty,
          shipDate: line.shipDate,
          arrivalDate: line.arrivalDate,
          receivedQty: received,
          closed: true,
        }),
      );
      for (const receipt of line.receipts) {
        const at = instantOn(receipt.on, RECEIVED_AT_MINUTES);
        receiptIndex += 1;
        await manager.insert(ReceiptEntity, {
          releaseLineId: saved.id,
          qty: receipt.qty,
          discrepancy: receipt.discrepancy,
          note: receipt.note,
          final: receipt.final,
          idempotencyKey: `demo-history-${receiptIndex}`,
          onHandAfter: balanceAfter.get(receiptKey(number, line.partNumber, at)) ?? 0,
          userEmail: RECEIVING_EMAIL,
          receivedAt: at,
        });
      }
    }
  }
}

/**
 * The release a kanban container was ordered on. The release run sends one release per supplier
 * and day, so a container ordered on a day the supplier's scheduled parts were also released joins
 * that release, whose lines already came in: the release is then partly received.
 */
async function releaseForDelivery(manager: EntityManager, delivery: OpenKanbanDelivery): Promise<ReleaseEntity> {
  const sameDay = await manager.findOneBy(ReleaseEntity, {
    supplierCode: delivery.supplierCode,
    releaseDate: delivery.releaseDate,
    reference: '',
  });
  if (sameDay) {
    const status = sameDay.status === 'received' ? 'partial' : sameDay.status;
    await manager.update(ReleaseEntity, { id: sameDay.id }, { status });
    return { ...sameDay, status };
  }
  return manager.save(
    manager.create(ReleaseEntity, {
      number: releaseNumber(delivery.supplierCode, delivery.releaseDate),
      supplierCode: delivery.supplierCode,
      releaseDate: delivery.releaseDate,
      status: delivery.status,
      sentAt: instantOn(delivery.releaseDate, SENT_AT_MINUTES),
      confirmedAt: instantOn(delivery.answeredOn, ANSWERED_AT_MINUTES - 60),
      carrier: null,
      trackingNumber: null,
      supplierNote: delivery.supplierNote,
    }),
  );
}

/**
 * The kanban containers on their way, each on its supplier's release of the day it was ordered, its
 * card ordered on the line. Written after the cards are issued; the card taken is the loop's first.
 */
export async function writeOpenKanbanDeliveries(
  db: Database,
  deliveries: readonly OpenKanbanDelivery[],
): Promise<void> {
  await db.write(async (manager) => {
    for (const delivery of deliveries) {
      const loop = await manager.findOneByOrFail(KanbanLoopEntity, {
        partNumber: delivery.partNumber,
        kind: 'supplier',
      });
      const card = await manager.findOneByOrFail(KanbanCardEntity, { loopId: loop.id, cardIndex: 1 });
      const release = await releaseForDelivery(manager, delivery);
      const line = await manager.save(
        manager.create(ReleaseLineEntity, {
          releaseId: release.id,
          partNumber: delivery.partNumber,
          qty: loop.containerQty,
          needDate: delivery.needDate,
          requestedQty: loop.containerQty,
          requestedDate: delivery.needDate,
          expedite: false,
          origin: 'kanban',
          cardId: card.id,
          confirmedQty: loop.containerQty,
          shipDate: delivery.shipDate,
          arrivalDate: delivery.arrivalDate,
          receivedQty: 0,
          closed: false,
        }),
      );
      await manager.update(
        KanbanCardEntity,
        { id: card.id },
        { state: 'ordered', releaseLineId: line.id, stateChangedAt: instantOn(delivery.releaseDate, SENT_AT_MINUTES) },
      );
    }
    await bumpPlanningVersion(manager);
    await bumpDockVersion(manager);
  });
}

/** A card the line emptied the day before the demo starts: its container waits for the next release run. */
export async function writeEmptiedCard(db: Database, partNumber: string, emptiedOn: string): Promise<void> {
  await db.write(async (manager) => {
    const loop = await manager.findOneByOrFail(KanbanLoopEntity, { partNumber, kind: 'supplier' });
    await manager.update(
      KanbanCardEntity,
      { loopId: loop.id, cardIndex: 1 },
      { state: 'empty', stateChangedAt: instantOn(emptiedOn, 14 * 60) },
    );
    await bumpPlanningVersion(manager);
  });
}

/**
 * The release e-mails as the mail server took them: the same message the release run composes,
 * its single-use link already removed as the Outbox does once a message is sent.
 */
export async function writeSentReleaseMail(db: Database, appUrl: string): Promise<void> {
  await db.write(async (manager) => {
    const plantName = await readPlantName(manager);
    const releases = await manager.find(ReleaseEntity, { order: { sentAt: 'ASC', number: 'ASC' } });
    const suppliers = new Map((await manager.find(SupplierEntity)).map((supplier) => [supplier.code, supplier]));
    const parts = new Map((await manager.find(PartEntity)).map((part) => [part.partNumber, part]));
    for (const release of releases) {
      const supplier = suppliers.get(release.supplierCode)!;
      const sentAt = release.sentAt!;
      const lines = await manager.find(ReleaseLineEntity, {
        where: { releaseId: release.id },
        order: { needDate: 'ASC', id: 'ASC' },
      });
      const expiresAt = new Date(new Date(sentAt).getTime() + CONFIRMATION_TOKEN_TTL_DAYS * 86_400_000).toISOString();
      const mail = composeReleaseMail({
        number: release.number,
        releaseDate: release.releaseDate,
        supplierName: supplier.name,
        supplierEmail: supplier.email,
        plantName,
        link: `${appUrl}/confirm/${randomBytes(24).toString('base64url')}`,
        expiresAt,
        resent: false,
        transitDays: supplier.transitDays,
        lines: lines.map((line) => {
          const part = parts.get(line.partNumber);
          return {
            partNumber: line.partNumber,
            description: part?.description ?? '',
            qty: line.requestedQty ?? line.qty,
            uom: part?.uom ?? 'H87',
            needDate: line.requestedDate ?? line.needDate,
            hazardous: part?.hazardous ?? false,
            expedite: line.expedite,
            unNumber: part?.unNumber ?? null,
            hazardClass: part?.hazardClass ?? null,
            unitWeightKg: part?.unitWeightKg ?? null,
            heavyLift: part?.heavyLift ?? false,
          };
        }),
      });
      const deliveredAt = new Date(new Date(sentAt).getTime() + 15_000).toISOString();
      await manager.insert(OutboxMessageEntity, {
        to: mail.to,
        subject: mail.subject,
        text: redactSecretLinks(mail.text),
        html: mail.html ? redactSecretLinks(mail.html) : null,
        attachments: null,
        ref: releaseNoticeRef(release.number),
        status: 'sent',
        attempts: 1,
        nextAttemptAt: sentAt,
        createdAt: sentAt,
        sentAt: deliveredAt,
      });
    }
  });
}
